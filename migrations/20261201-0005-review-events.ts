import type { QueryInterface } from 'sequelize';

// Review events: every review action (request, check, return, approve) with who, when and the note the
// person wrote, so the notes reach the sheet, its history and the report (not only the e-mail).
// Earlier actions are copied from the audit log, which held the same facts.
export async function up({ context }: { context: QueryInterface }): Promise<void> {
  await context.sequelize.query(`
    CREATE TABLE review_events (
      id bigserial PRIMARY KEY,
      sheet_id uuid NOT NULL REFERENCES sheets(id) ON DELETE CASCADE,
      revision integer NOT NULL CHECK (revision >= 1),
      action text NOT NULL CHECK (action IN ('request', 'check', 'return', 'approve')),
      actor_id uuid REFERENCES users(id) ON DELETE SET NULL,
      reviewer_id uuid REFERENCES users(id) ON DELETE SET NULL,
      message text NOT NULL DEFAULT '' CHECK (char_length(message) <= 2000),
      created_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX review_events_sheet_idx ON review_events (sheet_id, revision, created_at);

    INSERT INTO review_events (sheet_id, revision, action, actor_id, reviewer_id, message, created_at)
    SELECT (a.details->>'sheetId')::uuid, (a.details->>'revision')::integer, substring(a.action FROM 8), a.actor_id,
           CASE WHEN a.details ? 'reviewerId' THEN (a.details->>'reviewerId')::uuid END,
           left(coalesce(a.details->>'message', ''), 2000), a.created_at
      FROM audit_log a
     WHERE a.action IN ('review.request', 'review.check', 'review.return', 'review.approve')
       AND a.details ? 'sheetId' AND a.details ? 'revision'
       AND EXISTS (SELECT 1 FROM sheets s WHERE s.id = (a.details->>'sheetId')::uuid)
     ORDER BY a.id;
  `);
}

export async function down({ context }: { context: QueryInterface }): Promise<void> {
  await context.sequelize.query('DROP TABLE IF EXISTS review_events');
}
