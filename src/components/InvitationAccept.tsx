/**
 * Accepting an invitation: join with the account already signed in, or create the account for
 * the invited address first. Either way the shop becomes the active one and home opens.
 */
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import * as z from 'zod';
import { authClient } from '../lib/auth-client';
import { MIN_PASSWORD_LENGTH, passwordProblem } from '../domain/account';
import { StatusRegion, type Status } from './ui/StatusRegion';
import { authMessage } from './MembersMessages';

type Props = {
  mode: 'join' | 'sign-up' | 'other-account';
  invitationId: string;
  shopId: string;
  shopName: string;
  email: string;
  signedInAs?: string;
};

const signUpSchema = z.object({
  name: z.string().trim().min(1, 'Enter your name as the shop should see it').max(120, 'Use at most 120 characters'),
  password: z.string().superRefine((p, ctx) => {
    const problem = passwordProblem(p);
    if (problem) ctx.addIssue({ code: 'custom', message: problem });
  }),
});
type SignUpValues = z.infer<typeof signUpSchema>;

export default function InvitationAccept({ mode, invitationId, shopId, shopName, email, signedInAs }: Props) {
  const [status, setStatus] = useState<Status>(null);
  const [busy, setBusy] = useState(false);
  const next = `/invitation/${encodeURIComponent(invitationId)}`;

  /** Accepts for the signed-in account; true when the member is in the shop. */
  async function accept(): Promise<boolean> {
    const { error } = await authClient.organization.acceptInvitation({ invitationId });
    if (error) {
      setStatus({ kind: 'error', message: authMessage(error, `Could not join ${shopName}.`) });
      return false;
    }
    await authClient.organization.setActive({ organizationId: shopId });
    window.location.assign('/');
    return true;
  }

  async function join() {
    setBusy(true);
    setStatus(null);
    try {
      if (!(await accept())) setBusy(false);
    } catch {
      setStatus({ kind: 'error', message: `Could not join ${shopName}. Check the connection and try again.` });
      setBusy(false);
    }
  }

  async function switchAccount() {
    setBusy(true);
    try {
      await authClient.signOut();
      window.location.reload();
    } catch {
      setStatus({ kind: 'error', message: 'Could not sign out. Check the connection and try again.' });
      setBusy(false);
    }
  }

  const { register, handleSubmit, formState } = useForm<SignUpValues>({ resolver: zodResolver(signUpSchema), defaultValues: { name: '', password: '' } });
  const onSignUp = handleSubmit(async (v) => {
    setStatus(null);
    try {
      const { error } = await authClient.signUp.email({ email, name: v.name, password: v.password });
      if (error) {
        setStatus({ kind: 'error', message: authMessage(error, 'Could not create the account.') });
        return;
      }
      // The account exists and is signed in now; if joining fails, reloading shows the join button.
      await accept();
    } catch {
      setStatus({ kind: 'error', message: 'Could not create the account. Check the connection and try again.' });
    }
  });
  const e = formState.errors;

  if (mode === 'other-account') {
    return (
      <div data-hydrated="true" className="space-y-4">
        <p>
          You are signed in as <strong>{signedInAs}</strong>, but this invitation is for <strong>{email}</strong>.
          Sign out, then come back to this page to join as {email}.
        </p>
        <StatusRegion status={status} />
        <button type="button" className="tt-btn tt-btn-primary" disabled={busy} onClick={switchAccount}>
          {busy ? 'Signing out…' : 'Sign out and continue'}
        </button>
      </div>
    );
  }

  if (mode === 'join') {
    return (
      <div data-hydrated="true" className="space-y-4">
        <StatusRegion status={status} />
        <button type="button" className="tt-btn tt-btn-primary w-full" disabled={busy} onClick={join}>
          {busy ? 'Joining…' : `Join ${shopName}`}
        </button>
      </div>
    );
  }

  return (
    <form onSubmit={onSignUp} noValidate className="space-y-4" data-hydrated="true">
      <div>
        <label className="tt-label" htmlFor="invited-email">E-mail</label>
        <input id="invited-email" type="email" autoComplete="username" className="tt-input bg-sunken" value={email} readOnly aria-describedby="invited-email-hint" />
        <p id="invited-email-hint" className="text-muted text-base">The account is made for the address the invitation went to.</p>
      </div>
      <div>
        <label className="tt-label" htmlFor="name">Your name</label>
        <input id="name" autoComplete="name" className="tt-input" aria-invalid={!!e.name} {...register('name')} />
        {e.name && <p className="tt-field-error">{e.name.message}</p>}
      </div>
      <div>
        <label className="tt-label" htmlFor="password">Password</label>
        <input id="password" type="password" autoComplete="new-password" className="tt-input" aria-invalid={!!e.password} aria-describedby="password-hint" {...register('password')} />
        <p id="password-hint" className="text-muted text-base">At least {MIN_PASSWORD_LENGTH} characters.</p>
        {e.password && <p className="tt-field-error">{e.password.message}</p>}
      </div>
      <StatusRegion status={status} />
      <button type="submit" className="tt-btn tt-btn-primary w-full" disabled={formState.isSubmitting}>
        {formState.isSubmitting ? 'Creating the account…' : `Create account and join ${shopName}`}
      </button>
      <p>
        Already have an account for {email}? <a className="underline text-accent" href={`/sign-in?next=${encodeURIComponent(next)}`}>Sign in to join</a>
      </p>
    </form>
  );
}
