import { fc, test } from '@fast-check/vitest';
import { describe, expect, it } from 'vitest';
import { centreOutOrder } from '../fastener-order';
import { deriveAssembly } from './derive-assembly';
import { EXAMPLE_DATA_NOTE } from './example-data';
import { blankStep } from './new-step';
import { rewordForAssembly } from './reword';
import { STEP_KINDS, revisionContent, step } from './schema';
import type { Step } from './schema';

const asId = (i: number) => `as-${String(i + 1).padStart(2, '0')}`;

/** Two rows of five, like a small head; invented layout. */
const headFasteners = [0, 1, 2, 3, 4].flatMap((c) => [
  { id: `t${c}`, label: `T${c + 1}`, x: 100 + c * 200, y: 300 },
  { id: `b${c}`, label: `B${c + 1}`, x: 100 + c * 200, y: 700 },
]);

const teardown: Step[] = [
  step.parse({ id: 'c', kind: 'caution', title: 'Hot coolant', severity: 'warning', hazards: ['hot-fluid'] }),
  step.parse({ id: 'd', kind: 'action', title: 'Drain coolant', body: 'Into a marked container.' }),
  step.parse({
    id: 'h',
    kind: 'fastener-sequence',
    title: 'Loosen cylinder head bolts',
    body: `${EXAMPLE_DATA_NOTE}.`,
    direction: 'loosen',
    map: { fasteners: headFasteners, order: [...centreOutOrder(headFasteners)].reverse(), orderMethod: 'reverse-centre-out' },
    passes: [{ kind: 'loosen', degrees: 90 }, { kind: 'remove' }],
    finalTorque: { value: 90, unit: 'N·m' },
    torqueToYield: true,
    threadCondition: 'engine-oil',
  }),
  step.parse({ id: 'v', kind: 'fastener-sequence', title: 'Valve cover screws', direction: 'loosen', map: { fasteners: headFasteners.slice(0, 4) }, passes: [{ kind: 'remove' }] }),
  step.parse({ id: 't', kind: 'tag-part', title: 'Tag rod caps', partName: 'rod cap', positions: ['Rod 1', 'Rod 2'], bin: 'B-3', photoRequired: true }),
  step.parse({ id: 'r', kind: 'replace', title: 'Parts to replace', parts: [{ part: 'head bolt', quantity: 10 }, { part: 'head gasket', quantity: 1, note: 'match the grade stamped on the old one' }] }),
  step.parse({ id: 'k', kind: 'hold-point', title: 'Teardown review', signers: ['reviewer', 'lead'] }),
];

describe('deriveAssembly', () => {
  const assembly = deriveAssembly(teardown, asId);
  const byTitle = (prefix: string) => assembly.find((s) => s.title.startsWith(prefix));

  it('reverses the steps and takes ids from newId', () => {
    expect(assembly.map((s) => s.id)).toEqual(['as-01', 'as-02', 'as-03', 'as-04', 'as-05', 'as-06', 'as-07']);
    expect(assembly.map((s) => s.kind)).toEqual(['hold-point', 'inspect', 'action', 'fastener-sequence', 'fastener-sequence', 'action', 'caution']);
    expect(revisionContent.safeParse({ steps: assembly }).success).toBe(true);
  });

  it('turns a loosening head sequence into a centre-out tightening plan', () => {
    const head = assembly[4];
    if (head?.kind !== 'fastener-sequence') throw new Error('expected a fastener sequence');
    expect(head.title).toBe('Tighten cylinder head bolts');
    expect(head.direction).toBe('tighten');
    expect(head.map.fasteners).toEqual(headFasteners);
    expect(head.map.orderMethod).toBe('centre-out');
    expect(head.map.order).toEqual(centreOutOrder(headFasteners));
    // Centre-out means the first fastener sits in the middle column (x = 500).
    expect(headFasteners.find((f) => f.id === head.map.order[0])?.x).toBe(500);
    expect(head.passes).toEqual([{ kind: 'snug' }, { kind: 'percent', percent: 50 }, { kind: 'percent', percent: 100 }]);
    expect(head.finalTorque).toEqual({ value: 90, unit: 'N·m' });
    expect(head.torqueToYield).toBe(true);
    expect(head.body).toContain('Torque-to-yield');
    expect(head.body).toContain(EXAMPLE_DATA_NOTE);
  });

  it('gives a sequence without a final torque a single snug pass and a note to set torque', () => {
    const cover = assembly[3];
    if (cover?.kind !== 'fastener-sequence') throw new Error('expected a fastener sequence');
    expect(cover.title).toBe('Valve cover screws — tighten');
    expect(cover.passes).toEqual([{ kind: 'snug' }]);
    expect(cover.body).toMatch(/Set the final torque/);
    expect(cover.body).not.toContain(EXAMPLE_DATA_NOTE);
  });

  it('turns tags into an install step listing every position', () => {
    const install = byTitle('Install rod cap');
    expect(install).toMatchObject({ kind: 'action', title: 'Install rod cap at tagged positions', photoRequired: false });
    expect(install?.body).toContain('- Rod 1: the part whose tag reads Rod 1');
    expect(install?.body).toContain('- Rod 2');
    expect(install?.body).toContain('bin B-3');
  });

  it('turns parts to replace into a fit-new check per part', () => {
    const check = byTitle('Fit new parts');
    if (check?.kind !== 'inspect') throw new Error('expected an inspect step');
    expect(check.lookFor).toEqual(['New head bolt fitted (10)', 'New head gasket fitted (1) — match the grade stamped on the old one']);
  });

  it('keeps cautions and hold points and rewords actions', () => {
    expect(assembly[6]).toEqual({ ...teardown[0], id: 'as-07' });
    expect(assembly[0]).toEqual({ ...teardown[6], id: 'as-01' });
    expect(assembly[5]?.title).toBe('Refill coolant');
    expect(assembly[5]?.body).toContain('Into a marked container.');
  });

  it('leaves the teardown untouched', () => {
    const before = structuredClone(teardown);
    deriveAssembly(teardown, asId);
    expect(teardown).toEqual(before);
  });

  it('refuses ids that repeat', () => {
    expect(() => deriveAssembly(teardown, () => 'same')).toThrow(/twice/);
  });

  const teardownArb = fc
    .array(fc.tuple(fc.constantFrom(...STEP_KINDS), fc.boolean()), { maxLength: 20 })
    .map((kinds) =>
      kinds.map(([kind, flip], i): Step => {
        const s = blankStep(kind, `s${i}`);
        return s.kind === 'fastener-sequence' && flip ? { ...s, direction: 'loosen', passes: [{ kind: 'loosen', degrees: 90 }, { kind: 'remove' }] } : s;
      }),
    );

  test.prop([teardownArb])('derives one valid step per teardown step, with no loosening left', (steps) => {
    const derived = deriveAssembly(steps, asId);
    expect(derived).toHaveLength(steps.length);
    expect(revisionContent.safeParse({ steps: derived }).success).toBe(true);
    for (const s of derived) {
      expect(s.kind === 'tag-part' || s.kind === 'replace').toBe(false);
      if (s.kind === 'fastener-sequence') {
        expect(s.direction).toBe('tighten');
        expect(s.passes.some((p) => p.kind === 'loosen' || p.kind === 'remove')).toBe(false);
      }
    }
  });
});

describe('rewordForAssembly', () => {
  it.each([
    ['Remove rocker shaft', 'Install rocker shaft'],
    ['remove oil pan', 'install oil pan'],
    ['Loosen main cap bolts', 'Tighten main cap bolts'],
    ['Disconnect battery', 'Connect battery'],
    ['Lift off cylinder head', 'Lower on cylinder head'],
    ['Drain engine oil', 'Refill engine oil'],
    ['Removal check', 'Removal check'],
    ['Inspect block deck', 'Inspect block deck'],
  ])('%s → %s', (from, to) => {
    expect(rewordForAssembly(from)).toBe(to);
  });
});
