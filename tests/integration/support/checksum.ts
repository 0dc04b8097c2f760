/**
 * One digest over every table of the test database, to prove a request changed nothing:
 * content for most tables, the row count where a background worker updates rows in place.
 */
import type { MikroORM } from '@mikro-orm/postgresql';

const COUNT_ONLY = new Set(['outgoing_message']);

export async function tableChecksum(orm: MikroORM): Promise<() => Promise<string>> {
  const tables: Array<{ table_name: string }> = await orm.em.getConnection().execute(`select table_name from information_schema.tables where table_schema = 'public' and table_type = 'BASE TABLE' and table_name <> 'mikro_orm_migrations' order by 1`);
  const sql = tables
    .map(({ table_name: t }) => COUNT_ONLY.has(t)
      ? `select '${t}' as t, count(*)::text as h from "${t}"`
      : `select '${t}' as t, count(*)::text || '-' || coalesce(md5(string_agg(x::text, '|' order by x::text)), '') as h from "${t}" x`)
    .join(' union all ');
  return async () => {
    const rows = (await orm.em.getConnection().execute(sql)) as Array<{ t: string; h: string }>;
    return rows.map((r) => `${r.t}:${r.h}`).join(',');
  };
}
