/**
 * The Content-Security-Policy of server-rendered pages (set by src/middleware.ts).
 *
 * Scripts: our own files ('self') and, inline, only the scripts Astro itself writes into pages
 * to hydrate islands (the island loader and the client:* directive loaders), allowed by their
 * sha256 hashes. Those hashes come from Astro's own prebuilt sources, never from the page being
 * served, so a script that found its way into a page through data is not allowed.
 * Styles: 'unsafe-inline', because server-rendered `style="…"` attributes (React, Astro's island
 * styles) are inline styles; a style cannot run code.
 */
import { createHash } from 'node:crypto';
import islandScript from 'astro/runtime/server/astro-island.prebuilt.js';
import idle from 'astro/runtime/client/idle.prebuilt.js';
import load from 'astro/runtime/client/load.prebuilt.js';
import media from 'astro/runtime/client/media.prebuilt.js';
import only from 'astro/runtime/client/only.prebuilt.js';
import visible from 'astro/runtime/client/visible.prebuilt.js';

const sha256 = (s: string) => `'sha256-${createHash('sha256').update(s, 'utf8').digest('base64')}'`;

/** Hashes of the inline scripts Astro renders into production pages. */
export const ASTRO_INLINE_SCRIPT_HASHES: readonly string[] = [islandScript, idle, load, media, only, visible].map(sha256);

/** The policy, with extra origins (the object store) allowed for images and uploads. */
export function contentSecurityPolicy(extraOrigins: string[] = []): string {
  const extra = extraOrigins.join(' ');
  return [
    "default-src 'self'",
    `script-src 'self' ${ASTRO_INLINE_SCRIPT_HASHES.join(' ')}`,
    "style-src 'self' 'unsafe-inline'",
    `img-src 'self' data: blob: ${extra}`.trim(),
    `connect-src 'self' ${extra}`.trim(),
    "font-src 'self' data:",
    "object-src 'none'",
    "base-uri 'self'",
    "form-action 'self'",
    "frame-ancestors 'none'",
  ].join('; ');
}

/** Hash of one inline script, for tests comparing a page's scripts with the policy. */
export const scriptHash = sha256;
