#!/usr/bin/env node
// `npm test`: the same bootstrap as `npm start` on throwaway data and free ports, then vitest
// (unit + integration against the real PostgreSQL) and the browser tests (playwright-core
// driving Debian's Chromium against the built server). Stops everything it started, always.
import fs from 'node:fs';
import path from 'node:path';
import { spawnSync } from 'node:child_process';
import { startStack, migrateAndSeed, buildIfStale, startApp, root } from './lib/stack.mjs';
import { freePort, stopChild } from './lib/sh.mjs';
import { ensureChromium } from './lib/prereqs.mjs';
import { say, fail } from './lib/log.mjs';

const args = process.argv.slice(2);
const only = args.find((a) => ['unit', 'e2e'].includes(a)); // `npm test -- unit` or `-- e2e`
const filters = args.filter((a) => a !== only);
const t0 = Date.now();
const dataDir = path.join(root, '.data', `test-${process.pid}`);
const summaries = [];
let stack;
let app;
let exitCode = 1;

async function cleanup() {
  if (app) await stopChild(app);
  if (stack) await stack.stop();
  fs.rmSync(dataDir, { recursive: true, force: true });
}
process.on('SIGINT', async () => { await cleanup(); process.exit(130); });
process.on('SIGTERM', async () => { await cleanup(); process.exit(143); });

function vitest(config, env, label) {
  const report = path.join(dataDir, `${label}-report.json`);
  say(`Running ${label} tests (vitest)`);
  const r = spawnSync(process.execPath, [path.join(root, 'node_modules', 'vitest', 'vitest.mjs'), 'run', '--config', config, '--reporter=default', '--reporter=json', `--outputFile.json=${report}`, ...(filters.length ? ['--passWithNoTests'] : []), ...filters], { cwd: root, stdio: 'inherit', env: { ...process.env, ...env } });
  let passed = 0, failed = 0, skipped = 0;
  if (fs.existsSync(report)) {
    const j = JSON.parse(fs.readFileSync(report, 'utf8'));
    passed = j.numPassedTests; failed = j.numFailedTests; skipped = j.numPendingTests + (j.numTodoTests ?? 0);
  } else if (r.status !== 0) failed = 1;
  summaries.push({ label, passed, failed, skipped, ok: r.status === 0 });
  return r.status === 0;
}

try {
  const ports = { pg: await freePort(), s3: await freePort(), smtp: await freePort(), mailWeb: await freePort() };
  const appPort = await freePort();
  const appUrl = `http://127.0.0.1:${appPort}`;
  stack = await startStack({ dataDir, ports, database: 'torquetrail_e2e', appOrigins: [appUrl, `http://localhost:${appPort}`] });
  stack.cluster.ensureDatabase('torquetrail_it');
  const itEnv = { ...stack.env, DATABASE_URL: stack.cluster.url('torquetrail_it'), TT_TEST_ADMIN_URL: stack.cluster.url('postgres'), NODE_ENV: 'test' };
  let ok = true;
  if (only !== 'e2e') ok = vitest('vitest.config.ts', itEnv, 'unit+integration') && ok;
  if (only !== 'unit') {
    const chromium = ensureChromium();
    migrateAndSeed(stack.env);
    const outDir = path.join(dataDir, 'dist');
    buildIfStale(outDir);
    say(`Starting the built app on ${appUrl}`);
    app = await startApp({ ...stack.env, SIGNIN_RATE_LIMIT: '1000' }, { host: '127.0.0.1', port: appPort, silent: !process.env.TT_APP_LOG, outDir });
    ok = vitest('vitest.e2e.config.ts', { ...stack.env, APP_URL: appUrl, CHROMIUM_PATH: chromium, MAIL_API: stack.env.MAIL_INBOX_URL, TT_DATA_DIR: dataDir }, 'browser') && ok;
  }
  exitCode = ok ? 0 : 1;
} catch (e) {
  fail(e instanceof Error ? e.stack ?? e.message : String(e));
  exitCode = 1;
} finally {
  await cleanup();
  const total = summaries.reduce((a, s) => ({ passed: a.passed + s.passed, failed: a.failed + s.failed, skipped: a.skipped + s.skipped }), { passed: 0, failed: 0, skipped: 0 });
  console.log('\nSummary');
  for (const s of summaries) console.log(`  ${s.label.padEnd(18)} ${s.passed} passed, ${s.failed} failed, ${s.skipped} skipped${s.ok ? '' : '  ← FAILED'}`);
  console.log(`  wall time ${((Date.now() - t0) / 1000).toFixed(1)} s`);
  if (exitCode !== 0 && total.failed === 0) total.failed = 1;
  console.log(`\ntests: ${total.passed} passed, ${total.failed} failed, ${total.skipped} skipped`);
  process.exit(exitCode);
}
