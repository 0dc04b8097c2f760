#!/usr/bin/env node
// `npm run soak`: crash safety of the run log. The same bootstrap as `npm test` (throwaway data,
// free ports), the built app, then scripts/soak/driver.ts streams step events from several
// simulated technicians while this script kills the app server with SIGKILL again and again
// (SOAK_KILLS, default 8) and restarts it, and restarts PostgreSQL once. Afterwards the driver
// checks every acknowledged event is in the log exactly once, seqs are contiguous, and every
// run's state rebuilt from the log equals GET /api/runs/:id. Exit code 0 only when all hold.
import fs from 'node:fs';
import path from 'node:path';
import { spawn } from 'node:child_process';
import { startStack, migrateAndSeed, buildIfStale, startApp, root } from './lib/stack.mjs';
import { freePort, stopChild } from './lib/sh.mjs';
import { say, fail } from './lib/log.mjs';

const KILLS = Number(process.env.SOAK_KILLS ?? 8);
// Kills are paced by progress, not by the clock: each waits for this many newly acknowledged
// events, so a slow machine gets the same amount of load between crashes as a fast one.
const ACKS_BETWEEN = Number(process.env.SOAK_ACKS_BETWEEN ?? 25);
const dataDir = path.join(root, '.data', `soak-${process.pid}`);
let stack;
let app;
let driver;
let code = 1;

const cleanup = async () => {
  if (driver && driver.exitCode === null) driver.kill('SIGTERM');
  if (app) { app.killedBySoak = true; await stopChild(app); }
  if (stack) await stack.stop();
  fs.rmSync(dataDir, { recursive: true, force: true });
};
process.on('SIGINT', async () => { await cleanup(); process.exit(130); });
process.on('SIGTERM', async () => { await cleanup(); process.exit(143); });

/** App servers that ended without being killed: a crash the soak itself did not cause. */
let unexpectedExits = 0;
/** Resolves the current wait for a driver message or a server exit. */
let wake = () => {};
const watch = (child) => {
  child.once('exit', (c, signal) => {
    if (!child.killedBySoak) {
      unexpectedExits++;
      say(`the app server exited on its own (code ${c}, signal ${signal})`);
    }
    wake(); // a wait for progress ends: the loop restarts the server
  });
  return child;
};

/** SIGKILL to the app's process group (only the server this script started), then wait for it to go. */
async function killApp() {
  if (app.exitCode !== null || app.signalCode !== null) return; // already gone: counted by watch()
  app.killedBySoak = true;
  const gone = new Promise((r) => app.once('exit', r));
  try { process.kill(-app.pid, 'SIGKILL'); } catch { /* already gone */ }
  await gone;
}

try {
  const ports = { pg: await freePort(), s3: await freePort(), smtp: await freePort(), mailWeb: await freePort() };
  const appPort = await freePort();
  const appUrl = `http://127.0.0.1:${appPort}`;
  stack = await startStack({ dataDir, ports, database: 'torquetrail_soak', appOrigins: [appUrl] });
  migrateAndSeed(stack.env);
  const outDir = path.join(dataDir, 'dist');
  buildIfStale(outDir);
  const appEnv = { ...stack.env, SIGNIN_RATE_LIMIT: '100000' };
  const start = async () => watch(await startApp(appEnv, { host: '127.0.0.1', port: appPort, silent: !process.env.TT_APP_LOG, outDir }));
  say(`Starting the built app on ${appUrl}`);
  app = await start();

  driver = spawn(process.execPath, ['--import', 'tsx', path.join(root, 'scripts', 'soak', 'driver.ts')], {
    cwd: root, stdio: ['ignore', 'inherit', 'inherit', 'ipc'], env: { ...process.env, ...stack.env, APP_URL: appUrl },
  });
  const messages = [];
  let acked = 0;
  driver.on('message', (m) => {
    if (m?.type === 'acked') acked = m.total;
    else messages.push(m);
    wake();
  });
  driver.on('exit', () => wake());
  /** Waits until `n` more events are acknowledged (or the driver has finished its runs). */
  const waitForAcks = async (n) => {
    const target = acked + n;
    while (acked < target && !messages.some((m) => m.type === 'done') && app.exitCode === null && app.signalCode === null) {
      if (driver.exitCode !== null) throw new Error('the soak driver exited early');
      await new Promise((r) => { wake = r; });
    }
  };
  const waitFor = async (type) => {
    for (;;) {
      const m = messages.find((x) => x.type === type);
      if (m) return m;
      if (driver.exitCode !== null) throw new Error(`the soak driver exited before "${type}"`);
      await new Promise((r) => { wake = r; });
    }
  };

  const ready = await waitFor('ready');
  say(`Load running: ${ready.runs} technicians, ${ready.eventsPerRun} events per run`);
  let pgRestarts = 0;
  const t0 = Date.now();
  for (let i = 1; i <= KILLS; i++) {
    await waitForAcks(ACKS_BETWEEN);
    if (messages.some((m) => m.type === 'done')) break;
    await killApp();
    say(`kill -9 #${i} of the app server (${((Date.now() - t0) / 1000).toFixed(1)} s)`);
    if (i === Math.ceil(KILLS / 2)) {
      // Restart PostgreSQL while the app is down, then once more while it serves.
      stack.cluster.restart();
      pgRestarts++;
      say('PostgreSQL restarted');
    }
    app = await start();
    if (i === Math.ceil(KILLS / 2) + 1) {
      await waitForAcks(Math.ceil(ACKS_BETWEEN / 2));
      stack.cluster.restart();
      pgRestarts++;
      say('PostgreSQL restarted under load');
    }
  }
  await waitForAcks(ACKS_BETWEEN);
  driver.send({ type: 'stop' });
  const done = await waitFor('done');
  const s = done.summary ?? {};
  console.log('\nSoak result');
  console.log(`  app server kill -9 + restart: ${KILLS}, PostgreSQL restarts: ${pgRestarts}`);
  console.log(`  technicians ${s.technicians}, event keys tried ${s.keys}, acknowledged ${s.acknowledged} (${s.acknowledgedAfterRetry} answered 200 as a stored retry), in the log ${s.logged}`);
  console.log(`  POST attempts ${s.attempts}: connection errors ${s.connectionErrors}, 5xx ${s.serverErrors}, acknowledged on a retry ${s.retriedAcks}, refusals ${s.refusals}; load ran ${s.loadSeconds?.toFixed?.(1)} s`);
  console.log(`  app servers that exited on their own: ${unexpectedExits}`);
  if (done.ok && unexpectedExits === 0) {
    console.log('  every acknowledged event is in the log exactly once, seqs are contiguous, every run rebuilds to what GET /api/runs/:id answers');
    code = 0;
  } else {
    console.log(`  ${done.problemCount + unexpectedExits} problem(s):`);
    for (const p of done.problems) console.log(`   - ${p}`);
    if (unexpectedExits) console.log(`   - the app server crashed ${unexpectedExits} time(s) without being killed (run with TT_APP_LOG=1 to see why)`);
  }
} catch (e) {
  fail(e instanceof Error ? e.stack ?? e.message : String(e));
} finally {
  await cleanup();
  process.exit(code);
}
