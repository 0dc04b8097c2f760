/**
 * Route discovery from the file system: every module under src/pages/api, its URL pattern and
 * the HTTP methods it exports. Used by the access matrix and the fuzz tests (which import the
 * modules) and by the browser security test (which only needs paths and methods), so a route
 * added tomorrow is covered without touching those tests.
 */
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

export const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..', '..');
export const API_DIR = path.join(ROOT, 'src', 'pages', 'api');
export const METHODS = ['GET', 'POST', 'PUT', 'PATCH', 'DELETE', 'ALL'] as const;
export type Method = (typeof METHODS)[number];
export const STATE_CHANGING: ReadonlySet<string> = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);

export type DiscoveredRoute = {
  /** e.g. `/api/jobs/[id]/runs` */
  pattern: string;
  /** absolute path of the module */
  file: string;
  /** methods the module exports, in METHODS order */
  methods: Method[];
  /** dynamic segments in order, e.g. ['id', 'linkId'] */
  params: string[];
};

/** Public API routes: no session needed (the middleware lets them through). */
export const PUBLIC_PATTERNS = [/^\/api\/health$/, /^\/api\/auth\//, /^\/api\/share\//];
export const isPublicPattern = (pattern: string) => PUBLIC_PATTERNS.some((re) => re.test(pattern));

function walk(dir: string): string[] {
  const out: string[] = [];
  for (const e of fs.readdirSync(dir, { withFileTypes: true })) {
    const p = path.join(dir, e.name);
    if (e.isDirectory()) out.push(...walk(p));
    else if (/\.(ts|js|mjs)$/.test(e.name) && !/\.(test|spec)\.(ts|js)$/.test(e.name) && !e.name.endsWith('.d.ts')) out.push(p);
  }
  return out;
}

/** `src/pages/api/jobs/[id]/index.ts` → `/api/jobs/[id]`; `labels.pdf.ts` keeps `.pdf`. */
export function patternOf(file: string): string {
  const rel = path.relative(path.join(ROOT, 'src', 'pages'), file).split(path.sep).join('/');
  const noExt = rel.replace(/\.(ts|js|mjs)$/, '');
  return '/' + noExt.replace(/\/index$/, '');
}

/** Methods a module exports, read from its source (no import, so it also works outside vite). */
export function exportedMethods(source: string): Method[] {
  return METHODS.filter((m) => new RegExp(`export\\s+(const|async\\s+function|function)\\s+${m}\\b`).test(source));
}

export function discoverRoutes(): DiscoveredRoute[] {
  return walk(API_DIR)
    .map((file) => {
      const pattern = patternOf(file);
      return { pattern, file, methods: exportedMethods(fs.readFileSync(file, 'utf8')), params: [...pattern.matchAll(/\[(?:\.\.\.)?(\w+)\]/g)].map((m) => m[1]!) };
    })
    .filter((r) => r.methods.length > 0)
    .sort((a, b) => a.pattern.localeCompare(b.pattern));
}

/** Fills a pattern's dynamic segments: `/api/jobs/[id]` + {id: 'x'} → `/api/jobs/x`. */
export function fillPattern(pattern: string, params: Record<string, string>): string {
  return pattern.replace(/\[(\.\.\.)?(\w+)\]/g, (_, rest: string | undefined, k: string) => {
    const v = params[k] ?? 'missing';
    return rest ? v.split('/').map(encodeURIComponent).join('/') : encodeURIComponent(v);
  });
}

/** Imports a discovered route module (through vite under vitest) and returns its handlers. */
export async function loadRoute(r: DiscoveredRoute): Promise<Record<string, unknown>> {
  return (await import(/* @vite-ignore */ r.file)) as Record<string, unknown>;
}
