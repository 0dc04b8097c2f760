import { describe, expect, it } from 'vitest';
import { isDomainError } from '../errors';
import { blankStep } from './new-step';
import { STEP_KINDS, revisionContent, step } from './schema';
import type { StepKind } from './schema';

describe.each(STEP_KINDS.map((kind) => ({ kind })))('blankStep($kind)', ({ kind }) => {
  it('passes the step schema unchanged', () => {
    const s = blankStep(kind, 'new-1');
    expect(s.kind).toBe(kind);
    expect(s.id).toBe('new-1');
    // Parsing again must be a no-op: every default is already present.
    expect(step.parse(s)).toEqual(s);
  });
  it('returns a fresh object each call', () => {
    const a = blankStep(kind, 'x');
    const b = blankStep(kind, 'x');
    expect(a).toEqual(b);
    expect(a).not.toBe(b);
  });
});

describe('blankStep', () => {
  it('makes a revision of one of every kind that passes the revision rules', () => {
    const steps = STEP_KINDS.map((k, i) => blankStep(k, `s${i}`));
    expect(revisionContent.safeParse({ steps }).success).toBe(true);
  });
  it.each([[''], ['x'.repeat(41)]])('refuses an unusable id %j', (id) => {
    expect(() => blankStep('action', id)).toThrow();
    try {
      blankStep('action', id);
    } catch (e) {
      expect(isDomainError(e) && e.code).toBe('invalid-input');
    }
  });
  it('refuses an unknown kind', () => {
    expect(() => blankStep('nope' as StepKind, 'a')).toThrow(/Unknown step kind/);
  });
});
