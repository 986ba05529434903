import type { QueryInterface } from 'sequelize';

// A running run's instance writes its progress every half second; the time of the last write is its
// heartbeat. A run whose heartbeat stopped (the instance ended mid-run) is failed by the run sweeper,
// so the sheet does not show "Evaluating" for ever (lib/jobs/run-sweeper.ts).
export async function up({ context }: { context: QueryInterface }): Promise<void> {
  await context.sequelize.query(`
    ALTER TABLE runs ADD COLUMN heartbeat_at timestamptz;
    CREATE INDEX runs_active_idx ON runs (status, created_at) WHERE status IN ('queued', 'running');
  `);
}

export async function down({ context }: { context: QueryInterface }): Promise<void> {
  await context.sequelize.query(`
    DROP INDEX IF EXISTS runs_active_idx;
    ALTER TABLE runs DROP COLUMN IF EXISTS heartbeat_at;
  `);
}
