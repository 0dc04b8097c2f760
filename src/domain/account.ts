/** Account rules shared by the sign-in server (better-auth's settings) and the account forms. */

/** Shortest password the shop accepts; better-auth enforces it, the forms say it first. */
export const MIN_PASSWORD_LENGTH = 10;
/** better-auth's own default upper bound, repeated so the form can say it before the server does. */
export const MAX_PASSWORD_LENGTH = 128;

/** Why a new password cannot be used, in words for a person; null when it is fine. */
export function passwordProblem(password: string): string | null {
  if (password.length === 0) return 'Enter a new password.';
  if (password.length < MIN_PASSWORD_LENGTH) return `Use at least ${MIN_PASSWORD_LENGTH} characters.`;
  if (password.length > MAX_PASSWORD_LENGTH) return `Use at most ${MAX_PASSWORD_LENGTH} characters.`;
  if (password.trim().length === 0) return 'A password of only spaces is not allowed.';
  return null;
}
