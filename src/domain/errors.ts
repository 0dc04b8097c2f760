/**
 * The one error type domain code throws. `code` is stable for programs (and maps to an HTTP
 * status at the API edge); `message` is written for the person at the bench or the desk.
 */
export type DomainErrorCode =
  | 'invalid-input' // a value that can never be right (NaN, negative torque, empty map)
  | 'unknown-unit'
  | 'unit-mismatch'
  | 'invalid-order'
  | 'out-of-order' // an event the run does not accept now
  | 'not-allowed' // the actor's role may not do this
  | 'no-fit'; // e.g. no stocked shim size fits

export class DomainError extends Error {
  override readonly name = 'DomainError';
  constructor(
    readonly code: DomainErrorCode,
    message: string,
    readonly details?: Record<string, unknown>,
  ) {
    super(message);
  }
}

export const isDomainError = (e: unknown): e is DomainError => e instanceof DomainError;
