/** Default steps for the editor's "add step": every kind starts valid, ready to be filled in. */
import * as z from 'zod';
import { DomainError } from '../errors';
import { step } from './schema';
import type { Step, StepKind, StepOf } from './schema';

type StepInput = z.input<typeof step>;

/** Placeholder numbers below are only there to satisfy the schema; the body tells the lead to set them. */
const SET_FROM_SERVICE_INFO = 'Set the values from the maker\'s service information before release.';

const templates: { [K in StepKind]: (id: string) => Extract<StepInput, { kind: K }> } = {
  action: (id) => ({ id, kind: 'action', title: 'New action' }),
  'fastener-sequence': (id) => ({
    id,
    kind: 'fastener-sequence',
    title: 'New fastener sequence',
    body: 'Place the fasteners on the layout, then set the passes. ' + SET_FROM_SERVICE_INFO,
    direction: 'tighten',
    map: { fasteners: [{ id: 'f1', label: '1', x: 500, y: 500 }], order: ['f1'], orderMethod: 'manual' },
    passes: [{ kind: 'snug' }],
  }),
  torque: (id) => ({
    id,
    kind: 'torque',
    title: 'New torque',
    body: SET_FROM_SERVICE_INFO,
    target: { value: 1, unit: 'N·m' },
  }),
  measure: (id) => ({
    id,
    kind: 'measure',
    title: 'New measurement',
    body: SET_FROM_SERVICE_INFO,
    unit: 'mm',
    spec: { nominal: 0, min: 0, max: 0, unit: 'mm' },
    instrument: { name: 'Instrument', resolution: 0.01 },
    positions: ['Position 1'],
    method: { kind: 'direct' },
  }),
  'tag-part': (id) => ({ id, kind: 'tag-part', title: 'Tag removed part', partName: 'Part', positions: ['Position 1'] }),
  inspect: (id) => ({ id, kind: 'inspect', title: 'New inspection' }),
  caution: (id) => ({
    id,
    kind: 'caution',
    title: 'New caution',
    body: 'Follow the maker\'s service information, local codes and licensed practice.',
    severity: 'caution',
  }),
  'hold-point': (id) => ({ id, kind: 'hold-point', title: 'New hold point', signers: ['reviewer'] }),
  replace: (id) => ({ id, kind: 'replace', title: 'Parts to replace', parts: [{ part: 'Part', quantity: 1 }] }),
};

const isKind = <K extends StepKind>(s: Step, kind: K): s is StepOf<K> => s.kind === kind;

/** A valid default step of the given kind, with every schema default filled in. */
export function blankStep<K extends StepKind>(kind: K, id: string): StepOf<K> {
  const make = templates[kind];
  if (!make) throw new DomainError('invalid-input', `Unknown step kind "${String(kind)}"`);
  const parsed = step.safeParse(make(id));
  if (!parsed.success) throw new DomainError('invalid-input', `Step id "${id}" is not usable`, { issues: parsed.error.issues });
  if (!isKind(parsed.data, kind)) throw new DomainError('invalid-input', `Template for "${kind}" made a "${parsed.data.kind}" step`);
  return parsed.data;
}
