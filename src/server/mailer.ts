/** Outgoing mail through nodemailer; SMTP_URL points at the local catcher or a real service. */
import nodemailer, { type Transporter } from 'nodemailer';
import { config } from './config';

let transport: Transporter | undefined;

export function mailer(): Transporter {
  transport ??= nodemailer.createTransport(config().SMTP_URL);
  return transport;
}

export type OutgoingMail = {
  to: string;
  subject: string;
  text: string;
  html?: string;
  attachments?: Array<{ filename: string; content: Buffer; contentType?: string }>;
};

/** Sends one message; rejects when the SMTP server refuses it. */
export async function sendMail(mail: OutgoingMail): Promise<void> {
  await mailer().sendMail({ from: config().MAIL_FROM, ...mail });
}
