/**
 * A run as JSON text for the API. The pinned revision's steps are the bulk of it and never
 * change (released content is immutable, and its parsed array is cached per revision), so
 * their JSON is made once per revision and spliced in; only the log and the state are new.
 */
import type { Step } from '../domain/procedure/schema';
import type { RunDto } from './services/runs.service';

const stepsText = new WeakMap<readonly Step[], string>();

export function runDtoJson(dto: RunDto): string {
  let steps = stepsText.get(dto.steps);
  if (steps === undefined) {
    steps = JSON.stringify(dto.steps);
    stepsText.set(dto.steps, steps);
  }
  const { steps: _steps, ...rest } = dto;
  return `{"steps":${steps},${JSON.stringify(rest).slice(1)}`;
}
