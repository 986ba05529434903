import type { QueryInterface } from 'sequelize';

// Sheet preferences that are not calculation (CONTRACT §6b): how many significant figures the sheet
// shows and whether its SI column is folded. Kept beside the sheet, outside its document, so they
// never change the document's hash. One row per sheet at most; no row means the defaults.
export async function up({ context }: { context: QueryInterface }): Promise<void> {
  await context.sequelize.query(`
    CREATE TABLE sheet_preferences (
      sheet_id uuid PRIMARY KEY REFERENCES sheets(id) ON DELETE CASCADE,
      significant_figures smallint NOT NULL DEFAULT 4 CHECK (significant_figures BETWEEN 2 AND 12),
      si_folded boolean NOT NULL DEFAULT false,
      updated_by uuid REFERENCES users(id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    )`);
}

export async function down({ context }: { context: QueryInterface }): Promise<void> {
  await context.sequelize.query('DROP TABLE IF EXISTS sheet_preferences');
}
