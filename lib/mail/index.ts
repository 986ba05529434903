import 'server-only';
import nodemailer, { type Transporter } from 'nodemailer';
import type { MailMessage } from './messages';
import { queueMail } from './outbox';

// The one mailer. The only switch: SMTP_URL (production relay) when set, else the local SMTP fake
// (scripts/mail-fake.mts) on 127.0.0.1:$DENUDATA_SMTP_PORT, which keeps every message as an .eml file.
//
// Every message goes through the outbox (lib/mail/outbox.ts): a request only stores it and queues a job,
// and the job sends it with retries, so no request waits on the SMTP server. The user's action is
// committed first and never undone because a message could not be queued; that failure is logged
// (never shown as a stack trace) and reported back as `delivered: false`, so routes can tell the user
// (an invitation answers with the link to pass on by hand instead).

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

/**
 * Hands one message to the SMTP server now. Throws when the server does not take it: only the
 * outbox job calls this (lib/jobs/workers.ts), and pg-boss retries it with backoff.
 */
export async function deliverMail(message: MailMessage): Promise<void> {
  await transporter().sendMail({ from: FROM, to: message.to, subject: message.subject, text: message.text });
}

/**
 * Queues one message in the outbox (lib/mail/outbox.ts); `delivered` is true once it is stored and
 * queued for sending with retries. Never throws: a message that could not even be queued is logged.
 */
export async function sendMail(message: MailMessage): Promise<Delivery> {
  return sendMails([message]);
}

/** Queues several messages; delivered only when every one was queued. */
export async function sendMails(messages: MailMessage[]): Promise<Delivery> {
  if (messages.length === 0) return { delivered: true };
  try {
    await queueMail(messages);
    return { delivered: true };
  } catch (error) {
    console.error('[denudata] mail not queued:', messages.map((m) => m.subject).join(', '), '·', error instanceof Error ? error.message : 'unknown error');
    return { delivered: false };
  }
}
