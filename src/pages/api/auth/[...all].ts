import type { APIRoute } from 'astro';
import { auth } from '../../../server/auth';

/** better-auth's own endpoints: sign-in, sign-up, sessions, organizations, invitations, reset. */
export const ALL: APIRoute = (ctx) => auth().handler(ctx.request);
