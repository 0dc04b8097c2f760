/** Foundation against the real PostgreSQL: migrations, an entity round trip, shop isolation, error shape. */
import { beforeAll, describe, expect, it } from 'vitest';
import { getMigrations } from 'better-auth/db/migration';
import type { MikroORM } from '@mikro-orm/postgresql';
import { freshDatabase } from './support/db';
import { createShop, type TestShop } from './support/shops';
import { callRoute } from './support/routes';
import { auth } from '../../src/server/auth';
import { ShopSettings } from '../../src/server/entities';
import * as settingsRoute from '../../src/pages/api/shop/settings';
import * as healthRoute from '../../src/pages/api/health';

let orm: MikroORM;
let a: TestShop;
let b: TestShop;

beforeAll(async () => {
  orm = await freshDatabase();
  a = await createShop('Shop A');
  b = await createShop('Shop B');
});

describe('migrations', () => {
  it('create every table better-auth needs, from an empty schema', async () => {
    const { toBeCreated, toBeAdded } = await getMigrations(auth().options);
    expect(toBeCreated.map((t) => t.table)).toEqual([]);
    expect(toBeAdded.map((t) => t.table)).toEqual([]);
  });
  it('leave nothing pending', async () => {
    expect(await orm.migrator.getPendingMigrations()).toEqual([]);
  });
  it('match every entity: the schema diff after migrating is empty', async () => {
    // A new entity or column without its migration shows up here as SQL to run.
    const diff = await orm.schema.getUpdateSchemaSQL({ wrap: false, safe: true });
    // Foreign keys to better-auth's tables (organization, user) are written by hand in the
    // migrations with PostgreSQL's default `_fkey` names; MikroORM cannot see them, as those
    // tables are not its entities, so its wish to drop them is the one line we ignore.
    const lines = diff.trim().split('\n').filter(Boolean);
    expect(lines.filter((l) => !/drop constraint "\w+_fkey";$/.test(l))).toEqual([]);
  });
});

describe('entity round trip', () => {
  it('stores and re-reads shop settings', async () => {
    const em = orm.em.fork();
    const s = await em.findOneOrFail(ShopSettings, { shopId: a.id }).catch(() => em.create(ShopSettings, { shopId: a.id, preferredTorqueUnit: 'N·m', preferredLengthUnit: 'mm', allowSelfSignoff: false }));
    s.preferredTorqueUnit = 'ft·lbf';
    await em.flush();
    em.clear();
    const again = await orm.em.fork().findOneOrFail(ShopSettings, { shopId: a.id });
    expect(again.preferredTorqueUnit).toBe('ft·lbf');
    expect(again.updatedAt).toBeInstanceOf(Date);
  });
});

describe('shop scoping and roles', () => {
  it('the owner changes settings; other roles get 403 in our error shape', async () => {
    const ok = await callRoute(settingsRoute.PATCH, { method: 'PATCH', body: { preferredLengthUnit: 'in' }, as: { shop: a, member: a.members.owner } });
    expect(ok.status).toBe(200);
    expect(ok.body.preferredLengthUnit).toBe('in');
    for (const role of ['lead', 'technician', 'reviewer'] as const) {
      const r = await callRoute(settingsRoute.PATCH, { method: 'PATCH', body: { preferredLengthUnit: 'mm' }, as: { shop: a, member: a.members[role] } });
      expect(r.status).toBe(403);
      expect(r.body.error.code).toBe('forbidden');
    }
  });
  it('reading settings writes nothing; two first changes at once both land, on one row', async () => {
    const shop = await createShop('Shop with default settings');
    const count = async () => Number(((await orm.em.getConnection().execute('select count(*)::int as n from shop_settings where shop_id = ?', [shop.id])) as Array<{ n: number }>)[0]!.n);
    const read = await callRoute(settingsRoute.GET, { as: { shop, member: shop.members.technician } });
    expect(read.body).toMatchObject({ preferredTorqueUnit: 'N·m', preferredLengthUnit: 'mm', allowSelfSignoff: false });
    expect(await count()).toBe(0);
    const [x, y] = await Promise.all([
      callRoute(settingsRoute.PATCH, { method: 'PATCH', body: { preferredLengthUnit: 'in' }, as: { shop, member: shop.members.owner } }),
      callRoute(settingsRoute.PATCH, { method: 'PATCH', body: { preferredTorqueUnit: 'ft·lbf' }, as: { shop, member: shop.members.owner } }),
    ]);
    expect([x.status, y.status]).toEqual([200, 200]);
    expect(await count()).toBe(1);
    expect((await callRoute(settingsRoute.GET, { as: { shop, member: shop.members.technician } })).body).toMatchObject({ preferredTorqueUnit: 'ft·lbf', preferredLengthUnit: 'in' });
  });

  it("a member of shop B reads B's settings, never A's", async () => {
    const r = await callRoute(settingsRoute.GET, { as: { shop: b, member: b.members.technician } });
    expect(r.status).toBe(200);
    expect(r.body.shopId).toBe(b.id);
    expect(r.body.preferredLengthUnit).toBe('mm');
  });
  it('better-auth refuses a member of shop B acting in shop A', async () => {
    const res = await auth().api.hasPermission({ headers: b.members.owner.headers, body: { organizationId: a.id, permissions: { settings: ['update'] } } }).catch((e: { status?: string }) => ({ error: e.status }));
    expect('success' in res && res.success).not.toBe(true);
  });
  it('better-auth answers role permissions from our access control', async () => {
    const can = async (role: 'lead' | 'technician', perms: Record<string, string[]>) =>
      (await auth().api.hasPermission({ headers: a.members[role].headers, body: { organizationId: a.id, permissions: perms } })).success;
    expect(await can('lead', { procedure: ['release'] })).toBe(true);
    expect(await can('technician', { procedure: ['release'] })).toBe(false);
    expect(await can('technician', { run: ['record'] })).toBe(true);
  });
  it('signed out: 401; bad JSON: 400; wrong fields: 400 with fields', async () => {
    expect((await callRoute(settingsRoute.GET)).status).toBe(401);
    const bad = await callRoute(settingsRoute.PATCH, { method: 'PATCH', rawBody: '{nope', as: { shop: a, member: a.members.owner } });
    expect(bad.status).toBe(400);
    expect(bad.body.error.message).toMatch(/not valid JSON/);
    const wrong = await callRoute(settingsRoute.PATCH, { method: 'PATCH', body: { preferredTorqueUnit: 'furlongs' }, as: { shop: a, member: a.members.owner } });
    expect(wrong.status).toBe(400);
    expect(Object.keys(wrong.body.error.fields)).toContain('preferredTorqueUnit');
  });
});

describe('health', () => {
  it('reports database, store and mail reachable', async () => {
    const r = await callRoute(healthRoute.GET);
    expect(r.body.checks.database.ok).toBe(true);
    expect(r.body.checks.store.ok).toBe(true);
    expect(r.body.checks.mail.ok).toBe(true);
    expect(r.status).toBe(200);
  });
});
