import 'server-only';
import { QueryTypes } from 'sequelize';
import { db } from '@/lib/db';
import { QUEUES, sendJob } from '@/lib/jobs/queue';
import type { MailMessage } from './messages';

/** One stored message of the outbox. */
export interface OutboxMessage extends MailMessage {
  id: string;
  status: 'queued' | 'sent' | 'failed';
  attempts: number;
}

const MAX_ERROR_LENGTH = 500;

/** Stores messages in the outbox and queues one send job each. */
export async function queueMail(messages: MailMessage[]): Promise<string[]> {
  const sequelize = db();
  const ids: string[] = [];
  for (const message of messages) {
    const [row] = await sequelize.query<{ id: string }>(
      'INSERT INTO mail_outbox (recipient, subject, body) VALUES (:to, :subject, :text) RETURNING id',
      { type: QueryTypes.SELECT, replacements: { to: message.to, subject: message.subject, text: message.text } },
    );
    ids.push(row!.id);
  }
  for (const id of ids) await sendJob(QUEUES.mailSend.name, { outboxId: id });
  return ids;
}

export async function getOutboxMessage({ id }: { id: string }): Promise<OutboxMessage | null> {
  const [row] = await db().query<{ id: string; recipient: string; subject: string; body: string; status: OutboxMessage['status']; attempts: number }>(
    'SELECT id, recipient, subject, body, status, attempts FROM mail_outbox WHERE id = :id',
    { type: QueryTypes.SELECT, replacements: { id } },
  );
  return row ? { id: row.id, to: row.recipient, subject: row.subject, text: row.body, status: row.status, attempts: row.attempts } : null;
}

export async function markOutboxSent({ id }: { id: string }): Promise<void> {
  await db().query(`UPDATE mail_outbox SET status = 'sent', sent_at = now(), attempts = attempts + 1, last_error = NULL WHERE id = :id`, {
    replacements: { id },
  });
}

export async function markOutboxAttemptFailed({ id, error, final }: { id: string; error: string; final: boolean }): Promise<void> {
  await db().query(
    `UPDATE mail_outbox SET attempts = attempts + 1, last_error = :error, status = CASE WHEN :final THEN 'failed' ELSE status END WHERE id = :id`,
    { replacements: { id, error: error.slice(0, MAX_ERROR_LENGTH), final } },
  );
}
