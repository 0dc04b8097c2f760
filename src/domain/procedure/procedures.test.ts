/** The demo procedure files in /procedures load, and their numbers are marked as example data. */
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { EXAMPLE_DATA_NOTE } from './example-data';
import { parseProcedureFile } from './file-format';
import type { ProcedureFile } from './file-format';
import { STEP_KINDS } from './schema';
import type { Step } from './schema';

const dir = join(import.meta.dirname, '../../../procedures');
const names = readdirSync(dir).filter((n) => n.endsWith('.json'));

function load(name: string): ProcedureFile {
  const result = parseProcedureFile(JSON.parse(readFileSync(join(dir, name), 'utf8')));
  if (!result.ok) throw new Error(`${name}:\n${result.problems.map((p) => `  ${p.path}: ${p.message}`).join('\n')}`);
  return result.file;
}

const carriesNumbers = (s: Step) =>
  s.kind === 'measure' || s.kind === 'torque' || (s.kind === 'fastener-sequence' && (s.finalTorque !== undefined || s.passes.some((p) => p.kind === 'torque' || p.kind === 'angle')));

it('finds the demo files', () => {
  expect(names).toEqual(expect.arrayContaining(['teardown-demo-diesel.json', 'assembly-demo-diesel.json']));
});

describe.each(names.map((name) => ({ name })))('$name', ({ name }) => {
  it('is accepted by parseProcedureFile', () => {
    expect(() => load(name)).not.toThrow();
  });
  it('marks the description and every step with a spec or torque as example data', () => {
    const file = load(name);
    expect(file.procedure.description).toContain(EXAMPLE_DATA_NOTE);
    const unmarked = file.revision.steps.filter((s) => carriesNumbers(s) && !s.body.includes(EXAMPLE_DATA_NOTE)).map((s) => s.id);
    expect(unmarked).toEqual([]);
  });
  it('defers to the maker in every caution', () => {
    for (const s of load(name).revision.steps.filter((x) => x.kind === 'caution')) expect(s.body).toMatch(/maker's service information/);
  });
});

describe('demo teardown', () => {
  const file = load('teardown-demo-diesel.json');
  const steps = file.revision.steps;
  it('covers every step kind in 25–35 steps', () => {
    expect(steps.length).toBeGreaterThanOrEqual(25);
    expect(steps.length).toBeLessThanOrEqual(35);
    expect([...new Set(steps.map((s) => s.kind))].sort()).toEqual([...STEP_KINDS].sort());
  });
  it('has a ten-bolt, torque-to-yield head loosening sequence and a review before the machine shop', () => {
    const head = steps.find((s) => s.id === 'td-17-head-bolts');
    expect(head?.kind === 'fastener-sequence' && [head.direction, head.map.fasteners.length, head.torqueToYield]).toEqual(['loosen', 10, true]);
    expect(steps.at(-1)?.kind).toBe('hold-point');
  });
});

describe('demo assembly', () => {
  const teardown = load('teardown-demo-diesel.json').revision.steps;
  const assembly = load('assembly-demo-diesel.json').revision.steps;
  it('tightens every fastener sequence and installs every tagged part', () => {
    expect(assembly.filter((s) => s.kind === 'fastener-sequence' && s.direction !== 'tighten')).toEqual([]);
    for (const tag of teardown.filter((s) => s.kind === 'tag-part')) {
      const install = assembly.find((s) => s.title === `Install ${tag.partName} at tagged positions`);
      for (const position of tag.positions) expect(install?.body).toContain(`- ${position}:`);
    }
  });
});

describe('a malformed file', () => {
  it('reports several problems, each with its path', () => {
    const file = JSON.parse(readFileSync(join(dir, 'teardown-demo-diesel.json'), 'utf8')) as {
      procedure: Record<string, unknown>;
      revision: { steps: Array<Record<string, unknown>> };
    };
    file.procedure.key = 'Has Spaces';
    const [first, second] = file.revision.steps;
    if (first) first.title = '';
    if (second) second.id = first?.id;
    const head = file.revision.steps.find((s) => s.id === 'td-17-head-bolts');
    if (head) head.passes = [{ kind: 'percent', percent: 0 }];
    const result = parseProcedureFile(file);
    if (result.ok) throw new Error('should fail');
    const index = file.revision.steps.indexOf(head ?? {});
    expect(result.problems.map((p) => p.path)).toEqual(
      expect.arrayContaining(['procedure.key', 'revision.steps[0].title', `revision.steps[${index}].passes[0].percent`]),
    );
    expect(result.problems.length).toBeGreaterThanOrEqual(3);
  });
});
