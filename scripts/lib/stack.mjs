// The shared bootstrap of `npm start`, `npm run dev`, `npm test` and `npm run bench`:
// prerequisites, the private PostgreSQL cluster, the S3 fake and the mail catcher.
import fs from 'node:fs';
import path from 'node:path';
import crypto from 'node:crypto';
import { ensureNodeModules, ensurePostgres } from './prereqs.mjs';
import { startCluster } from './postgres.mjs';
import { startChild, stopChild, waitForPort, run } from './sh.mjs';
import { say } from './log.mjs';

export const root = path.resolve(path.dirname(new URL(import.meta.url).pathname), '..', '..');

/** A stable secret per data folder, so sessions survive restarts of `npm start`. */
function secretFor(dataDir) {
  const file = path.join(dataDir, 'auth-secret');
  if (!fs.existsSync(file)) fs.writeFileSync(file, crypto.randomBytes(32).toString('hex'), { mode: 0o600 });
  return fs.readFileSync(file, 'utf8').trim();
}

/**
 * Brings up every service; returns the environment for the app and a stop() that ends all
 * of it, the cluster included. `ports` holds pg, s3, smtp, mailWeb, app.
 */
export async function startStack({ dataDir, ports, database, appOrigins }) {
  const children = [];
  let cluster;
  const stop = async () => {
    for (const c of children.reverse()) await stopChild(c);
    children.length = 0;
    if (cluster) {
      try { cluster.stop(); } catch (e) { console.error(e.message); }
      cluster = undefined;
    }
  };
  try {
    const bin = ensurePostgres();
    ensureNodeModules(root);
    fs.mkdirSync(dataDir, { recursive: true });
    cluster = startCluster({ bin, dataDir, port: ports.pg });
    cluster.ensureDatabase(database);

    say(`Starting the S3 fake on 127.0.0.1:${ports.s3}`);
    const s3 = startChild('s3', process.execPath, [path.join(root, 'docker-free-s3-fake', 'server.mjs')], {
      env: { ...process.env, S3_FAKE_PORT: String(ports.s3), S3_FAKE_DIR: path.join(dataDir, 's3'), S3_BUCKET: 'torquetrail', S3_CORS_ORIGINS: appOrigins.join(',') },
    });
    children.push(s3);
    say(`Starting the mail catcher: SMTP 127.0.0.1:${ports.smtp}, inbox http://127.0.0.1:${ports.mailWeb}`);
    const mail = startChild('mail', process.execPath, [
      path.join(root, 'node_modules', 'maildev', 'dist', 'bin', 'maildev.js'),
      '--smtp', String(ports.smtp), '--web', String(ports.mailWeb), '--ip', '127.0.0.1', '--web-ip', '127.0.0.1',
      '--mail-directory', path.join(dataDir, 'mail'), '--silent',
    ], { env: process.env });
    children.push(mail);
    await Promise.all([waitForPort(ports.s3, '127.0.0.1', 30_000, s3), waitForPort(ports.smtp, '127.0.0.1', 30_000, mail), waitForPort(ports.mailWeb, '127.0.0.1', 30_000, mail)]);

    const env = {
      DATABASE_URL: cluster.url(database),
      PUBLIC_URL: appOrigins[0],
      BETTER_AUTH_SECRET: secretFor(dataDir),
      S3_ENDPOINT: `http://127.0.0.1:${ports.s3}`,
      S3_BUCKET: 'torquetrail',
      S3_ACCESS_KEY_ID: 'S3RVER',
      S3_SECRET_ACCESS_KEY: 'S3RVER',
      S3_FORCE_PATH_STYLE: 'true',
      SMTP_URL: `smtp://127.0.0.1:${ports.smtp}`,
      MAIL_INBOX_URL: `http://127.0.0.1:${ports.mailWeb}`,
      TRUSTED_ORIGINS: appOrigins.join(','),
    };
    return { env, cluster, children, stop };
  } catch (e) {
    await stop();
    throw e;
  }
}

/** Applies the committed migrations, then seeds the demo shop when it is not there yet. */
export function migrateAndSeed(env, { seed = true } = {}) {
  say('Applying database migrations');
  run(process.execPath, ['--import', 'tsx', path.join(root, 'scripts', 'db.ts'), seed ? 'migrate-and-seed' : 'migrate'], { cwd: root, env: { ...process.env, ...env } });
}

/** Newest modification time under the given paths (files or folders). */
function newest(paths) {
  let t = 0;
  const walk = (p) => {
    if (!fs.existsSync(p)) return;
    const st = fs.statSync(p);
    if (st.isDirectory()) for (const e of fs.readdirSync(p)) walk(path.join(p, e));
    else t = Math.max(t, st.mtimeMs);
  };
  paths.forEach(walk);
  return t;
}

/** Builds the production server unless dist/ is newer than every source it comes from. */
export function buildIfStale(outDir = path.join(root, 'dist')) {
  const entry = path.join(outDir, 'server', 'entry.mjs');
  const sources = ['src', 'public', 'astro.config.mjs', 'package-lock.json', 'tsconfig.json'].map((p) => path.join(root, p));
  if (fs.existsSync(entry) && fs.statSync(entry).mtimeMs > newest(sources)) {
    say('Production build is up to date');
    return;
  }
  say('Building the app (astro build)');
  run(process.execPath, [path.join(root, 'node_modules', 'astro', 'astro.js'), 'build', '--silent'], { cwd: root, env: { ...process.env, TT_OUT_DIR: outDir } });
  fs.utimesSync(entry, new Date(), new Date());
}

/** Starts the built server (or astro dev) and waits until it answers. */
export async function startApp(env, { host, port, dev = false, silent = false, outDir = path.join(root, 'dist') }) {
  const args = dev
    ? [path.join(root, 'node_modules', 'astro', 'astro.js'), 'dev', '--host', host, '--port', String(port)]
    : [path.join(outDir, 'server', 'entry.mjs')];
  const app = startChild('app', process.execPath, args, { cwd: root, silent, env: { ...process.env, ...env, HOST: host, PORT: String(port), NODE_ENV: dev ? 'development' : 'production' } });
  await waitForPort(port, host, 120_000, app);
  return app;
}
