import type { QueryInterface } from 'sequelize';

// Every e-mail goes through this outbox: written in the request (or job) that causes it, sent by a
// job with retries, so no request waits on an SMTP server and no message is lost when one is down.
export async function up({ context }: { context: QueryInterface }): Promise<void> {
  await context.sequelize.query(`
    CREATE TABLE mail_outbox (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      recipient text NOT NULL CHECK (char_length(recipient) BETWEEN 3 AND 320),
      subject text NOT NULL CHECK (char_length(subject) <= 500),
      body text NOT NULL CHECK (char_length(body) <= 20000),
      status text NOT NULL DEFAULT 'queued' CHECK (status IN ('queued', 'sent', 'failed')),
      attempts integer NOT NULL DEFAULT 0 CHECK (attempts >= 0),
      last_error text CHECK (char_length(last_error) <= 500),
      created_at timestamptz NOT NULL DEFAULT now(),
      sent_at timestamptz
    );
    CREATE INDEX mail_outbox_status_idx ON mail_outbox (status, created_at);
  `);
}

export async function down({ context }: { context: QueryInterface }): Promise<void> {
  await context.sequelize.query('DROP TABLE IF EXISTS mail_outbox');
}
