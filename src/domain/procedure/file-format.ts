/**
 * Torquetrail's procedure file: one procedure and one revision's steps, as the JSON files in
 * `procedures/` and the editor's import/export hold them. The steps obey exactly the rules of
 * `revisionContent`, so a file that loads is a revision that could be saved.
 */
import * as z from 'zod';
import { DomainError } from '../errors';
import { procedureKind, revisionContent, step } from './schema';

export const PROCEDURE_FILE_VERSION = 1;

const KEY_PATTERN = /^[a-z0-9]+(?:-[a-z0-9]+)*$/;

export const procedureMeta = z.object({
  /** Stable slug: lowercase letters, digits and single hyphens. */
  key: z.string().min(1, 'Required').max(80).regex(KEY_PATTERN, 'Use lowercase letters, digits and single hyphens'),
  name: z.string().trim().min(1, 'Required').max(120),
  kind: procedureKind,
  engineFamily: z.string().trim().max(120).default(''),
  description: z.string().max(4000).default(''),
});
export type ProcedureMeta = z.infer<typeof procedureMeta>;

export const fileRevision = z.intersection(z.object({ note: z.string().trim().max(2000).default('') }), revisionContent);
export type FileRevision = z.infer<typeof fileRevision>;

export const procedureFile = z.object({
  schemaVersion: z.literal(PROCEDURE_FILE_VERSION),
  procedure: procedureMeta,
  revision: fileRevision,
});
export type ProcedureFile = z.infer<typeof procedureFile>;
export type ProcedureFileInput = z.input<typeof procedureFile>;

export interface FileProblem {
  /** e.g. `revision.steps[3].passes[0].percent`; empty for the file as a whole. */
  path: string;
  message: string;
}
export type ParseResult = { ok: true; file: ProcedureFile } | { ok: false; problems: FileProblem[] };

/** `['revision', 'steps', 3, 'id']` → `revision.steps[3].id`. */
export function formatPath(path: ReadonlyArray<PropertyKey>): string {
  return path.reduce<string>((out, key) => (typeof key === 'number' ? `${out}[${key}]` : out === '' ? String(key) : `${out}.${String(key)}`), '');
}

const isRecord = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v);

/**
 * Zod skips a schema's cross-field rules (duplicate ids, percentages without a final torque)
 * while any field is wrong. To still report those in the same pass, run `revisionContent`
 * over the steps that are valid on their own and map the indices back.
 */
function crossStepProblems(json: unknown): FileProblem[] {
  const steps = isRecord(json) && isRecord(json.revision) ? json.revision.steps : undefined;
  if (!Array.isArray(steps)) return [];
  const valid: Array<{ index: number; value: unknown }> = [];
  steps.forEach((s, index) => {
    if (step.safeParse(s).success) valid.push({ index, value: s });
  });
  const result = revisionContent.safeParse({ steps: valid.map((v) => v.value) });
  if (result.success) return [];
  return result.error.issues.map((issue) => {
    const [head, at, ...rest] = issue.path;
    const original = head === 'steps' && typeof at === 'number' ? [head, valid[at]?.index ?? at, ...rest] : issue.path;
    return { path: formatPath(['revision', ...original]), message: issue.message };
  });
}

/** Checks a procedure file (parsed JSON or its text) and reports every problem with its path. */
export function parseProcedureFile(json: unknown): ParseResult {
  let value = json;
  if (typeof json === 'string') {
    try {
      value = JSON.parse(json);
    } catch (e) {
      return { ok: false, problems: [{ path: '', message: `Not valid JSON: ${e instanceof Error ? e.message : String(e)}` }] };
    }
  }
  // A newer file's other rules are unknown here, so its version is the one problem worth reporting.
  if (isRecord(value) && typeof value.schemaVersion === 'number' && value.schemaVersion !== PROCEDURE_FILE_VERSION)
    return {
      ok: false,
      problems: [{ path: 'schemaVersion', message: `Unsupported schema version ${value.schemaVersion}: this version of Torquetrail reads version ${PROCEDURE_FILE_VERSION}` }],
    };
  const result = procedureFile.safeParse(value);
  if (result.success) return { ok: true, file: result.data };
  const problems = result.error.issues.map((issue) => ({ path: formatPath(issue.path), message: issue.message }));
  const seen = new Set(problems.map((p) => `${p.path}\n${p.message}`));
  for (const p of crossStepProblems(value)) if (!seen.has(`${p.path}\n${p.message}`)) problems.push(p);
  return { ok: false, problems };
}

/** Builds a valid procedure file from a procedure and one revision, or throws with every problem listed. */
export function exportProcedureFile(procedure: z.input<typeof procedureMeta>, revision: z.input<typeof fileRevision>): ProcedureFile {
  const parsed = parseProcedureFile({ schemaVersion: PROCEDURE_FILE_VERSION, procedure, revision });
  if (!parsed.ok) throw new DomainError('invalid-input', `The procedure cannot be exported: ${parsed.problems.length} problem(s)`, { problems: parsed.problems });
  return parsed.file;
}

/** The file's text as written to disk: two-space JSON with a final newline, keys in schema order. */
export function procedureFileJson(file: ProcedureFile): string {
  return `${JSON.stringify(file, null, 2)}\n`;
}

/** A procedure key from its name: "Head & block teardown" → "head-block-teardown". */
export function procedureKeyFrom(name: string): string {
  const key = name
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, 80)
    .replace(/-+$/, '');
  return key || 'procedure';
}
