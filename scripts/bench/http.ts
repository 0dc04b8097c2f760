/** A tiny client for the bench: JSON requests to the running app with a session cookie. */
export const APP_URL = process.env.APP_URL ?? 'http://127.0.0.1:4321';

export async function signIn(email: string, password: string): Promise<string> {
  const res = await fetch(`${APP_URL}/api/auth/sign-in/email`, { method: 'POST', headers: { 'content-type': 'application/json', origin: APP_URL }, body: JSON.stringify({ email, password }) });
  if (!res.ok) throw new Error(`sign-in ${email}: ${res.status} ${await res.text()}`);
  return res.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
}

export async function api<T = any>(cookie: string, method: string, path: string, body?: unknown): Promise<{ status: number; body: T; headers: Headers }> {
  const res = await fetch(`${APP_URL}${path}`, { method, headers: { cookie, origin: APP_URL, ...(body !== undefined ? { 'content-type': 'application/json' } : {}) }, body: body === undefined ? undefined : JSON.stringify(body) });
  const text = await res.text();
  let parsed: unknown = text;
  try { parsed = JSON.parse(text); } catch { /* not JSON */ }
  return { status: res.status, body: parsed as T, headers: res.headers };
}

export async function ok<T = any>(cookie: string, method: string, path: string, body?: unknown): Promise<T> {
  const r = await api<T>(cookie, method, path, body);
  if (r.status >= 300) throw new Error(`${method} ${path} → ${r.status}: ${JSON.stringify(r.body).slice(0, 400)}`);
  return r.body;
}
