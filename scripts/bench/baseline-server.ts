/**
 * The bare baseline for the run API: node:http and pg, no framework, no ORM, no machine.
 * It does the same SQL as the app for the same two requests — session and membership lookup,
 * the run, its pinned revision and its log; for a post, the same statements in one
 * transaction with the run row locked — so the ratio shows what Astro, MikroORM and the
 * run machine cost on top.
 */
import http from 'node:http';
import pg from 'pg';

export async function startBaseline(databaseUrl: string, port: number): Promise<{ close: () => Promise<void> }> {
  const pool = new pg.Pool({ connectionString: databaseUrl, max: 10 });
  const session = async (c: pg.PoolClient | pg.Pool, cookie: string) => {
    const token = decodeURIComponent(/better-auth\.session_token=([^;]+)/.exec(cookie)?.[1] ?? '').split('.')[0] ?? '';
    const s = await c.query(`select s."userId", s."activeOrganizationId", u.name from session s join "user" u on u.id = s."userId" where s.token = $1 and s."expiresAt" > now()`, [token]);
    const row = s.rows[0];
    if (!row) return null;
    const m = await c.query(`select m.role, o.id from member m join organization o on o.id = m."organizationId" where m."userId" = $1 order by (o.id = $2) desc limit 1`, [row.userId, row.activeOrganizationId ?? '']);
    return m.rows[0] ? { userId: row.userId as string, shopId: m.rows[0].id as string, role: m.rows[0].role as string } : null;
  };
  const server = http.createServer(async (req, res) => {
    try {
      const match = /^\/runs\/([0-9a-f-]{36})(\/events)?$/.exec(req.url ?? '');
      const who = await session(pool, req.headers.cookie ?? '');
      if (!match || !who) { res.writeHead(who ? 404 : 401).end(); return; }
      const runId = match[1];
      if (req.method === 'GET' && !match[2]) {
        const run = (await pool.query('select * from run where id = $1 and shop_id = $2', [runId, who.shopId])).rows[0];
        if (!run) { res.writeHead(404).end(); return; }
        const [rev, events, job] = await Promise.all([
          pool.query('select content from procedure_revision where id = $1', [run.revision_id]),
          pool.query('select seq, type, payload, actor_id, actor_role, device, recorded_at from run_event where run_id = $1 order by seq', [runId]),
          pool.query('select code from job where id = $1', [run.job_id]),
        ]);
        res.writeHead(200, { 'content-type': 'application/json' }).end(JSON.stringify({ run: { ...run, jobCode: job.rows[0]?.code }, steps: rev.rows[0]?.content?.steps, events: events.rows }));
        return;
      }
      if (req.method === 'POST' && match[2]) {
        let body = '';
        for await (const chunk of req) body += chunk;
        const input = JSON.parse(body) as { event: Record<string, unknown>; idempotencyKey: string; expectedSeq: number };
        const c = await pool.connect();
        try {
          await c.query('begin');
          const run = (await c.query('select * from run where id = $1 and shop_id = $2 for update', [runId, who.shopId])).rows[0];
          await c.query('select content from procedure_revision where id = $1', [run.revision_id]);
          const log = await c.query('select seq, idempotency_key, payload from run_event where run_id = $1 order by seq', [runId]);
          const seq = log.rows.length + 1;
          await c.query('insert into run_event (run_id, seq, type, payload, actor_id, actor_role, idempotency_key, recorded_at) values ($1,$2,$3,$4,$5,$6,$7, now())', [runId, seq, input.event.type, { ...input.event, actor: { userId: who.userId, role: who.role } }, who.userId, who.role, input.idempotencyKey]);
          await c.query('update run set last_seq = $2, updated_at = now() where id = $1', [runId, seq]);
          await c.query('commit');
          res.writeHead(201, { 'content-type': 'application/json' }).end(JSON.stringify({ lastSeq: seq }));
        } catch (e) {
          await c.query('rollback');
          throw e;
        } finally {
          c.release();
        }
        return;
      }
      res.writeHead(405).end();
    } catch (e) {
      res.writeHead(500).end(String(e));
    }
  });
  await new Promise<void>((r) => server.listen(port, '127.0.0.1', r));
  return { close: async () => { await new Promise((r) => server.close(r)); await pool.end(); } };
}
