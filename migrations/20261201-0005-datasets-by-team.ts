import type { QueryInterface } from 'sequelize';

// Datasets as CONTRACT §7 describes them: immutable tables owned by a team and identified by the SHA-256 of
// their canonical form, unique per (team, sha256). The first schema's table (owned by a sheet, raw bytes only,
// no kind, name or canonical form) held no rows the product could have written: no upload route existed.
export async function up({ context }: { context: QueryInterface }): Promise<void> {
  await context.sequelize.query(`
    DROP TABLE IF EXISTS datasets;
    CREATE TABLE datasets (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      team_id uuid NOT NULL REFERENCES teams(id) ON DELETE CASCADE,
      sha256 char(64) NOT NULL CHECK (sha256 ~ '^[0-9a-f]{64}$'),
      kind text NOT NULL CHECK (kind IN ('slope_profile', 'long_profile')),
      name text NOT NULL CHECK (char_length(name) BETWEEN 1 AND 200),
      description text NOT NULL DEFAULT '' CHECK (char_length(description) <= 2000),
      columns jsonb NOT NULL,
      canonical text NOT NULL,
      canonical_bytes integer NOT NULL CHECK (canonical_bytes > 0),
      row_count integer NOT NULL CHECK (row_count BETWEEN 3 AND 20000),
      original bytea NOT NULL,
      original_sha256 char(64) NOT NULL CHECK (original_sha256 ~ '^[0-9a-f]{64}$'),
      original_filename text CHECK (original_filename IS NULL OR char_length(original_filename) <= 255),
      byte_size integer NOT NULL CHECK (byte_size BETWEEN 0 AND 2097152),
      created_by uuid REFERENCES users(id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE UNIQUE INDEX datasets_team_sha256_key ON datasets (team_id, sha256);
    CREATE INDEX datasets_team_created_idx ON datasets (team_id, created_at DESC);

    -- A dataset never changes (CONTRACT §7.5): a corrected survey is a new upload with a new hash.
    CREATE FUNCTION datasets_immutable() RETURNS trigger AS $$
    BEGIN
      RAISE EXCEPTION 'datasets are immutable';
    END;
    $$ LANGUAGE plpgsql;
    CREATE TRIGGER datasets_no_update BEFORE UPDATE ON datasets
      FOR EACH ROW EXECUTE FUNCTION datasets_immutable();
  `);
}

export async function down({ context }: { context: QueryInterface }): Promise<void> {
  await context.sequelize.query(`
    DROP TABLE IF EXISTS datasets;
    DROP FUNCTION IF EXISTS datasets_immutable();
    CREATE TABLE datasets (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      team_id uuid NOT NULL REFERENCES teams(id) ON DELETE CASCADE,
      sheet_id uuid REFERENCES sheets(id) ON DELETE SET NULL,
      filename text NOT NULL CHECK (char_length(filename) BETWEEN 1 AND 255),
      content_type text NOT NULL,
      size_bytes bigint NOT NULL CHECK (size_bytes >= 0),
      sha256 char(64) NOT NULL CHECK (sha256 ~ '^[0-9a-f]{64}$'),
      content bytea NOT NULL,
      uploaded_by uuid NOT NULL REFERENCES users(id) ON DELETE RESTRICT,
      created_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX datasets_team_idx ON datasets (team_id);
    CREATE INDEX datasets_sheet_idx ON datasets (sheet_id);
  `);
}
