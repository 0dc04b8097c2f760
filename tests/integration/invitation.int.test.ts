/** What an invitation link shows, for every state an invitation can be in, and the plugin's own role checks. */
import { beforeAll, describe, expect, it } from 'vitest';
import { freshDatabase } from './support/db';
import { createShop, type TestShop } from './support/shops';
import { auth } from '../../src/server/auth';
import { findInvitation } from '../../src/server/services/invitation.service';

let shop: TestShop;

const invite = (email: string, role: 'lead' | 'technician' | 'reviewer', headers = shop.members.owner.headers) =>
  auth().api.createInvitation({ body: { email, role, organizationId: shop.id }, headers });

beforeAll(async () => {
  await freshDatabase();
  shop = await createShop('Invitation shop');
});

describe('findInvitation', () => {
  it('shows a waiting invitation with its shop, role and inviter', async () => {
    const inv = await invite('new.person@it.torquetrail.test', 'reviewer');
    const view = await findInvitation(inv.id);
    expect(view).toMatchObject({ id: inv.id, state: 'pending', email: 'new.person@it.torquetrail.test', role: 'reviewer', shopId: shop.id, shopName: shop.name, inviterName: shop.members.owner.name, hasAccount: false });
  });

  it('knows when the invited address already has an account', async () => {
    const other = await createShop('Other shop');
    const inv = await invite(other.members.technician.email, 'technician');
    expect((await findInvitation(inv.id))?.hasAccount).toBe(true);
  });

  it('calls an invitation past its date expired', async () => {
    const inv = await invite('late.person@it.torquetrail.test', 'lead');
    const view = await findInvitation(inv.id, new Date(Date.now() + 8 * 24 * 3600 * 1000));
    expect(view?.state).toBe('expired');
  });

  it('calls a cancelled invitation cancelled, and an unknown id nothing', async () => {
    const inv = await invite('withdrawn.person@it.torquetrail.test', 'technician');
    await auth().api.cancelInvitation({ body: { invitationId: inv.id }, headers: shop.members.owner.headers });
    expect((await findInvitation(inv.id))?.state).toBe('canceled');
    expect(await findInvitation('no-such-invitation')).toBeNull();
    expect(await findInvitation('')).toBeNull();
  });
});

describe('the shop plugin enforces roles on membership changes', () => {
  it('refuses a technician who tries to invite', async () => {
    await expect(invite('nope@it.torquetrail.test', 'reviewer', shop.members.technician.headers)).rejects.toMatchObject({ body: { code: 'YOU_ARE_NOT_ALLOWED_TO_INVITE_USERS_TO_THIS_ORGANIZATION' } });
  });

  it('refuses to demote the only owner', async () => {
    const full = await auth().api.getFullOrganization({ query: { organizationId: shop.id }, headers: shop.members.owner.headers });
    const me = full!.members.find((m) => m.userId === shop.members.owner.userId)!;
    await expect(auth().api.updateMemberRole({ body: { memberId: me.id, role: 'lead', organizationId: shop.id }, headers: shop.members.owner.headers })).rejects.toMatchObject({ body: { code: 'YOU_CANNOT_LEAVE_THE_ORGANIZATION_WITHOUT_AN_OWNER' } });
  });
});
