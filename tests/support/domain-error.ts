/** Test helper: asserts that fn throws a DomainError with the given code (and message pattern). */
import { expect } from 'vitest';
import { DomainError } from '../../src/domain/errors';

export function expectDomainError(fn: () => unknown, code: string, message?: RegExp): void {
  try {
    fn();
  } catch (e) {
    expect(e).toBeInstanceOf(DomainError);
    expect((e as DomainError).code).toBe(code);
    if (message) expect((e as DomainError).message).toMatch(message);
    return;
  }
  throw new Error(`expected DomainError '${code}'`);
}
