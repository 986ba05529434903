import type { QueryInterface } from 'sequelize';

// Long evaluations run as jobs (CONTRACT §6b "Long runs"): one row per run, with its progress and,
// when done, its results. Results are found again by document hash and engine version.
export async function up({ context }: { context: QueryInterface }): Promise<void> {
  await context.sequelize.query(`
    CREATE TABLE runs (
      id uuid PRIMARY KEY,
      sheet_id uuid NOT NULL REFERENCES sheets(id) ON DELETE CASCADE,
      requester_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
      draft_version integer,
      revision_number integer,
      document jsonb NOT NULL,
      document_hash text NOT NULL CHECK (document_hash ~ '^[0-9a-f]{64}$'),
      engine_version text NOT NULL,
      status text NOT NULL DEFAULT 'queued' CHECK (status IN ('queued', 'running', 'done', 'failed', 'cancelled')),
      progress double precision NOT NULL DEFAULT 0 CHECK (progress >= 0 AND progress <= 1),
      error text,
      results jsonb,
      created_at timestamptz NOT NULL DEFAULT now(),
      started_at timestamptz,
      finished_at timestamptz,
      CHECK ((draft_version IS NULL) <> (revision_number IS NULL))
    )`);
  await context.sequelize.query('CREATE INDEX runs_sheet_idx ON runs (sheet_id, created_at DESC)');
  await context.sequelize.query("CREATE INDEX runs_cache_idx ON runs (document_hash, engine_version) WHERE status = 'done'");
}

export async function down({ context }: { context: QueryInterface }): Promise<void> {
  await context.sequelize.query('DROP TABLE IF EXISTS runs');
}
