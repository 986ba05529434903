import type { QueryInterface } from 'sequelize';

// The first schema of Denudata. Append-only: later changes get migrations of their own.
export async function up({ context }: { context: QueryInterface }): Promise<void> {
  await context.sequelize.query(`
    CREATE EXTENSION IF NOT EXISTS pgcrypto;

    CREATE TYPE team_role AS ENUM ('owner', 'editor', 'reviewer', 'viewer');
    CREATE TYPE review_status AS ENUM ('unsigned', 'in_review', 'checked', 'approved', 'returned');

    CREATE TABLE teams (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      name text NOT NULL CHECK (char_length(name) BETWEEN 1 AND 120),
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );

    CREATE TABLE users (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      email text NOT NULL CHECK (email = lower(email) AND position('@' in email) > 1),
      name text NOT NULL CHECK (char_length(name) BETWEEN 1 AND 120),
      password_hash text NOT NULL,
      current_team_id uuid REFERENCES teams(id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE UNIQUE INDEX users_email_key ON users (email);

    CREATE TABLE memberships (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      team_id uuid NOT NULL REFERENCES teams(id) ON DELETE CASCADE,
      user_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
      role team_role NOT NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT memberships_team_user_key UNIQUE (team_id, user_id)
    );
    CREATE INDEX memberships_user_idx ON memberships (user_id);

    CREATE TABLE sheets (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      team_id uuid NOT NULL REFERENCES teams(id) ON DELETE CASCADE,
      title text NOT NULL CHECK (char_length(title) BETWEEN 1 AND 200),
      site_name text CHECK (site_name IS NULL OR char_length(site_name) BETWEEN 1 AND 200),
      site_latitude double precision CHECK (site_latitude BETWEEN -90 AND 90),
      site_longitude double precision CHECK (site_longitude BETWEEN -180 AND 180),
      site_notes text,
      draft_document jsonb NOT NULL,
      draft_version integer NOT NULL DEFAULT 1 CHECK (draft_version >= 1),
      head_revision integer NOT NULL DEFAULT 0 CHECK (head_revision >= 0),
      created_by uuid NOT NULL REFERENCES users(id) ON DELETE RESTRICT,
      updated_by uuid REFERENCES users(id) ON DELETE SET NULL,
      forked_from_sheet_id uuid REFERENCES sheets(id) ON DELETE SET NULL,
      forked_from_revision integer,
      archived_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX sheets_team_updated_idx ON sheets (team_id, updated_at DESC) WHERE archived_at IS NULL;
    CREATE INDEX sheets_forked_from_idx ON sheets (forked_from_sheet_id);

    CREATE TABLE sheet_revisions (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      sheet_id uuid NOT NULL REFERENCES sheets(id) ON DELETE RESTRICT,
      number integer NOT NULL CHECK (number >= 1),
      document jsonb NOT NULL,
      hash char(64) NOT NULL CHECK (hash ~ '^[0-9a-f]{64}$'),
      engine_version text NOT NULL,
      results jsonb NOT NULL,
      author_id uuid NOT NULL REFERENCES users(id) ON DELETE RESTRICT,
      message text NOT NULL DEFAULT '' CHECK (char_length(message) <= 2000),
      review_status review_status NOT NULL DEFAULT 'unsigned',
      review_requested_by uuid REFERENCES users(id) ON DELETE SET NULL,
      review_requested_at timestamptz,
      reviewer_id uuid REFERENCES users(id) ON DELETE SET NULL,
      checked_by uuid REFERENCES users(id) ON DELETE SET NULL,
      checked_at timestamptz,
      approved_by uuid REFERENCES users(id) ON DELETE SET NULL,
      approved_at timestamptz,
      returned_by uuid REFERENCES users(id) ON DELETE SET NULL,
      returned_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT sheet_revisions_sheet_number_key UNIQUE (sheet_id, number)
    );
    CREATE INDEX sheet_revisions_review_idx ON sheet_revisions (review_status);

    -- A saved revision is a record: its content never changes, only its review state.
    CREATE FUNCTION sheet_revisions_immutable() RETURNS trigger LANGUAGE plpgsql AS $$
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
    CREATE TRIGGER sheet_revisions_immutable BEFORE UPDATE ON sheet_revisions
      FOR EACH ROW EXECUTE FUNCTION sheet_revisions_immutable();

    CREATE TABLE comments (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      sheet_id uuid NOT NULL REFERENCES sheets(id) ON DELETE CASCADE,
      block_id text NOT NULL CHECK (char_length(block_id) BETWEEN 1 AND 64),
      revision integer NOT NULL CHECK (revision >= 0),
      parent_id uuid REFERENCES comments(id) ON DELETE CASCADE,
      author_id uuid NOT NULL REFERENCES users(id) ON DELETE RESTRICT,
      body text NOT NULL CHECK (char_length(body) BETWEEN 1 AND 10000),
      resolved_at timestamptz,
      resolved_by uuid REFERENCES users(id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX comments_sheet_block_idx ON comments (sheet_id, block_id, created_at);
    CREATE INDEX comments_parent_idx ON comments (parent_id);

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

    CREATE TABLE invitations (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      team_id uuid NOT NULL REFERENCES teams(id) ON DELETE CASCADE,
      email text NOT NULL CHECK (email = lower(email)),
      role team_role NOT NULL,
      token_hash char(64) NOT NULL,
      invited_by uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
      expires_at timestamptz NOT NULL,
      accepted_at timestamptz,
      accepted_by uuid REFERENCES users(id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE UNIQUE INDEX invitations_token_key ON invitations (token_hash);
    CREATE INDEX invitations_team_idx ON invitations (team_id);

    CREATE TABLE password_resets (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      user_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
      token_hash char(64) NOT NULL,
      expires_at timestamptz NOT NULL,
      used_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE UNIQUE INDEX password_resets_token_key ON password_resets (token_hash);

    CREATE TABLE quick_calculations (
      id bigserial PRIMARY KEY,
      user_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
      expression text NOT NULL CHECK (char_length(expression) BETWEEN 1 AND 2000),
      result jsonb NOT NULL,
      created_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX quick_calculations_user_idx ON quick_calculations (user_id, created_at DESC);

    CREATE TABLE audit_log (
      id bigserial PRIMARY KEY,
      team_id uuid REFERENCES teams(id) ON DELETE CASCADE,
      actor_id uuid REFERENCES users(id) ON DELETE SET NULL,
      action text NOT NULL,
      subject_type text NOT NULL,
      subject_id text,
      details jsonb NOT NULL DEFAULT '{}'::jsonb,
      created_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX audit_log_team_idx ON audit_log (team_id, created_at DESC);
  `);
}

export async function down({ context }: { context: QueryInterface }): Promise<void> {
  await context.sequelize.query(`
    DROP TABLE IF EXISTS audit_log, quick_calculations, password_resets, invitations, datasets,
      comments, sheet_revisions, sheets, memberships, users, teams CASCADE;
    DROP FUNCTION IF EXISTS sheet_revisions_immutable();
    DROP TYPE IF EXISTS review_status;
    DROP TYPE IF EXISTS team_role;
  `);
}
