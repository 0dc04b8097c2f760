import { describe, expect, it } from 'vitest';
import { MAX_PASSWORD_LENGTH, MIN_PASSWORD_LENGTH, passwordProblem } from './account';

describe('passwordProblem', () => {
  it.each<[string, string, RegExp | null]>([
    ['empty', '', /Enter a new password/],
    ['one short of the minimum', 'x'.repeat(MIN_PASSWORD_LENGTH - 1), /at least 10 characters/],
    ['exactly the minimum', 'x'.repeat(MIN_PASSWORD_LENGTH), null],
    ['only spaces', ' '.repeat(MIN_PASSWORD_LENGTH + 2), /only spaces/],
    ['exactly the maximum', 'y'.repeat(MAX_PASSWORD_LENGTH), null],
    ['one over the maximum', 'y'.repeat(MAX_PASSWORD_LENGTH + 1), /at most 128 characters/],
    ['an ordinary pass phrase', 'bench-torque-4d-rebuild', null],
  ])('%s', (_label, password, expected) => {
    const got = passwordProblem(password);
    if (expected === null) expect(got).toBeNull();
    else expect(got).toMatch(expected);
  });
});
