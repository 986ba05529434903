import 'server-only';
import nodemailer, { type Transporter } from 'nodemailer';
import type { MailMessage } from './messages';

// The one mailer. The only switch: SMTP_URL (production relay) when set, else the local SMTP fake
// (scripts/mail-fake.mts) on 127.0.0.1:$DENUDATA_SMTP_PORT, which keeps every message as an .eml file.
//
// Failure policy: the user's action is committed first and never undone because a message could not be
// sent. A failed send is logged (never shown as a stack trace) and reported back as `delivered: false`,
// so routes can tell the user (an invitation answers with the link to pass on by hand instead).
// Password-reset requests answer 202 whatever happens, so they log only.

const FROM = 'Denudata <notifications@denudata.invalid>';

const globalForMail = globalThis as unknown as { denudataMailer?: Transporter };

function transporter(): Transporter {
  if (!globalForMail.denudataMailer) {
    globalForMail.denudataMailer = process.env.SMTP_URL
      ? nodemailer.createTransport(process.env.SMTP_URL)
      : nodemailer.createTransport({
          host: '127.0.0.1',
          port: Number(process.env.DENUDATA_SMTP_PORT ?? 2525),
          secure: false,
          ignoreTLS: true,
          connectionTimeout: 5_000,
          greetingTimeout: 5_000,
          socketTimeout: 10_000,
        });
  }
  return globalForMail.denudataMailer;
}

/** The public origin that links in messages point to. */
export function appOrigin(): string {
  return (process.env.NEXTAUTH_URL ?? 'http://127.0.0.1:3000').replace(/\/+$/, '');
}

/** An absolute link into the app, for messages. */
export function appLink(path: string): string {
  return `${appOrigin()}${path.startsWith('/') ? path : `/${path}`}`;
}

export type Delivery = { delivered: boolean };

/** Sends one message; true when the SMTP server took it. Never throws. */
export async function sendMail(message: MailMessage): Promise<Delivery> {
  try {
    await transporter().sendMail({ from: FROM, to: message.to, subject: message.subject, text: message.text });
    return { delivered: true };
  } catch (error) {
    console.error('[denudata] mail not sent:', message.subject, '→', message.to, '·', error instanceof Error ? error.message : 'unknown error');
    return { delivered: false };
  }
}

/** Sends several messages; delivered only when every one was. */
export async function sendMails(messages: MailMessage[]): Promise<Delivery> {
  const results = await Promise.all(messages.map(sendMail));
  return { delivered: results.every((r) => r.delivered) };
}
