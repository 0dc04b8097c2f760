/** Invite one person to the shop by e-mail with a role; field errors show beside the fields. */
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import * as z from 'zod';
import { ROLE_LABELS, SHOP_ROLES, type ShopRole } from '../lib/access';

const schema = z.object({
  email: z.string().trim().toLowerCase().pipe(z.email('Enter the e-mail address to send the invitation to')),
  role: z.enum(SHOP_ROLES, 'Choose a role'),
});
type Values = z.infer<typeof schema>;

type Props = { shopName: string; disabled: boolean; onInvite: (email: string, role: ShopRole) => Promise<boolean> };

export default function MembersInviteForm({ shopName, disabled, onInvite }: Props) {
  const { register, handleSubmit, reset, formState } = useForm<z.input<typeof schema>, unknown, Values>({ resolver: zodResolver(schema), defaultValues: { email: '', role: 'technician' } });
  const onSubmit = handleSubmit(async (v) => {
    if (await onInvite(v.email, v.role)) reset({ email: '', role: v.role });
  });
  const e = formState.errors;
  return (
    <section aria-labelledby="invite-heading" className="tt-card p-4">
      <h2 id="invite-heading" className="text-xl font-semibold mb-1">Invite someone</h2>
      <p className="text-muted mb-3">They get an e-mail with a link to join {shopName}. The link works for 7 days.</p>
      <form onSubmit={onSubmit} noValidate className="grid gap-4 sm:grid-cols-[1fr_14rem_auto] sm:items-end">
        <div>
          <label className="tt-label" htmlFor="invite-email">E-mail</label>
          <input id="invite-email" type="email" autoComplete="off" className="tt-input" aria-invalid={!!e.email} aria-describedby={e.email ? 'invite-email-error' : undefined} {...register('email')} />
          {e.email && <p id="invite-email-error" className="tt-field-error">{e.email.message}</p>}
        </div>
        <div>
          <label className="tt-label" htmlFor="invite-role">Role</label>
          <select id="invite-role" className="tt-input" aria-invalid={!!e.role} {...register('role')}>
            {SHOP_ROLES.map((r) => <option key={r} value={r}>{ROLE_LABELS[r]}</option>)}
          </select>
          {e.role && <p className="tt-field-error">{e.role.message}</p>}
        </div>
        <button type="submit" className="tt-btn tt-btn-primary" disabled={disabled || formState.isSubmitting}>
          {formState.isSubmitting ? 'Sending…' : 'Send invitation'}
        </button>
      </form>
    </section>
  );
}
