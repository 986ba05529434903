import type { QueryInterface } from 'sequelize';

// A revision over the synchronous cost limit is saved at once with its document and hash, and its results
// are stored when its long run finishes (CONTRACT §6b). So `results` may be NULL, and the immutability
// trigger lets it change once, from NULL to the run's results; everything else stays immutable.
// Runs also say whether their results may be reused by document hash (every dataset resolved).
export async function up({ context }: { context: QueryInterface }): Promise<void> {
  await context.sequelize.query(`
    ALTER TABLE sheet_revisions ALTER COLUMN results DROP NOT NULL;
    CREATE OR REPLACE FUNCTION sheet_revisions_immutable() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      IF NEW.document IS DISTINCT FROM OLD.document OR NEW.hash IS DISTINCT FROM OLD.hash
         OR (NEW.results IS DISTINCT FROM OLD.results AND NOT (OLD.results IS NULL AND NEW.results IS NOT NULL))
         OR NEW.number IS DISTINCT FROM OLD.number
         OR NEW.sheet_id IS DISTINCT FROM OLD.sheet_id OR NEW.author_id IS DISTINCT FROM OLD.author_id
         OR NEW.engine_version IS DISTINCT FROM OLD.engine_version OR NEW.message IS DISTINCT FROM OLD.message
         OR NEW.created_at IS DISTINCT FROM OLD.created_at THEN
        RAISE EXCEPTION 'sheet revisions are immutable';
      END IF;
      RETURN NEW;
    END $$;
    CREATE INDEX runs_revision_idx ON runs (sheet_id, revision_number, created_at DESC) WHERE revision_number IS NOT NULL;
    -- A run that could not resolve every dataset its document refers to (block errors) is not reused from
    -- the cache once the team holds them.
    ALTER TABLE runs ADD COLUMN cacheable boolean NOT NULL DEFAULT true;
  `);
}

export async function down({ context }: { context: QueryInterface }): Promise<void> {
  await context.sequelize.query(`
    ALTER TABLE runs DROP COLUMN IF EXISTS cacheable;
    DROP INDEX IF EXISTS runs_revision_idx;
    CREATE OR REPLACE FUNCTION sheet_revisions_immutable() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      IF NEW.document IS DISTINCT FROM OLD.document OR NEW.hash IS DISTINCT FROM OLD.hash
         OR NEW.results IS DISTINCT FROM OLD.results OR NEW.number IS DISTINCT FROM OLD.number
         OR NEW.sheet_id IS DISTINCT FROM OLD.sheet_id OR NEW.author_id IS DISTINCT FROM OLD.author_id
         OR NEW.engine_version IS DISTINCT FROM OLD.engine_version OR NEW.message IS DISTINCT FROM OLD.message
         OR NEW.created_at IS DISTINCT FROM OLD.created_at THEN
        RAISE EXCEPTION 'sheet revisions are immutable';
      END IF;
      RETURN NEW;
    END $$;
    ALTER TABLE sheet_revisions ALTER COLUMN results SET NOT NULL;
  `);
}
