// Reads the messages that the SMTP fake (scripts/mail-fake.mts) keeps as .eml files in DENUDATA_MAIL_DIR.
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';

export type CapturedMail = { file: string; to: string[]; subject: string; text: string };

const folder = () => path.resolve(process.env.DENUDATA_MAIL_DIR ?? '.denudata/mail');

function decodeWords(value: string): string {
  return value.replace(/=\?utf-8\?([bq])\?([^?]*)\?=/gi, (_, kind: string, data: string) =>
    kind.toLowerCase() === 'b'
      ? Buffer.from(data, 'base64').toString('utf8')
      : Buffer.from(data.replace(/_/g, ' ').replace(/=([0-9a-f]{2})/gi, (__, h: string) => String.fromCharCode(parseInt(h, 16))), 'latin1').toString('utf8'),
  );
}

function decodeBody(body: string, encoding: string | undefined): string {
  if (/quoted-printable/i.test(encoding ?? '')) {
    const bytes = body.replace(/=\r?\n/g, '').replace(/=([0-9A-F]{2})/gi, (_, h: string) => String.fromCharCode(parseInt(h, 16)));
    return Buffer.from(bytes, 'latin1').toString('utf8');
  }
  if (/base64/i.test(encoding ?? '')) return Buffer.from(body.replace(/\s+/g, ''), 'base64').toString('utf8');
  return body;
}

export function parseEml(file: string, raw: string): CapturedMail {
  const split = raw.search(/\r?\n\r?\n/);
  const head = raw.slice(0, split).replace(/\r?\n[ \t]+/g, ' ');
  const body = raw.slice(split).replace(/^\r?\n\r?\n/, '');
  const header = (name: string) => head.split(/\r?\n/).find((l) => l.toLowerCase().startsWith(`${name.toLowerCase()}:`))?.slice(name.length + 1).trim();
  return {
    file,
    to: (header('X-Denudata-Envelope-To') ?? '').split(',').map((s) => s.trim().toLowerCase()).filter(Boolean),
    subject: decodeWords(header('Subject') ?? ''),
    text: decodeBody(body, header('Content-Transfer-Encoding')).replace(/\r\n/g, '\n'),
  };
}

export function readMails(): CapturedMail[] {
  let names: string[] = [];
  try {
    names = readdirSync(folder()).filter((n) => n.endsWith('.eml')).sort();
  } catch {
    return [];
  }
  return names.map((n) => parseEml(n, readFileSync(path.join(folder(), n), 'utf8')));
}

/** Waits (up to 10 s) for a message to that address whose subject matches. */
export async function waitForMail(to: string, subject: RegExp): Promise<CapturedMail> {
  const deadline = Date.now() + 10_000;
  while (Date.now() < deadline) {
    const found = readMails().filter((m) => m.to.includes(to.toLowerCase()) && subject.test(m.subject));
    const last = found.at(-1);
    if (last) return last;
    await new Promise((r) => setTimeout(r, 150));
  }
  throw new Error(`no message to ${to} with a subject like ${subject} in ${folder()}`);
}

/** The first link in a message that starts with the given origin and path. */
export function linkIn(mail: CapturedMail, prefix: string): string {
  const match = mail.text.match(new RegExp(`${prefix.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}[^\\s>]*`));
  if (!match) throw new Error(`no link starting ${prefix} in: ${mail.text}`);
  return match[0];
}
