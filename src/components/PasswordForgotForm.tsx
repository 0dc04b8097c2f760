/** Asks for a reset link. The answer is the same whether or not the address has an account. */
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import * as z from 'zod';
import { authClient } from '../lib/auth-client';
import { StatusRegion, type Status } from './ui/StatusRegion';
import { authMessage } from './MembersMessages';

const schema = z.object({ email: z.string().trim().pipe(z.email('Enter your e-mail address')) });
type Values = z.infer<typeof schema>;

export const SENT = 'If that address has an account, a message is on its way. The link in it works for one hour.';

export default function PasswordForgotForm() {
  const [status, setStatus] = useState<Status>(null);
  const { register, handleSubmit, formState } = useForm<Values>({ resolver: zodResolver(schema) });
  const onSubmit = handleSubmit(async (v) => {
    setStatus(null);
    try {
      const { error } = await authClient.requestPasswordReset({ email: v.email, redirectTo: '/reset-password' });
      // Only failures that say nothing about the address are reported; everything else reads as sent.
      if (error && (error.status === 429 || error.status >= 500)) {
        setStatus({ kind: 'error', message: authMessage(error, 'Could not send the message.') });
        return;
      }
      setStatus({ kind: 'ok', message: SENT });
    } catch {
      setStatus({ kind: 'error', message: 'Could not send the message. Check the connection and try again.' });
    }
  });
  const e = formState.errors;
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4" data-hydrated="true">
      <div>
        <label className="tt-label" htmlFor="email">E-mail</label>
        <input id="email" type="email" autoComplete="username" className="tt-input" aria-invalid={!!e.email} {...register('email')} />
        {e.email && <p className="tt-field-error">{e.email.message}</p>}
      </div>
      <StatusRegion status={status} />
      <button type="submit" className="tt-btn tt-btn-primary w-full" disabled={formState.isSubmitting}>
        {formState.isSubmitting ? 'Sending…' : 'Send reset link'}
      </button>
    </form>
  );
}
