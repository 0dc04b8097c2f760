// A private PostgreSQL cluster in the project's data folder, on loopback only.
// initdb refuses to run as root, so as root every server command runs as the `postgres` user
// and the folders it writes belong to that user.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { run, succeeds } from './sh.mjs';
import { say } from './log.mjs';

const isRoot = () => process.getuid?.() === 0;

function ownedDir(dir, mode = 0o700) {
  fs.mkdirSync(dir, { recursive: true, mode });
  if (isRoot()) run('chown', ['postgres:postgres', dir]);
  fs.chmodSync(dir, mode);
}

function asPg(bin, args) {
  return isRoot() ? ['runuser', ['-u', 'postgres', '--', bin, ...args]] : [bin, args];
}

/** Creates (once) and starts the cluster; returns a handle with url() and stop(). */
export function startCluster({ bin, dataDir, port }) {
  const pgData = path.join(dataDir, 'pg');
  // The socket lives outside the project so long paths never exceed the 107-byte socket limit.
  const sockDir = path.join(os.tmpdir(), `torquetrail-pg-${port}`);
  const logFile = path.join(dataDir, 'pg-log', 'postgres.log');
  fs.mkdirSync(dataDir, { recursive: true });
  if (isRoot()) {
    // The postgres user must be able to walk down to the data folder.
    for (let d = path.resolve(dataDir); d !== '/'; d = path.dirname(d)) {
      const st = fs.statSync(d);
      if ((st.mode & 0o001) === 0) fs.chmodSync(d, st.mode | 0o001);
    }
  }
  ownedDir(sockDir, 0o700);
  ownedDir(path.dirname(logFile), 0o700);

  if (!fs.existsSync(path.join(pgData, 'PG_VERSION'))) {
    say(`Creating the PostgreSQL cluster in ${path.relative(process.cwd(), pgData) || pgData}`);
    ownedDir(pgData, 0o700);
    const [c, a] = asPg(path.join(bin, 'initdb'), ['-D', pgData, '-U', 'postgres', '--auth=trust', '-E', 'UTF8', '--locale=C.UTF-8']);
    run(c, a, { quiet: true });
  }
  const ctl = (args, quiet = true) => {
    const [c, a] = asPg(path.join(bin, 'pg_ctl'), ['-D', pgData, ...args]);
    return run(c, a, { quiet });
  };
  const isRunning = () => {
    const [c, a] = asPg(path.join(bin, 'pg_ctl'), ['-D', pgData, 'status']);
    return succeeds(c, a);
  };
  if (isRunning()) {
    say(`PostgreSQL already running for ${pgData}; reusing it`);
  } else {
    say(`Starting PostgreSQL on 127.0.0.1:${port}`);
    const opts = `-p ${port} -c listen_addresses=127.0.0.1 -k ${sockDir} -c fsync=${process.env.PG_FSYNC ?? 'on'} -c max_connections=200`;
    try {
      ctl(['-l', logFile, '-w', '-t', '60', '-o', opts, 'start']);
    } catch (e) {
      const tail = fs.existsSync(logFile) ? fs.readFileSync(logFile, 'utf8').split('\n').slice(-15).join('\n') : '';
      throw new Error(`PostgreSQL did not start: ${e.message}\n${tail}`);
    }
  }
  const psql = (sql, db = 'postgres') =>
    run(path.join(bin, 'psql'), ['-h', '127.0.0.1', '-p', String(port), '-U', 'postgres', '-d', db, '-v', 'ON_ERROR_STOP=1', '-tAc', sql], { quiet: true });
  return {
    port,
    url: (db) => `postgres://postgres@127.0.0.1:${port}/${db}`,
    ensureDatabase(db) {
      const exists = psql(`select 1 from pg_database where datname = '${db}'`).trim() === '1';
      if (!exists) psql(`create database "${db}"`);
    },
    dropDatabase(db) {
      psql(`drop database if exists "${db}" with (force)`);
    },
    stop() {
      if (!isRunning()) return;
      say('Stopping PostgreSQL');
      ctl(['-m', 'fast', '-w', 'stop']);
    },
    restart() {
      // With -l the new server logs to its file; without it, it would hold this process's output
      // pipe open and the synchronous pg_ctl call would never return.
      ctl(['-m', 'fast', '-w', '-l', logFile, 'restart']);
    },
  };
}
