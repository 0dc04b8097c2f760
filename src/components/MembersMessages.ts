/**
 * better-auth answers with codes and English written for developers; the shop reads these
 * words instead. Codes we do not know fall back to the server's own message.
 */
import { MIN_PASSWORD_LENGTH } from '../domain/account';

export type AuthError = { code?: string; message?: string; status?: number; statusText?: string } | null | undefined;

const WORDS: Record<string, string> = {
  YOU_CANNOT_LEAVE_THE_ORGANIZATION_AS_THE_ONLY_OWNER: 'The shop would have no owner left. Make another member an owner first.',
  YOU_CANNOT_LEAVE_THE_ORGANIZATION_WITHOUT_AN_OWNER: 'The shop would have no owner left. Make another member an owner first.',
  USER_IS_ALREADY_A_MEMBER_OF_THIS_ORGANIZATION: 'That person is already a member of this shop.',
  USER_IS_ALREADY_INVITED_TO_THIS_ORGANIZATION: 'That address already has a waiting invitation. Cancel it below to send a new one.',
  YOU_ARE_NOT_ALLOWED_TO_INVITE_USERS_TO_THIS_ORGANIZATION: 'Your role may not invite people to this shop.',
  YOU_ARE_NOT_ALLOWED_TO_INVITE_USER_WITH_THIS_ROLE: 'Your role may not invite someone with that role.',
  YOU_ARE_NOT_ALLOWED_TO_UPDATE_THIS_MEMBER: 'Your role may not change this member.',
  YOU_ARE_NOT_ALLOWED_TO_DELETE_THIS_MEMBER: 'Your role may not remove this member.',
  YOU_ARE_NOT_ALLOWED_TO_CANCEL_THIS_INVITATION: 'Your role may not cancel this invitation.',
  MEMBER_NOT_FOUND: 'That member is no longer in the shop. The list has been refreshed.',
  INVITATION_NOT_FOUND: 'That invitation no longer exists: it was cancelled, used or it expired.',
  YOU_ARE_NOT_THE_RECIPIENT_OF_THE_INVITATION: 'This invitation was sent to a different e-mail address than the one you are signed in with.',
  ORGANIZATION_NOT_FOUND: 'That shop no longer exists.',
  USER_IS_NOT_A_MEMBER_OF_THE_ORGANIZATION: 'You are not a member of this shop.',
  INVITATION_LIMIT_REACHED: 'This shop has reached its limit of open invitations. Cancel some first.',
  ORGANIZATION_MEMBERSHIP_LIMIT_REACHED: 'This shop has reached its member limit.',
  INVALID_TOKEN: 'This reset link is not valid any more: it was used already or it expired. Ask for a new one.',
  PASSWORD_TOO_SHORT: `Use at least ${MIN_PASSWORD_LENGTH} characters.`,
  PASSWORD_TOO_LONG: 'That password is too long.',
  USER_ALREADY_EXISTS: 'An account with this e-mail already exists. Sign in instead.',
  USER_ALREADY_EXISTS_USE_ANOTHER_EMAIL: 'An account with this e-mail already exists. Sign in instead.',
  INVALID_EMAIL: 'Enter a valid e-mail address.',
};

/** The words to show for a failed better-auth call. */
export function authMessage(error: AuthError, fallback: string): string {
  if (!error) return fallback;
  if (error.code && WORDS[error.code]) return WORDS[error.code]!;
  if (error.status === 429) return 'Too many attempts. Wait a minute and try again.';
  if (error.status === 0 || error.status === undefined) return `${fallback} Check the connection and try again.`;
  if (error.status >= 500) return `${fallback} Something went wrong on our side; nothing was changed.`;
  return error.message || fallback;
}
