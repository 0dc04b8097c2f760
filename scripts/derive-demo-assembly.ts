/**
 * Rebuilds procedures/assembly-demo-diesel.json from the demo teardown: `deriveAssembly` gives
 * the draft, then the edits a shop lead would make by hand are applied below, in the open,
 * so the demo assembly can be regenerated whenever the teardown changes.
 *
 *   npx tsx scripts/derive-demo-assembly.ts
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { deriveAssembly } from '../src/domain/procedure/derive-assembly';
import { EXAMPLE_DATA_NOTE } from '../src/domain/procedure/example-data';
import { exportProcedureFile, parseProcedureFile, procedureFileJson, procedureKeyFrom } from '../src/domain/procedure/file-format';
import { blankStep } from '../src/domain/procedure/new-step';
import { insertStep, moveStep, removeStep } from '../src/domain/procedure/reorder';
import type { Step } from '../src/domain/procedure/schema';

const DIR = new URL('../procedures/', import.meta.url);
const DEFER = "Follow the maker's service information, local codes and licensed practice; this caution does not replace them.";
const EX = `*${EXAMPLE_DATA_NOTE}.*`;

const loaded = parseProcedureFile(JSON.parse(readFileSync(new URL('teardown-demo-diesel.json', DIR), 'utf8')));
if (!loaded.ok) throw new Error(`Teardown does not load:\n${loaded.problems.map((p) => `${p.path}: ${p.message}`).join('\n')}`);

let steps: Step[] = deriveAssembly(loaded.file.revision.steps, (i) => `draft-${i}`);

const at = (title: string) => {
  const i = steps.findIndex((s) => s.title === title);
  if (i < 0) throw new Error(`No derived step titled "${title}"`);
  return i;
};
const edit = (title: string, change: (s: Step) => Step) => {
  const i = at(title);
  steps = steps.map((s, j) => (j === i ? change(s) : s));
};
const moveBefore = (title: string, before: string) => {
  const from = at(title);
  const to = at(before);
  steps = moveStep(steps, from, from < to ? to - 1 : to);
};
const sectionRename: Record<string, string> = { Block: 'Before the build', Preparation: 'Fill and first run' };
steps = steps.map((s) => ({ ...s, section: sectionRename[s.section] ?? s.section }));

// The lifting caution belongs at the very start of the build, before anything is moved.
steps = moveStep(steps, at('Lift and support only with rated equipment'), 0);
edit('Lift and support only with rated equipment', (s) => ({ ...s, section: 'Before the build' }));

edit('Teardown inspection review', (s) =>
  s.kind === 'hold-point'
    ? { ...s, title: 'Build readiness review', signers: ['reviewer', 'lead'], body: 'Before the build starts: machined parts are back and measured, every part to replace is on the bench, every tagged part is accounted for.' }
    : s,
);

// A teardown gasket check makes no sense at the build; check the faces and fit the new gasket instead.
steps = removeStep(steps, steps[at('Inspect head gasket for leak paths')]?.id ?? '');
const faces = { ...blankStep('inspect', 'draft-faces'), title: 'Check head and deck faces', section: 'Cylinder head', body: 'Faces clean, dry and free of old gasket material; bolt holes blown out and dry.' };
const gasket = { ...blankStep('action', 'draft-gasket'), title: 'Fit new head gasket on the dowels', section: 'Cylinder head', body: 'Check the gasket part against the parts list. No sealant unless the gasket maker calls for it.' };
steps = insertStep(steps, at('Lower on cylinder head'), { ...faces, lookFor: ['Old gasket material', 'Oil or coolant in bolt holes', 'Nicks across the fire-ring area'] });
steps = insertStep(steps, at('Lower on cylinder head'), gasket);
moveBefore('Heavy lift: cylinder head', 'Check head and deck faces');
moveBefore('Fit lifting bracket to head', 'Lower on cylinder head');
edit('Lower on cylinder head', (s) => ({ ...s, body: 'Lower straight down onto the dowels without sliding on the gasket. Start every head bolt by hand before the hoist lets go.' }));
steps = insertStep(steps, at('Tighten cylinder head bolts') + 1, {
  ...blankStep('action', 'draft-bracket-off'),
  title: 'Remove lifting bracket',
  section: 'Cylinder head',
  body: 'Only after the head bolts are fully tightened.',
});
edit('Tighten cylinder head bolts', (s) =>
  s.kind === 'fastener-sequence'
    ? {
        ...s,
        passes: [{ kind: 'snug' }, { kind: 'percent', percent: 50 }, { kind: 'percent', percent: 100 }, { kind: 'angle', degrees: 90 }],
        body: `New torque-to-yield bolts only, threads and washer faces oiled. One full pass in the order shown before the next; the angle pass last.\n\n${EX}`,
      }
    : s,
);

edit('Lower in crankshaft', (s) => ({ ...s, body: 'Upper shells in, journals and shells oiled. Two people or a hoist with a soft sling; lower the crank level without touching the thrust faces.' }));
edit('Install rocker shaft assembly', (s) => ({ ...s, body: 'Push rods seated in their lifters and rocker cups. Set the shaft down level with every rocker on its push rod.' }));
edit('Install valve cover', (s) => ({ ...s, body: 'New valve cover gasket, sealing faces clean and dry.' }));
edit('Install injector lines', (s) => ({ ...s, body: 'Remove the blanking caps one port at a time. Start each fitting by hand, then tighten with a line wrench.' }));
edit('Install oil pan', (s) => ({ ...s, body: 'New oil pan gasket. Afterwards turn the engine upright on the stand (stand locked, rated for the load).' }));
edit('Measure valve clearance', (s) => ({
  ...s,
  body: `Engine cold, each cylinder at top dead centre on compression. Where a reading is outside the spec, fit the lash cap size the shim choice gives and measure again.\n\n${EX}`,
}));

// Pressure comes back at priming and first start, so the fuel caution goes before the lines are fitted.
moveBefore('High-pressure fuel lines', 'Install injector lines');
edit('High-pressure fuel lines', (s) => ({
  ...s,
  body: `The lines are pressurised again when the fuel system is primed and at first start. Tighten every fitting before priming; never feel for a leak with your hand.\n\n${DEFER}`,
}));
edit('Refill engine oil', (s) => ({ ...s, body: 'Fill with the oil grade and quantity on the build sheet; check the level on the dipstick after the first run.' }));
edit('Refill coolant', (s) => ({ ...s, body: 'Fill with the coolant on the build sheet and bleed air from the system as the maker\'s service information describes.' }));
edit('Hot coolant under pressure', (s) => ({
  ...s,
  body: `At first run the cooling system becomes hot and pressurised. Check for leaks with the engine off and cool; never open a pressure cap on a hot engine.\n\n${DEFER}`,
}));
steps = insertStep(steps, steps.length, {
  ...blankStep('hold-point', 'draft-signoff'),
  title: 'Build sign-off',
  section: 'Fill and first run',
  signers: ['reviewer'],
  body: 'The reviewer checks every torque pass, reading and installed tag against the build sheet, then signs.',
});

// Final ids: stable short slugs from the finished titles.
const stepId = (i: number, title: string) =>
  procedureKeyFrom(title)
    .split('-')
    .reduce((id, word) => (id.length + word.length + 1 <= 40 ? `${id}-${word}` : id), `as-${String(i + 1).padStart(2, '0')}`);
steps = steps.map((s, i) => ({ ...s, id: stepId(i, s.title) }));

const file = exportProcedureFile(
  {
    key: 'assembly-demo-diesel',
    name: 'TT-4D demo engine — build',
    kind: 'assembly',
    engineFamily: loaded.file.procedure.engineFamily,
    description:
      "Demo build procedure for the invented TT-4D four-cylinder diesel, derived from its teardown and edited by hand. Example data — not a maker's specification: every torque, angle, clearance and size here is invented. Use the maker's service information for real work.",
  },
  { note: 'Derived from teardown-demo-diesel, then edited: lifting and head order, new gasket steps, angle pass, first-run cautions, sign-off.', steps },
);
writeFileSync(new URL('assembly-demo-diesel.json', DIR), procedureFileJson(file));
console.log(`wrote assembly-demo-diesel.json: ${file.revision.steps.length} steps`);
