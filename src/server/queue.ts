/**
 * The app's job queue: one pg-boss instance per process on the app's own database (schema
 * `pgboss`), started lazily on first use. Workers registered with `registerWorker` begin
 * polling when the queue starts (or at once if it already has).
 */
import PgBoss from 'pg-boss';
import { config } from './config';

type Worker = { name: string; options: PgBoss.Queue; work: PgBoss.WorkOptions; handler: (job: PgBoss.JobWithMetadata<unknown>) => Promise<void> };

let boss: Promise<PgBoss> | undefined;
const workers = new Map<string, Worker>();
const started = new Set<string>();

async function startWorker(b: PgBoss, w: Worker): Promise<void> {
  if (started.has(w.name)) return;
  started.add(w.name);
  await b.createQueue(w.name, w.options);
  await b.work<unknown>(w.name, { ...w.work, includeMetadata: true, batchSize: 1 }, async (jobs) => {
    for (const job of jobs) await w.handler(job);
  });
}

/** The started queue (the first call connects, installs pg-boss's schema if needed and starts every registered worker). */
export function queue(): Promise<PgBoss> {
  boss ??= (async () => {
    const b = new PgBoss({ connectionString: config().DATABASE_URL, schema: 'pgboss', max: 4, application_name: 'torquetrail-queue' });
    b.on('error', (e) => console.error('[queue] pg-boss error', e));
    await b.start();
    for (const w of workers.values()) await startWorker(b, w);
    return b;
  })().catch((e) => {
    boss = undefined;
    throw e;
  });
  return boss;
}

/** Registers a worker for a queue name; its queue is created with the given retry policy. */
export function registerWorker<T>(name: string, options: Omit<PgBoss.Queue, 'name'>, work: PgBoss.WorkOptions, handler: (job: PgBoss.JobWithMetadata<T>) => Promise<void>): void {
  if (workers.has(name)) return;
  const w: Worker = { name, options: { name, ...options }, work, handler: handler as Worker['handler'] };
  workers.set(name, w);
  if (boss) void boss.then((b) => startWorker(b, w)).catch((e) => console.error(`[queue] worker ${name} did not start`, e));
}

/** Adds a job to a registered queue (starting the queue if needed); returns pg-boss's job id. */
export async function enqueue<T extends object>(name: string, data: T, options: PgBoss.SendOptions = {}): Promise<string> {
  const b = await queue();
  const w = workers.get(name);
  if (w) await startWorker(b, w);
  const id = await b.send(name, data, options);
  if (!id) throw new Error(`The queue refused a job for ${name}`);
  return id;
}

/** Stops the queue, letting running jobs finish (tests and graceful shutdown). */
export async function stopQueue(): Promise<void> {
  if (!boss) return;
  const b = await boss.catch(() => null);
  boss = undefined;
  started.clear();
  if (b) await b.stop({ graceful: true, wait: true, timeout: 10_000 });
}
