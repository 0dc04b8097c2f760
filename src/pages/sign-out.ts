import type { APIRoute } from 'astro';
import { auth } from '../server/auth';

/** Ends the session (a plain form POST, so it works without JavaScript) and returns to sign-in. */
export const POST: APIRoute = async (ctx) => {
  const res = await auth().api.signOut({ headers: ctx.request.headers, asResponse: true });
  const headers = new Headers({ location: '/sign-in?signedOut=1' });
  for (const c of res.headers.getSetCookie()) headers.append('set-cookie', c);
  return new Response(null, { status: 303, headers });
};
