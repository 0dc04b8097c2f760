/** E-mail and password sign-in; errors show beside the fields or in the status region. */
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import * as z from 'zod';
import { authClient } from '../lib/auth-client';
import { StatusRegion, type Status } from './ui/StatusRegion';

const schema = z.object({
  email: z.string().trim().email('Enter your e-mail address'),
  password: z.string().min(1, 'Enter your password'),
});
type Values = z.infer<typeof schema>;

/** Only same-site paths are followed after sign-in, never another origin. */
const safeNext = (next: string | undefined) => (next && next.startsWith('/') && !next.startsWith('//') ? next : '/');

export default function SignInForm({ next, notice }: { next?: string; notice?: string }) {
  const [status, setStatus] = useState<Status>(notice ? { kind: 'info', message: notice } : null);
  const { register, handleSubmit, formState } = useForm<Values>({ resolver: zodResolver(schema) });
  const onSubmit = handleSubmit(async (v) => {
    setStatus(null);
    const { error } = await authClient.signIn.email({ email: v.email, password: v.password });
    if (error) {
      const message = error.status === 401 || error.code === 'INVALID_EMAIL_OR_PASSWORD' ? 'That e-mail and password do not match. Try again.' : error.status === 429 ? 'Too many attempts. Wait a minute and try again.' : (error.message ?? 'Could not sign in.');
      setStatus({ kind: 'error', message });
      return;
    }
    window.location.assign(safeNext(next));
  });
  const e = formState.errors;
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4" data-hydrated="true">
      <div>
        <label className="tt-label" htmlFor="email">E-mail</label>
        <input id="email" type="email" autoComplete="username" className="tt-input" aria-invalid={!!e.email} {...register('email')} />
        {e.email && <p className="tt-field-error">{e.email.message}</p>}
      </div>
      <div>
        <label className="tt-label" htmlFor="password">Password</label>
        <input id="password" type="password" autoComplete="current-password" className="tt-input" aria-invalid={!!e.password} {...register('password')} />
        {e.password && <p className="tt-field-error">{e.password.message}</p>}
      </div>
      <StatusRegion status={status} />
      <button type="submit" className="tt-btn tt-btn-primary w-full" disabled={formState.isSubmitting}>
        {formState.isSubmitting ? 'Signing in…' : 'Sign in'}
      </button>
    </form>
  );
}
