/** Words the editor shows for the schema's enum values (our vocabulary, one place). */
import type { StepKind, Hazard, Disposition } from '../../domain/procedure/schema';
import { convert, formatQuantity, type TorqueUnit } from '../../domain/units';

export const KIND_LABELS: Record<StepKind, string> = {
  action: 'Action',
  'fastener-sequence': 'Fastener sequence',
  torque: 'Torque',
  measure: 'Measure',
  'tag-part': 'Tag part',
  inspect: 'Inspect',
  caution: 'Caution',
  'hold-point': 'Hold point',
  replace: 'Replace parts',
};

/** A glyph per kind so the list never relies on colour. */
export const KIND_MARKS: Record<StepKind, string> = {
  action: '▸',
  'fastener-sequence': '⊚',
  torque: '↻',
  measure: '⇔',
  'tag-part': '🏷',
  inspect: '◉',
  caution: '⚠',
  'hold-point': '✋',
  replace: '⇄',
};

export const HAZARD_LABELS: Record<Hazard, string> = {
  lifting: 'Lifting',
  'pressurised-fuel': 'Pressurised fuel',
  'hot-fluid': 'Hot fluid',
  'spring-pressure': 'Spring pressure',
  'stored-energy': 'Stored energy',
  chemical: 'Chemical',
  electrical: 'Electrical',
};

export const DISPOSITION_LABELS: Record<Disposition, string> = {
  reuse: 'Reuse',
  replace: 'Replace',
  'machine-shop': 'Machine shop',
  scrap: 'Scrap',
};

export const SEVERITY_LABELS = { notice: 'Notice', caution: 'Caution', warning: 'Warning', danger: 'Danger' } as const;

export const THREAD_LABELS = {
  dry: 'Dry',
  'engine-oil': 'Engine oil',
  'assembly-lube': 'Assembly lube',
  'thread-sealant': 'Thread sealant',
  threadlocker: 'Threadlocker',
} as const;

export const PASS_KIND_LABELS = {
  snug: 'Snug (hand-tight seating)',
  percent: '% of final torque',
  torque: 'Torque',
  angle: 'Angle past last stage',
  loosen: 'Loosen by angle',
  remove: 'Remove',
} as const;

export const METHOD_LABELS = {
  direct: 'Direct (each reading against spec)',
  clearance: 'Clearance (bore − journal)',
  journal: 'Journal (taper and out-of-round)',
  'valve-shim': 'Valve clearance to shim',
} as const;

export const options = <T extends string>(labels: Record<T, string>) =>
  (Object.entries(labels) as Array<[T, string]>).map(([value, label]) => ({ value, label }));

/** The other unit a shop commonly reads a torque in: N·m ↔ ft·lbf, anything else → N·m. */
export function otherTorqueUnit(unit: TorqueUnit): TorqueUnit {
  return unit === 'N·m' ? 'ft·lbf' : 'N·m';
}

/** "≈ 66.4 ft·lbf" for a torque, or '' while the value is not a usable number. */
export function convertedTorque(value: unknown, unit: unknown): string {
  if (typeof value !== 'number' || !Number.isFinite(value) || typeof unit !== 'string') return '';
  try {
    const to = otherTorqueUnit(unit as TorqueUnit);
    return `≈ ${formatQuantity(convert({ value, unit: unit as TorqueUnit }, to))}`;
  } catch {
    return '';
  }
}
