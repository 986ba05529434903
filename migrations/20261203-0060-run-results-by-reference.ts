import type { QueryInterface } from 'sequelize';

// A run answered from the cache (the same document and engine evaluated before) refers to the run that holds
// the results instead of copying them (up to 16 MB each): repeated runs of one document no longer grow the table
// by a results document each. The reference is a plain column, not a foreign key, so that when the holder is
// deleted (a draft-only sheet deleted, an account deleted) this AFTER trigger can hand its results to the oldest
// run still referring to it and point the others at that one; a foreign key's ON DELETE would act first.
export async function up({ context }: { context: QueryInterface }): Promise<void> {
  await context.sequelize.query(`
    ALTER TABLE runs ADD COLUMN results_from uuid;
    ALTER TABLE runs ADD CONSTRAINT runs_results_held_once CHECK (results_from IS NULL OR results IS NULL);
    CREATE INDEX runs_results_from_idx ON runs (results_from) WHERE results_from IS NOT NULL;
    CREATE FUNCTION runs_hand_over_results() RETURNS trigger LANGUAGE plpgsql AS $$
    DECLARE
      heir uuid;
    BEGIN
      IF OLD.results IS NULL THEN
        RETURN NULL;
      END IF;
      SELECT id INTO heir FROM runs WHERE results_from = OLD.id ORDER BY created_at, id LIMIT 1;
      IF heir IS NOT NULL THEN
        UPDATE runs SET results_from = heir WHERE results_from = OLD.id AND id <> heir;
        UPDATE runs SET results_from = NULL, results = OLD.results WHERE id = heir;
      END IF;
      RETURN NULL;
    END $$;
    CREATE TRIGGER runs_hand_over_results AFTER DELETE ON runs FOR EACH ROW EXECUTE FUNCTION runs_hand_over_results();
  `);
}

export async function down({ context }: { context: QueryInterface }): Promise<void> {
  await context.sequelize.query(`
    DROP TRIGGER IF EXISTS runs_hand_over_results ON runs;
    DROP FUNCTION IF EXISTS runs_hand_over_results();
    UPDATE runs r SET results = h.results, results_from = NULL FROM runs h WHERE r.results_from = h.id;
    ALTER TABLE runs DROP CONSTRAINT IF EXISTS runs_results_held_once;
    ALTER TABLE runs DROP COLUMN IF EXISTS results_from;
  `);
}
