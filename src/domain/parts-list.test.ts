import { describe, expect, it } from 'vitest';
import { step, type Step } from './procedure/schema';
import { PARTS_CSV_HEADER, buildPartsList, partKey, partsCsvRows, type PartsWork } from './parts-list';
import { toCsv } from './csv';

const S = (s: Record<string, unknown>): Step => step.parse(s);
const fasteners = (n: number) => Array.from({ length: n }, (_, i) => ({ id: `f${i}`, label: String(i + 1), x: i * 10, y: 0 }));
const seq = (id: string, n: number, tty: boolean, part = 'Head bolt') =>
  S({ id, kind: 'fastener-sequence', title: `Bolts ${id}`, direction: 'loosen', map: { fasteners: fasteners(n) }, passes: [{ kind: 'remove' }], torqueToYield: tty, fastenerPart: part });
const replace = (id: string, parts: Array<{ part: string; quantity: number; note?: string }>) => S({ id, kind: 'replace', title: `Replace ${id}`, parts });

const empty: PartsWork = { runs: [], tags: [], findings: [], overrides: [] };

describe('buildPartsList', () => {
  it('is empty without work', () => expect(buildPartsList(empty)).toEqual([]));

  it.each<[string, PartsWork, Array<[string, number]>]>([
    ['a replace step', { ...empty, runs: [{ id: 'r1', procedureName: 'P', steps: [replace('s1', [{ part: 'Head gasket', quantity: 1 }, { part: 'Valve stem seal', quantity: 8 }])] }] }, [['Head gasket', 1], ['Valve stem seal', 8]]],
    ['torque-to-yield bolts × fastener count', { ...empty, runs: [{ id: 'r1', procedureName: 'P', steps: [seq('s1', 10, true)] }] }, [['Head bolt', 10]]],
    ['a sequence that is not torque-to-yield adds nothing', { ...empty, runs: [{ id: 'r1', procedureName: 'P', steps: [seq('s1', 10, false)] }] }, []],
    ['the same bolts in teardown and assembly count once', { ...empty, runs: [{ id: 'r1', procedureName: 'Teardown', steps: [seq('s1', 10, true)] }, { id: 'r2', procedureName: 'Assembly', steps: [seq('s9', 10, true, 'head BOLT ')] }] }, [['Head bolt', 10]]],
    ['two sequences in one run add up', { ...empty, runs: [{ id: 'r1', procedureName: 'P', steps: [seq('s1', 6, true, 'Main bolt'), seq('s2', 4, true, 'Main bolt')] }] }, [['Main bolt', 10]]],
    ['tags set to replace, one each', { ...empty, tags: [
      { id: 't1', code: 'J-1-CAP-1', partName: 'Cap', position: '1', disposition: 'replace', runId: 'r1', stepId: 's' },
      { id: 't2', code: 'J-1-CAP-2', partName: 'Cap', position: '2', disposition: 'reuse', runId: 'r1', stepId: 's' },
      { id: 't3', code: 'J-1-CAP-3', partName: 'cap', position: '3', disposition: 'replace', runId: 'r1', stepId: 's' },
    ] }, [['Cap', 2]]],
    ['findings add to replace steps of the same part', { ...empty, runs: [{ id: 'r1', procedureName: 'P', steps: [replace('s1', [{ part: 'Oil seal', quantity: 1 }])] }], findings: [{ id: 'f1', what: 'Seal lip torn', partsToReplace: [{ part: 'Oil  Seal', quantity: 2 }] }] }, [['Oil seal', 3]]],
  ])('%s', (_name, work, expected) => {
    expect(buildPartsList(work).map((r) => [r.part, r.quantity])).toEqual(expected);
  });

  it('uses a stored override and keeps the computed quantity beside it', () => {
    const rows = buildPartsList({ ...empty, runs: [{ id: 'r1', procedureName: 'P', steps: [seq('s1', 10, true)] }], overrides: [{ partKey: 'head bolt', quantity: 12 }] });
    expect(rows).toEqual([expect.objectContaining({ key: 'head bolt', quantity: 12, computed: 10, overridden: true })]);
  });

  it('names each source with its step', () => {
    const [row] = buildPartsList({ ...empty, runs: [{ id: 'r1', procedureName: 'P', steps: [replace('s1', [{ part: 'Gasket', quantity: 1, note: 'always new' }])] }] });
    expect(row!.sources).toEqual([{ kind: 'replace-step', quantity: 1, reason: 'Replace step: always new', runId: 'r1', stepId: 's1', stepTitle: 'Replace s1' }]);
  });
});

describe('partKey', () => {
  it.each([['  Head   Bolt ', 'head bolt'], ['GASKET', 'gasket']])('%j → %j', (a, b) => expect(partKey(a)).toBe(b));
});

describe('CSV of the list', () => {
  it('escapes part names with commas, quotes and newlines', () => {
    const rows = buildPartsList({ ...empty, findings: [{ id: 'f', what: 'Cracked, "badly"\nat the rim', partsToReplace: [{ part: 'Liner, "wet"', quantity: 1 }] }] });
    expect(toCsv(PARTS_CSV_HEADER, partsCsvRows(rows))).toBe('Part,Quantity,Computed,Reasons\r\n"Liner, ""wet""",1,1,"Finding: Cracked, ""badly""\nat the rim"\r\n');
  });
});
