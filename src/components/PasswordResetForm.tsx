/** Sets a new password with the token from the reset e-mail, then sends the person to sign in. */
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import * as z from 'zod';
import { authClient } from '../lib/auth-client';
import { MIN_PASSWORD_LENGTH, passwordProblem } from '../domain/account';
import { StatusRegion, type Status } from './ui/StatusRegion';
import { authMessage } from './MembersMessages';

const schema = z
  .object({
    password: z.string().superRefine((p, ctx) => {
      const problem = passwordProblem(p);
      if (problem) ctx.addIssue({ code: 'custom', message: problem });
    }),
    again: z.string().min(1, 'Type the new password again'),
  })
  .refine((v) => v.password === v.again, { path: ['again'], message: 'The two passwords are not the same' });
type Values = z.infer<typeof schema>;

export default function PasswordResetForm({ token }: { token: string }) {
  const [status, setStatus] = useState<Status>(null);
  const [expired, setExpired] = useState(false);
  const { register, handleSubmit, formState } = useForm<Values>({ resolver: zodResolver(schema), defaultValues: { password: '', again: '' } });
  const onSubmit = handleSubmit(async (v) => {
    setStatus(null);
    try {
      const { error } = await authClient.resetPassword({ newPassword: v.password, token });
      if (error) {
        if (error.code === 'INVALID_TOKEN') setExpired(true);
        setStatus({ kind: 'error', message: authMessage(error, 'Could not change the password.') });
        return;
      }
      window.location.assign('/sign-in?reset=1');
    } catch {
      setStatus({ kind: 'error', message: 'Could not change the password. Check the connection and try again.' });
    }
  });
  const e = formState.errors;
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4" data-hydrated="true">
      <div>
        <label className="tt-label" htmlFor="password">New password</label>
        <input id="password" type="password" autoComplete="new-password" className="tt-input" aria-invalid={!!e.password} aria-describedby="password-hint" {...register('password')} />
        <p id="password-hint" className="text-muted text-base">At least {MIN_PASSWORD_LENGTH} characters.</p>
        {e.password && <p className="tt-field-error">{e.password.message}</p>}
      </div>
      <div>
        <label className="tt-label" htmlFor="again">New password again</label>
        <input id="again" type="password" autoComplete="new-password" className="tt-input" aria-invalid={!!e.again} {...register('again')} />
        {e.again && <p className="tt-field-error">{e.again.message}</p>}
      </div>
      <StatusRegion status={status} />
      {expired ? (
        <a className="tt-btn tt-btn-primary w-full" href="/forgot-password">Ask for a new link</a>
      ) : (
        <button type="submit" className="tt-btn tt-btn-primary w-full" disabled={formState.isSubmitting}>
          {formState.isSubmitting ? 'Saving…' : 'Set new password'}
        </button>
      )}
    </form>
  );
}
