/** Reads the mail catcher's inbox over its HTTP API (maildev 3: /api/email, /api/email/:id). */
const MAIL_API = process.env.MAIL_API ?? 'http://127.0.0.1:1080';

export type CaughtMail = { id: string; subject: string; text: string; html?: string; to: Array<{ address: string }>; attachments?: Array<{ fileName: string; contentType: string; generatedFileName: string }> };

export async function listMail(): Promise<CaughtMail[]> {
  const res = await fetch(`${MAIL_API}/api/email`);
  if (!res.ok) throw new Error(`inbox answered ${res.status}`);
  return (await res.json()) as CaughtMail[];
}

/** Waits (polling, bounded) for a message to the address whose subject matches. */
export async function waitForMail(to: string, subject: RegExp, timeoutMs = 20_000): Promise<CaughtMail> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const found = (await listMail()).filter((m) => m.to.some((t) => t.address.toLowerCase() === to.toLowerCase()) && subject.test(m.subject));
    if (found.length) return found[found.length - 1]!;
    if (Date.now() > deadline) throw new Error(`No mail to ${to} matching ${subject} within ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 200));
  }
}

/** The first link in a message's text that starts with the given prefix (text is already decoded by the catcher). */
export function linkIn(mail: CaughtMail, prefix: string): string {
  const m = mail.text.match(new RegExp(`${prefix.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}\\S+`));
  if (!m) throw new Error(`No link starting ${prefix} in: ${mail.text}`);
  return m[0];
}

export async function attachment(mail: CaughtMail, generatedFileName: string): Promise<Buffer> {
  const res = await fetch(`${MAIL_API}/api/email/${mail.id}/attachment/${encodeURIComponent(generatedFileName)}`);
  if (!res.ok) throw new Error(`attachment answered ${res.status}`);
  return Buffer.from(await res.arrayBuffer());
}
