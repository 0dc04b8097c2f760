import { describe, expect, it } from 'vitest';
import { isDomainError } from '../errors';
import type { ProcedureFileInput } from './file-format';
import { exportProcedureFile, formatPath, parseProcedureFile, procedureFileJson, procedureKeyFrom } from './file-format';
import { blankStep } from './new-step';

const meta = { key: 'head-only', name: 'Head only', kind: 'teardown', engineFamily: 'Invented', description: '' } as const;
const goodFile = (): ProcedureFileInput & { revision: { note: string } } => ({
  schemaVersion: 1,
  procedure: { ...meta },
  revision: {
    note: 'first',
    steps: [
      blankStep('caution', 'c1'),
      {
        id: 'h1',
        kind: 'fastener-sequence',
        title: 'Loosen head bolts',
        direction: 'loosen',
        map: { fasteners: [{ id: 'a', label: '1', x: 100, y: 100 }] },
        passes: [{ kind: 'loosen', degrees: 90 }, { kind: 'remove' }],
      },
    ],
  },
});

describe('formatPath', () => {
  it.each([
    [[], ''],
    [['schemaVersion'], 'schemaVersion'],
    [['revision', 'steps', 3, 'passes', 0, 'percent'], 'revision.steps[3].passes[0].percent'],
    [['revision', 'steps', 0, 'map', 'fasteners', 12, 'x'], 'revision.steps[0].map.fasteners[12].x'],
  ])('%j → %s', (path, expected) => {
    expect(formatPath(path)).toBe(expected);
  });
});

describe('parseProcedureFile', () => {
  it('accepts a good file and fills defaults', () => {
    const result = parseProcedureFile(goodFile());
    if (!result.ok) throw new Error(JSON.stringify(result.problems));
    const head = result.file.revision.steps[1];
    expect(head?.kind === 'fastener-sequence' && head.map.orderMethod).toBe('centre-out');
    expect(result.file.revision.note).toBe('first');
  });

  it('accepts the same file as JSON text', () => {
    expect(parseProcedureFile(JSON.stringify(goodFile())).ok).toBe(true);
  });

  it.each([
    ['{ not json', '', /Not valid JSON/],
    [null, '', /expected object/],
    [[], '', /expected object/],
  ])('refuses %j as a whole', (input, path, message) => {
    const result = parseProcedureFile(input);
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.problems[0]?.path).toBe(path);
    expect(result.problems[0]?.message).toMatch(message);
  });

  it.each([[2], [0]])('reports unsupported schemaVersion %i alone', (version) => {
    const result = parseProcedureFile({ ...goodFile(), schemaVersion: version, procedure: null });
    expect(result).toEqual({ ok: false, problems: [{ path: 'schemaVersion', message: expect.stringMatching(/Unsupported schema version/) }] });
  });

  it('reports a missing schemaVersion with the other problems', () => {
    const { schemaVersion: _, ...rest } = goodFile();
    const result = parseProcedureFile({ ...rest, procedure: { ...meta, key: 'Not A Slug' } });
    if (result.ok) throw new Error('should fail');
    expect(result.problems.map((p) => p.path)).toEqual(['schemaVersion', 'procedure.key']);
  });

  it('reports every problem, including cross-step rules next to field errors', () => {
    const file = goodFile();
    const steps: unknown[] = [
      ...file.revision.steps,
      {
        id: 'h2',
        kind: 'fastener-sequence',
        title: 'Tighten',
        direction: 'tighten',
        map: { fasteners: [{ id: 'a', label: '1', x: 1200, y: 100 }] },
        passes: [{ kind: 'percent', percent: 150 }],
      },
      { id: 'c1', kind: 'action', title: 'Duplicate id' },
      { id: 'p1', kind: 'fastener-sequence', title: 'Percent without final', direction: 'tighten', map: { fasteners: [{ id: 'a', label: '1', x: 1, y: 1 }] }, passes: [{ kind: 'percent', percent: 50 }] },
      { id: 'x', kind: 'teleport', title: 'Unknown kind' },
    ];
    const result = parseProcedureFile({ ...file, procedure: { ...meta, kind: 'overhaul' }, revision: { note: 7, steps } });
    if (result.ok) throw new Error('should fail');
    const paths = result.problems.map((p) => p.path);
    expect(paths).toEqual(
      expect.arrayContaining([
        'procedure.kind',
        'revision.note',
        'revision.steps[2].map.fasteners[0].x',
        'revision.steps[2].passes[0].percent',
        'revision.steps[3].id',
        'revision.steps[4].finalTorque',
        'revision.steps[5].kind',
      ]),
    );
    expect(result.problems.find((p) => p.path === 'revision.steps[3].id')?.message).toMatch(/used twice/);
    // Each problem once.
    expect(new Set(result.problems.map((p) => `${p.path} ${p.message}`)).size).toBe(result.problems.length);
  });
});

describe('exportProcedureFile', () => {
  it('round-trips through JSON text', () => {
    const file = exportProcedureFile(meta, goodFile().revision);
    const text = procedureFileJson(file);
    expect(text.endsWith('}\n')).toBe(true);
    const again = parseProcedureFile(text);
    expect(again).toEqual({ ok: true, file });
  });

  it('throws a DomainError listing the problems', () => {
    try {
      exportProcedureFile({ ...meta, key: '' }, { note: '', steps: [blankStep('action', 'a'), blankStep('action', 'a')] });
      throw new Error('should throw');
    } catch (e) {
      expect(isDomainError(e)).toBe(true);
      if (!isDomainError(e)) return;
      expect(e.code).toBe('invalid-input');
      expect((e.details?.problems as Array<{ path: string }>).map((p) => p.path)).toEqual(expect.arrayContaining(['procedure.key', 'revision.steps[1].id']));
    }
  });
});

describe('procedureKeyFrom', () => {
  it.each([
    ['Head & block teardown', 'head-block-teardown'],
    ['  Ünïcode   names ', 'unicode-names'],
    ['***', 'procedure'],
    ['x'.repeat(100), 'x'.repeat(80)],
  ])('%j → %s', (name, key) => {
    expect(procedureKeyFrom(name)).toBe(key);
  });
});
