/**
 * Server configuration from environment variables, validated once at start. The defaults are
 * those `npm start` uses on a developer machine; production sets them to a managed
 * PostgreSQL, any S3-compatible store and any SMTP service.
 */
import * as z from 'zod';

const bool = z
  .enum(['true', 'false', '1', '0'])
  .transform((v) => v === 'true' || v === '1');

const schema = z.object({
  DATABASE_URL: z.string().url().default('postgres://postgres@127.0.0.1:54329/torquetrail'),
  PUBLIC_URL: z.string().url().default('http://127.0.0.1:4321'),
  BETTER_AUTH_SECRET: z.string().min(32, 'BETTER_AUTH_SECRET must be at least 32 characters').default('dev-only-secret-change-me-in-production-0000'),
  S3_ENDPOINT: z.string().url().default('http://127.0.0.1:4569'),
  S3_REGION: z.string().default('us-east-1'),
  S3_BUCKET: z.string().min(3).default('torquetrail'),
  S3_ACCESS_KEY_ID: z.string().default('S3RVER'),
  S3_SECRET_ACCESS_KEY: z.string().default('S3RVER'),
  S3_FORCE_PATH_STYLE: bool.default(true),
  SMTP_URL: z.string().default('smtp://127.0.0.1:1025'),
  MAIL_FROM: z.string().default('Torquetrail <no-reply@torquetrail.test>'),
  MAIL_INBOX_URL: z.string().default('http://127.0.0.1:1080'),
  TRUSTED_ORIGINS: z.string().default(''),
  /** Sign-in attempts allowed per minute per client address. */
  SIGNIN_RATE_LIMIT: z.coerce.number().int().positive().default(10),
  NODE_ENV: z.string().default('development'),
});

export type Config = z.infer<typeof schema>;

let cached: Config | undefined;

/** The validated configuration; throws one readable error listing every bad variable. */
export function config(): Config {
  if (cached) return cached;
  const parsed = schema.safeParse(process.env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`).join('\n');
    throw new Error(`Invalid configuration:\n${lines}`);
  }
  cached = parsed.data;
  return cached;
}

/** Origins allowed to make state-changing requests: the public URL, loopback twins, and extras. */
export function trustedOrigins(c: Config = config()): string[] {
  const origin = new URL(c.PUBLIC_URL).origin;
  const twin = origin.includes('127.0.0.1') ? origin.replace('127.0.0.1', 'localhost') : origin.replace('localhost', '127.0.0.1');
  const extra = c.TRUSTED_ORIGINS.split(',').map((s) => s.trim()).filter(Boolean);
  return [...new Set([origin, twin, ...extra])];
}
