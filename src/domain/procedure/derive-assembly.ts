/**
 * A first draft of an assembly procedure from a teardown: the steps in reverse, each turned
 * round. The lead then edits the draft; nothing here invents a torque or an angle.
 */
import { DomainError } from '../errors';
import { centreOutOrder, crossOrder } from '../fastener-order';
import { EXAMPLE_DATA_NOTE, isMarkedExample } from './example-data';
import { fit, rewordForAssembly } from './reword';
import { step as stepSchema } from './schema';
import type { FastenerMap, Pass, Step, StepOf } from './schema';

const SET_TORQUE_NOTE = "**Set the final torque and passes from the maker's service information before release.**";
const TTY_NOTE = "**Torque-to-yield:** fit new fasteners only; add the angle pass from the maker's service information.";

type Derived = { [K in Step['kind']]: Omit<StepOf<K>, 'id'> }[Step['kind']];

/** Joins body paragraphs, dropping empty ones, and carries the example-data marker over. */
function body(source: Step, ...paragraphs: string[]): string {
  const parts = paragraphs.filter((p) => p.trim() !== '');
  if (isMarkedExample(source.body) && !parts.some(isMarkedExample)) parts.push(`*${EXAMPLE_DATA_NOTE}.*`);
  return parts.join('\n\n');
}

function tighteningMap(map: FastenerMap): FastenerMap {
  if (map.orderMethod === 'cross') return { ...map, order: crossOrder(map.fasteners) };
  const ids = new Set(map.fasteners.map((f) => f.id));
  // A lead's own loosening order is mirrored; any other is regenerated from the layout.
  if (map.orderMethod === 'manual' && map.order.length === ids.size && map.order.every((id) => ids.has(id)))
    return { ...map, order: [...map.order].reverse() };
  return { ...map, order: centreOutOrder(map.fasteners), orderMethod: 'centre-out' };
}

/** Common practice: seat every fastener, then two stages of the final torque. */
function tighteningPasses(s: StepOf<'fastener-sequence'>): Pass[] {
  return s.finalTorque ? [{ kind: 'snug' }, { kind: 'percent', percent: 50 }, { kind: 'percent', percent: 100 }] : [{ kind: 'snug' }];
}

function fromFastenerSequence(s: StepOf<'fastener-sequence'>): Derived {
  if (s.direction === 'tighten') return { ...s };
  const title = rewordForAssembly(s.title);
  return {
    ...s,
    title: title === s.title ? fit(`${s.title} — tighten`, 160) : title,
    body: body(
      s,
      'Tighten in the order shown, one full pass over every fastener before the next pass.',
      s.finalTorque ? '' : SET_TORQUE_NOTE,
      s.torqueToYield ? TTY_NOTE : '',
    ),
    direction: 'tighten',
    map: tighteningMap(s.map),
    passes: tighteningPasses(s),
  };
}

function fromTagPart(s: StepOf<'tag-part'>): Derived {
  const positions = s.positions.map((p) => `- ${p}: the part whose tag reads ${p}`).join('\n');
  return {
    kind: 'action',
    title: fit(`Install ${s.partName} at tagged positions`, 160),
    body: body(
      s,
      `Fit each ${s.partName} back where it came from: the tag on the part must match the position. Parts tagged for replacement are fitted new.`,
      positions,
      s.bin ? `Tagged parts are in bin ${s.bin}.` : '',
    ),
    section: s.section,
    hazards: s.hazards,
    tools: [],
    photoRequired: false,
  };
}

function fromReplace(s: StepOf<'replace'>): Derived {
  return {
    kind: 'inspect',
    title: 'Fit new parts',
    body: body(s, 'Check that each part below is fitted new, not reused.', s.body),
    section: s.section,
    hazards: s.hazards,
    lookFor: s.parts.map((p) => fit(`New ${p.part} fitted (${p.quantity})${p.note ? ` — ${p.note}` : ''}`, 120)),
  };
}

function fromAction(s: StepOf<'action'>): Derived {
  const title = rewordForAssembly(s.title);
  if (title === s.title) return { ...s };
  const notes = s.body.trim() ? `Teardown notes:\n\n${s.body}` : '';
  return { ...s, title, body: body(s, `Reverses the teardown step "${s.title}"; review the notes before release.`, notes) };
}

function derive(s: Step): Derived {
  switch (s.kind) {
    case 'fastener-sequence':
      return fromFastenerSequence(s);
    case 'tag-part':
      return fromTagPart(s);
    case 'replace':
      return fromReplace(s);
    case 'action':
      return fromAction(s);
    default:
      // Cautions, hold points, measurements, inspections and torques read the same both ways.
      return { ...s };
  }
}

/** Derives a draft assembly from a teardown: reversed, turned round, every step re-validated, ids from `newId`. */
export function deriveAssembly(teardown: readonly Step[], newId: (i: number) => string): Step[] {
  const seen = new Set<string>();
  return [...teardown].reverse().map((source, i) => {
    const id = newId(i);
    if (seen.has(id)) throw new DomainError('invalid-input', `newId gave "${id}" twice`, { id, index: i });
    seen.add(id);
    const parsed = stepSchema.safeParse({ ...structuredClone(derive(source)), id });
    if (!parsed.success)
      throw new DomainError('invalid-input', `Could not derive an assembly step from "${source.title}"`, { stepId: source.id, issues: parsed.error.issues });
    return parsed.data;
  });
}
