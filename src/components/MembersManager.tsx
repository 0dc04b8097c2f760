/**
 * The owner's members desk: who is in the shop with which role, who is invited, and the invite
 * form. Every change goes through better-auth's shop endpoints, which enforce the roles
 * themselves; the list is re-read from the server after each change.
 */
import { useEffect, useRef, useState } from 'react';
import { authClient } from '../lib/auth-client';
import { ROLE_LABELS, SHOP_ROLES, type ShopRole } from '../lib/access';
import { StatusRegion, type Status } from './ui/StatusRegion';
import { authMessage, type AuthError } from './MembersMessages';
import { toRoster, shortDate, type FullShop, type Roster, type RosterMember } from './MembersRoster';
import MembersInviteForm from './MembersInviteForm';

type Props = { shopId: string; shopName: string; activeShopId: string | null; currentUserId: string; initial: Roster };
type Call = { data?: unknown; error?: AuthError };

const roleWord = (r: ShopRole | null) => (r ? ROLE_LABELS[r] : 'Member');

export default function MembersManager({ shopId, shopName, activeShopId, currentUserId, initial }: Props) {
  const [roster, setRoster] = useState<Roster>(initial);
  const [status, setStatus] = useState<Status>(null);
  const [busy, setBusy] = useState<string | null>(null);
  const [confirming, setConfirming] = useState<string | null>(null);
  const keepRef = useRef<HTMLButtonElement>(null);

  // The plugin's endpoints act on the session's active shop: make it this one once.
  useEffect(() => {
    if (activeShopId === shopId) return;
    authClient.organization.setActive({ organizationId: shopId }).then(
      ({ error }) => error && setStatus({ kind: 'error', message: authMessage(error, 'Could not open this shop.') }),
      () => setStatus({ kind: 'error', message: 'Could not open this shop. Check the connection and reload.' }),
    );
  }, [activeShopId, shopId]);

  useEffect(() => {
    if (confirming) keepRef.current?.focus();
  }, [confirming]);

  async function refresh() {
    const { data, error } = await authClient.organization.getFullOrganization({ query: { organizationId: shopId } });
    if (error || !data) throw new Error(authMessage(error, 'Could not reload the member list.'));
    setRoster(toRoster(data as unknown as FullShop));
  }

  /** Runs one change; on success re-reads the list and says what happened, on failure keeps the list as the server has it. */
  async function run(key: string, call: () => Promise<Call>, done: string, failed: string): Promise<boolean> {
    setBusy(key);
    setStatus(null);
    try {
      const { error } = await call();
      if (error) {
        setStatus({ kind: 'error', message: authMessage(error, failed) });
        if (error.code === 'MEMBER_NOT_FOUND' || error.code === 'INVITATION_NOT_FOUND') await refresh();
        return false;
      }
      await refresh();
      setStatus({ kind: 'ok', message: done });
      return true;
    } catch (e) {
      setStatus({ kind: 'error', message: e instanceof Error && e.message ? e.message : `${failed} Check the connection and try again.` });
      return false;
    } finally {
      setBusy(null);
    }
  }

  async function changeRole(m: RosterMember, role: ShopRole) {
    if (role === m.role) return;
    const ok = await run(`role:${m.id}`, () => authClient.organization.updateMemberRole({ memberId: m.id, role, organizationId: shopId }), `${m.name} is now ${ROLE_LABELS[role]}.`, `Could not change ${m.name}'s role.`);
    // An owner who hands over ownership no longer manages members: show them what they may see now.
    if (ok && m.userId === currentUserId) window.location.assign('/');
  }

  async function remove(m: RosterMember) {
    const ok = await run(`remove:${m.id}`, () => authClient.organization.removeMember({ memberIdOrEmail: m.id, organizationId: shopId }), `${m.name} was removed from ${shopName}.`, `Could not remove ${m.name}.`);
    setConfirming(null);
    if (ok && m.userId === currentUserId) window.location.assign('/');
  }

  const invite = (email: string, role: ShopRole) =>
    run('invite', () => authClient.organization.inviteMember({ email, role, organizationId: shopId }), `Invitation sent to ${email} as ${ROLE_LABELS[role]}.`, 'Could not send the invitation.');

  return (
    <div data-hydrated="true" className="space-y-8">
      <StatusRegion status={status} />

      <section aria-labelledby="members-heading" className="tt-card p-4">
        <h2 id="members-heading" className="text-xl font-semibold mb-3">Members ({roster.members.length})</h2>
        <div className="overflow-x-auto">
          <table className="w-full text-left border-collapse" data-testid="members-table">
            <thead>
              <tr className="border-b border-line text-muted">
                <th scope="col" className="py-2 pr-3">Name</th>
                <th scope="col" className="py-2 pr-3">E-mail</th>
                <th scope="col" className="py-2 pr-3">Role</th>
                <th scope="col" className="py-2 pr-3">Joined</th>
                <th scope="col" className="py-2"><span className="sr-only">Actions</span></th>
              </tr>
            </thead>
            <tbody>
              {roster.members.map((m) => {
                const self = m.userId === currentUserId;
                const isConfirming = confirming === m.id;
                return (
                  <tr key={m.id} className="border-b border-line align-middle" data-testid="member-row" data-email={m.email}>
                    <td className="py-2 pr-3 font-semibold">{m.name}{self && <span className="text-muted font-normal"> (you)</span>}</td>
                    <td className="py-2 pr-3 break-all">{m.email}</td>
                    <td className="py-2 pr-3">
                      <label className="sr-only" htmlFor={`role-${m.id}`}>Role of {m.name}</label>
                      <select id={`role-${m.id}`} className="tt-input min-w-40" value={m.role} disabled={busy !== null} onChange={(e) => changeRole(m, e.target.value as ShopRole)}>
                        {SHOP_ROLES.map((r) => <option key={r} value={r}>{ROLE_LABELS[r]}</option>)}
                      </select>
                    </td>
                    <td className="py-2 pr-3 whitespace-nowrap"><time dateTime={m.joinedAt}>{shortDate(m.joinedAt)}</time></td>
                    <td className="py-2 text-right">
                      {isConfirming ? (
                        <div role="group" aria-label={`Confirm removing ${m.name}`} className="flex flex-wrap items-center justify-end gap-2">
                          <span className="font-semibold">⚠ Remove {self ? 'yourself' : m.name} from the shop?</span>
                          <button type="button" className="tt-btn tt-btn-danger" disabled={busy !== null} onClick={() => remove(m)}>
                            {busy === `remove:${m.id}` ? 'Removing…' : 'Yes, remove'}
                          </button>
                          <button type="button" ref={keepRef} className="tt-btn tt-btn-quiet" onClick={() => setConfirming(null)}>Keep</button>
                        </div>
                      ) : (
                        <button type="button" className="tt-btn tt-btn-quiet" disabled={busy !== null} onClick={() => { setStatus(null); setConfirming(m.id); }}>
                          Remove<span className="sr-only"> {m.name}</span>
                        </button>
                      )}
                    </td>
                  </tr>
                );
              })}
            </tbody>
          </table>
        </div>
      </section>

      <section aria-labelledby="invitations-heading" className="tt-card p-4">
        <h2 id="invitations-heading" className="text-xl font-semibold mb-3">Waiting invitations ({roster.invitations.length})</h2>
        {roster.invitations.length === 0 ? (
          <p className="text-muted">No invitations are waiting.</p>
        ) : (
          <div className="overflow-x-auto">
            <table className="w-full text-left border-collapse" data-testid="invitations-table">
              <thead>
                <tr className="border-b border-line text-muted">
                  <th scope="col" className="py-2 pr-3">E-mail</th>
                  <th scope="col" className="py-2 pr-3">Role</th>
                  <th scope="col" className="py-2 pr-3">Invited by</th>
                  <th scope="col" className="py-2 pr-3">Valid until</th>
                  <th scope="col" className="py-2"><span className="sr-only">Actions</span></th>
                </tr>
              </thead>
              <tbody>
                {roster.invitations.map((i) => (
                  <tr key={i.id} className="border-b border-line" data-testid="invitation-row" data-email={i.email}>
                    <td className="py-2 pr-3 break-all">✉ {i.email}</td>
                    <td className="py-2 pr-3">{roleWord(i.role)}</td>
                    <td className="py-2 pr-3">{i.inviterName}</td>
                    <td className="py-2 pr-3 whitespace-nowrap"><time dateTime={i.expiresAt}>{shortDate(i.expiresAt)}</time></td>
                    <td className="py-2 text-right">
                      <button type="button" className="tt-btn tt-btn-quiet" disabled={busy !== null}
                        onClick={() => run(`cancel:${i.id}`, () => authClient.organization.cancelInvitation({ invitationId: i.id }), `The invitation to ${i.email} was cancelled; its link no longer works.`, 'Could not cancel the invitation.')}>
                        Cancel invitation<span className="sr-only"> to {i.email}</span>
                      </button>
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        )}
      </section>

      <MembersInviteForm shopName={shopName} disabled={busy !== null} onInvite={invite} />
    </div>
  );
}
