/** Tables that better-auth reads and writes; created by our migrations, skipped by MikroORM's diff. */
export const AUTH_TABLES = ['user', 'session', 'account', 'verification', 'organization', 'member', 'invitation'] as const;
