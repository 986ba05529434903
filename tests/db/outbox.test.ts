import nodemailer from 'nodemailer';
import { QueryTypes } from 'sequelize';
import { afterAll, describe, expect, it } from 'vitest';
import { createUserWithTeam } from '@/lib/db/users';
import { closeSequelize, getSequelize } from '@/lib/db/sequelize';
import { jobQueue, QUEUES, stopJobQueue } from '@/lib/jobs/queue';
import { runMailSendJob, runPasswordResetJob } from '@/lib/jobs/workers';
import { sendMail } from '@/lib/mail';
import { getOutboxMessage } from '@/lib/mail/outbox';
import { waitForMail } from '../support/mail';

async function outboxIdsTo(recipient: string): Promise<string[]> {
  const rows = await getSequelize().query<{ id: string }>('SELECT id FROM mail_outbox WHERE recipient = :recipient ORDER BY created_at', {
    type: QueryTypes.SELECT,
    replacements: { recipient },
  });
  return rows.map((r) => r.id);
}

async function queuedJobs(queue: string, key: string, value: string): Promise<number> {
  const [row] = await getSequelize().query<{ n: string }>(`SELECT count(*) AS n FROM pgboss.job WHERE name = :queue AND data->>:key = :value`, {
    type: QueryTypes.SELECT,
    replacements: { queue, key, value },
  });
  return Number(row!.n);
}

describe('mail outbox and job queue', () => {
  afterAll(async () => {
    await stopJobQueue();
    await closeSequelize();
  });

  it('should store a message and queue its send job instead of sending it in the request', async () => {
    const to = `outbox-${Date.now()}@example.test`;
    expect(await sendMail({ to, subject: 'Outbox check', text: 'queued, not sent' })).toEqual({ delivered: true });
    const [id] = await outboxIdsTo(to);
    expect(await getOutboxMessage({ id: id! })).toMatchObject({ to, subject: 'Outbox check', status: 'queued', attempts: 0 });
    expect(await queuedJobs(QUEUES.mailSend.name, 'outboxId', id!)).toBe(1);
  });

  it('should send a queued message to the SMTP server and mark it sent, once', async () => {
    const to = `outbox-send-${Date.now()}@example.test`;
    await sendMail({ to, subject: 'Outbox delivery', text: 'hello from the outbox' });
    const [id] = await outboxIdsTo(to);
    await runMailSendJob({ outboxId: id! }, { final: false });
    const mail = await waitForMail(to, /^Outbox delivery$/);
    expect(mail.text).toContain('hello from the outbox');
    expect(await getOutboxMessage({ id: id! })).toMatchObject({ status: 'sent', attempts: 1 });
    // A second run of the same job (a retry after a crash) sends nothing again.
    await runMailSendJob({ outboxId: id! }, { final: false });
    expect(await getOutboxMessage({ id: id! })).toMatchObject({ status: 'sent', attempts: 1 });
  });

  it('should record a failed attempt and throw so the queue retries, and mark the last one failed', async () => {
    const to = `outbox-fail-${Date.now()}@example.test`;
    await sendMail({ to, subject: 'Outbox failure', text: 'the server is down' });
    const [id] = await outboxIdsTo(to);
    const holder = globalThis as unknown as { denudataMailer?: unknown };
    const working = holder.denudataMailer;
    // An SMTP server that is down: nothing listens on port 9 of the loopback address.
    holder.denudataMailer = nodemailer.createTransport({ host: '127.0.0.1', port: 9, connectionTimeout: 1000, ignoreTLS: true });
    try {
      await expect(runMailSendJob({ outboxId: id! }, { final: false })).rejects.toThrow();
      expect(await getOutboxMessage({ id: id! })).toMatchObject({ status: 'queued', attempts: 1 });
      await expect(runMailSendJob({ outboxId: id! }, { final: true })).rejects.toThrow();
      expect(await getOutboxMessage({ id: id! })).toMatchObject({ status: 'failed', attempts: 2 });
    } finally {
      holder.denudataMailer = working;
    }
  });

  it('should look the address up only in the password-reset job: a message for an account, nothing for an unknown address', async () => {
    const email = `reset-job-${Date.now()}@example.test`;
    await createUserWithTeam({ email, password: 'long-enough-password', name: 'Reset Job' });
    await runPasswordResetJob({ email });
    expect(await outboxIdsTo(email)).toHaveLength(1);
    const unknown = `nobody-${Date.now()}@example.test`;
    await runPasswordResetJob({ email: unknown });
    expect(await outboxIdsTo(unknown)).toHaveLength(0);
  });

  it('should declare every queue with retries in pg-boss', async () => {
    const boss = await jobQueue();
    for (const queue of Object.values(QUEUES)) {
      const stored = await boss.getQueue(queue.name);
      expect(stored).toMatchObject({ name: queue.name, retryLimit: queue.retryLimit });
    }
  });
});
