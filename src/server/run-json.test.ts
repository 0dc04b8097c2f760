import { describe, expect, it } from 'vitest';
import { PROCEDURE } from '../domain/run/run.fixtures';
import { runDtoJson } from './run-json';
import type { RunDto } from './services/runs.service';

const dto = (over: Partial<RunDto> = {}): RunDto => ({
  run: { id: 'r1', jobId: 'j1', jobCode: 'J-0001', revisionId: 'v1', procedureName: 'Demo "quoted" <name>', revisionNumber: 2, status: 'active', lastSeq: 1, createdAt: '2026-12-01T00:00:00.000Z' },
  steps: PROCEDURE,
  events: [{ seq: 1, type: 'step.start', payload: { type: 'step.start', stepId: 's1' }, actor: { id: 'u1', name: 'Tess ✓ ünïcode', role: 'technician' }, device: null, recordedAt: '2026-12-01T00:00:01.000Z', clientAt: null }],
  next: null, progress: { done: 0, total: PROCEDURE.length, complete: false }, stepStates: [], pendingDeviation: null,
  ...over,
}) as unknown as RunDto;

describe('runDtoJson', () => {
  it('parses back to exactly the DTO, as JSON.stringify would give it', () => {
    const d = dto();
    expect(JSON.parse(runDtoJson(d))).toEqual(JSON.parse(JSON.stringify(d)));
  });

  it('reuses the steps text for the same revision but not the rest', () => {
    const a = dto();
    const b = dto({ events: [] });
    expect(JSON.parse(runDtoJson(a)).events).toHaveLength(1);
    expect(JSON.parse(runDtoJson(b)).events).toHaveLength(0);
    expect(JSON.parse(runDtoJson(b)).steps).toEqual(JSON.parse(JSON.stringify(PROCEDURE)));
  });
});
