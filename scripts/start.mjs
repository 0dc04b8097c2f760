#!/usr/bin/env node
// `npm start` (production build) and `npm run dev` (hot reload): every service the app needs,
// the demo data, then the app. Ctrl-C or SIGTERM stops all of it, the cluster included.
import path from 'node:path';
import { startStack, migrateAndSeed, buildIfStale, startApp, root } from './lib/stack.mjs';
import { portIsFree } from './lib/sh.mjs';
import { say, fail } from './lib/log.mjs';

const dev = process.argv.includes('--dev');
const host = process.env.HOST ?? '127.0.0.1';
const port = Number(process.env.PORT ?? 4321);
const ports = {
  pg: Number(process.env.TT_PG_PORT ?? 54329),
  s3: Number(process.env.TT_S3_PORT ?? 4569),
  smtp: Number(process.env.TT_SMTP_PORT ?? 1025),
  mailWeb: Number(process.env.TT_MAIL_WEB_PORT ?? 1080),
};
const publicUrl = process.env.PUBLIC_URL ?? `http://${host === '0.0.0.0' ? '127.0.0.1' : host}:${port}`;
const origins = [...new Set([publicUrl, `http://127.0.0.1:${port}`, `http://localhost:${port}`])];

const started = Date.now();
let stack;
let stopping = false;
async function shutdown(code = 0) {
  if (stopping) return;
  stopping = true;
  say('Stopping…');
  if (stack) await stack.stop();
  say('Stopped.');
  process.exit(code);
}
process.on('SIGINT', () => shutdown(0));
process.on('SIGTERM', () => shutdown(0));

try {
  if (!(await portIsFree(port))) throw new Error(`Port ${port} is already in use; set PORT to another one.`);
  stack = await startStack({ dataDir: path.join(root, '.data', 'dev'), ports, database: 'torquetrail', appOrigins: origins });
  migrateAndSeed(stack.env);
  if (!dev) buildIfStale();
  say(dev ? 'Starting astro dev (hot reload)' : `Starting the app on ${host}:${port}`);
  const app = await startApp({ ...stack.env, PUBLIC_URL: publicUrl }, { host, port, dev });
  stack.children.push(app);
  app.on('exit', (code) => { if (!stopping) { fail(`The app exited with ${code}`); shutdown(1); } });
  console.log(`
  Torquetrail is running (${((Date.now() - started) / 1000).toFixed(1)} s)

    App      ${publicUrl}
    Inbox    http://127.0.0.1:${ports.mailWeb}   (every e-mail the app sends lands here)
    S3 fake  http://127.0.0.1:${ports.s3}

  Demo sign-ins (password for all: torquetrail-demo):
    owner       olga.owner@demo.torquetrail.test
    lead        lars.lead@demo.torquetrail.test
    technician  tess.tech@demo.torquetrail.test
    reviewer    rui.reviewer@demo.torquetrail.test

  Ctrl-C stops everything.
`);
} catch (e) {
  fail(e instanceof Error ? e.message : String(e));
  await shutdown(1);
}
