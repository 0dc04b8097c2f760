#!/usr/bin/env node
// `npm run bench`: the same bootstrap as `npm test` (throwaway data, free ports), the built app
// in bench mode (SQL statements counted per request), then scripts/bench/run.ts, which seeds a
// large shop and prints every figure beside a baseline measured in the same run.
import fs from 'node:fs';
import path from 'node:path';
import { spawnSync } from 'node:child_process';
import { startStack, migrateAndSeed, buildIfStale, startApp, root } from './lib/stack.mjs';
import { freePort, stopChild } from './lib/sh.mjs';
import { ensureChromium } from './lib/prereqs.mjs';
import { say, fail } from './lib/log.mjs';

const dataDir = path.join(root, '.data', `bench-${process.pid}`);
let stack;
let app;
let code = 1;
const cleanup = async () => {
  if (app) await stopChild(app);
  if (stack) await stack.stop();
  fs.rmSync(dataDir, { recursive: true, force: true });
};
process.on('SIGINT', async () => { await cleanup(); process.exit(130); });
process.on('SIGTERM', async () => { await cleanup(); process.exit(143); });

try {
  const ports = { pg: await freePort(), s3: await freePort(), smtp: await freePort(), mailWeb: await freePort() };
  const appPort = await freePort();
  const appUrl = `http://127.0.0.1:${appPort}`;
  stack = await startStack({ dataDir, ports, database: 'torquetrail_bench', appOrigins: [appUrl] });
  const chromium = ensureChromium();
  migrateAndSeed(stack.env);
  const outDir = path.join(dataDir, 'dist');
  buildIfStale(outDir);
  say(`Starting the built app in bench mode on ${appUrl}`);
  app = await startApp({ ...stack.env, TT_COUNT_SQL: '1', SIGNIN_RATE_LIMIT: '100000' }, { host: '127.0.0.1', port: appPort, silent: true, outDir });
  const r = spawnSync(process.execPath, ['--import', 'tsx', path.join(root, 'scripts', 'bench', 'run.ts'), ...process.argv.slice(2)], {
    cwd: root, stdio: 'inherit', env: { ...process.env, ...stack.env, APP_URL: appUrl, CHROMIUM_PATH: chromium, BENCH_DIST: outDir },
  });
  code = r.status ?? 1;
} catch (e) {
  fail(e instanceof Error ? e.stack ?? e.message : String(e));
} finally {
  await cleanup();
  process.exit(code);
}
