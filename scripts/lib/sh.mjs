// Small process helpers built on node builtins only: the bootstrap runs before `npm ci`.
import { spawn, spawnSync } from 'node:child_process';
import net from 'node:net';

/** Runs a command to completion, inheriting output; throws with the command line on failure. */
export function run(cmd, args, opts = {}) {
  const r = spawnSync(cmd, args, { stdio: opts.quiet ? 'pipe' : 'inherit', encoding: 'utf8', ...opts });
  if (r.status !== 0) {
    const out = opts.quiet ? `\n${r.stdout ?? ''}${r.stderr ?? ''}` : '';
    throw new Error(`"${cmd} ${args.join(' ')}" exited with ${r.status ?? r.signal}${out}`);
  }
  return r.stdout ?? '';
}

/** Whether a command exits 0 (output discarded). */
export const succeeds = (cmd, args, opts = {}) => spawnSync(cmd, args, { stdio: 'ignore', ...opts }).status === 0;

/** Starts a long-running child in its own process group so it can be stopped with everything it spawned. */
export function startChild(name, cmd, args, opts = {}) {
  const child = spawn(cmd, args, { stdio: ['ignore', 'pipe', 'pipe'], detached: true, ...opts });
  const prefix = `  ${name} | `;
  const pipe = (stream, out) => {
    let buf = '';
    stream.on('data', (d) => {
      buf += d;
      let i;
      while ((i = buf.indexOf('\n')) >= 0) {
        if (!opts.silent) out.write(prefix + buf.slice(0, i) + '\n');
        buf = buf.slice(i + 1);
      }
    });
  };
  pipe(child.stdout, process.stdout);
  pipe(child.stderr, process.stderr);
  child.name = name;
  return child;
}

/** Stops a child started by startChild: SIGTERM to its group, SIGKILL after a grace period. */
export function stopChild(child, graceMs = 5000) {
  return new Promise((resolve) => {
    if (child.exitCode !== null || child.signalCode !== null) return resolve();
    const timer = setTimeout(() => {
      try { process.kill(-child.pid, 'SIGKILL'); } catch {}
    }, graceMs);
    child.once('exit', () => { clearTimeout(timer); resolve(); });
    try { process.kill(-child.pid, 'SIGTERM'); } catch { clearTimeout(timer); resolve(); }
  });
}

/** Resolves once something accepts TCP connections on host:port, or rejects after timeoutMs. */
export async function waitForPort(port, host = '127.0.0.1', timeoutMs = 60_000, child) {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    if (child && child.exitCode !== null) throw new Error(`${child.name} exited with ${child.exitCode} before listening on ${port}`);
    const ok = await new Promise((res) => {
      const s = net.connect(port, host);
      s.once('connect', () => { s.destroy(); res(true); });
      s.once('error', () => res(false));
    });
    if (ok) return;
    if (Date.now() > deadline) throw new Error(`Nothing listens on ${host}:${port} after ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

/** A free TCP port on loopback, chosen by the kernel. */
export function freePort() {
  return new Promise((resolve, reject) => {
    const srv = net.createServer();
    srv.once('error', reject);
    srv.listen(0, '127.0.0.1', () => {
      const { port } = srv.address();
      srv.close(() => resolve(port));
    });
  });
}

/** Whether a port on loopback is free to bind. */
export function portIsFree(port) {
  return new Promise((resolve) => {
    const srv = net.createServer();
    srv.once('error', () => resolve(false));
    srv.listen(port, '127.0.0.1', () => srv.close(() => resolve(true)));
  });
}
