// Installs what the machine lacks: PostgreSQL server binaries, npm packages, Chromium.
import fs from 'node:fs';
import path from 'node:path';
import { run, succeeds } from './sh.mjs';
import { say } from './log.mjs';

const isRoot = () => typeof process.getuid === 'function' && process.getuid() === 0;
let aptUpdated = false;

function aptInstall(pkgs) {
  if (!isRoot()) throw new Error(`Missing ${pkgs.join(', ')}: install with "sudo apt-get install -y ${pkgs.join(' ')}" and run again.`);
  if (!aptUpdated) {
    say('apt-get update');
    run('apt-get', ['update', '-qq']);
    aptUpdated = true;
  }
  say(`apt-get install ${pkgs.join(' ')}`);
  run('apt-get', ['install', '-y', '-qq', ...pkgs], { env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' } });
}

/** The bin folder of the newest installed PostgreSQL server; installs Debian's package when none. */
export function ensurePostgres() {
  const find = () => {
    const root = '/usr/lib/postgresql';
    if (!fs.existsSync(root)) return null;
    const majors = fs.readdirSync(root).filter((d) => fs.existsSync(path.join(root, d, 'bin', 'initdb'))).sort((a, b) => Number(b) - Number(a));
    return majors.length ? path.join(root, majors[0], 'bin') : null;
  };
  let bin = find();
  if (!bin) {
    say('PostgreSQL server not found: installing Debian\'s postgresql package');
    aptInstall(['postgresql']);
    bin = find();
    if (!bin) throw new Error('PostgreSQL was installed but no initdb was found under /usr/lib/postgresql');
  }
  return bin;
}

/** Runs `npm ci` when node_modules is missing or older than the lockfile. */
export function ensureNodeModules(root) {
  const marker = path.join(root, 'node_modules', '.package-lock.json');
  const lock = path.join(root, 'package-lock.json');
  const stale = !fs.existsSync(marker) || fs.statSync(marker).mtimeMs < fs.statSync(lock).mtimeMs;
  if (!stale) return;
  // Only one install at a time: parallel `npm test` runs would otherwise both empty node_modules.
  const lockDir = path.join(root, '.data', 'npm-ci.lock');
  fs.mkdirSync(path.dirname(lockDir), { recursive: true });
  const deadline = Date.now() + 10 * 60_000;
  for (;;) {
    try { fs.mkdirSync(lockDir); break; } catch {
      if (Date.now() > deadline) throw new Error(`Another npm ci holds ${lockDir}; remove it if no install is running.`);
      Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0, 500);
    }
  }
  try {
    const stillStale = !fs.existsSync(marker) || fs.statSync(marker).mtimeMs < fs.statSync(lock).mtimeMs;
    if (!stillStale) return;
    say('Installing npm packages (npm ci)');
    run('npm', ['ci', '--no-audit', '--no-fund'], { cwd: root });
  } finally {
    fs.rmSync(lockDir, { recursive: true, force: true });
  }
}

/** Path to a Chromium for browser tests; installs Debian's chromium package when missing. */
export function ensureChromium() {
  const candidates = [process.env.CHROMIUM_PATH, '/usr/bin/chromium', '/usr/bin/chromium-browser'].filter(Boolean);
  const found = () => candidates.find((c) => fs.existsSync(c) && succeeds(c, ['--version']));
  let exe = found();
  if (!exe) {
    say('Chromium not found: installing Debian\'s chromium package');
    aptInstall(['chromium']);
    exe = found();
    if (!exe) throw new Error('chromium was installed but /usr/bin/chromium does not run');
  }
  return exe;
}
