import type { QueryInterface } from 'sequelize';

// When a user's password last changed: sessions signed in before it are no longer accepted.
export async function up({ context }: { context: QueryInterface }): Promise<void> {
  await context.sequelize.query('ALTER TABLE users ADD COLUMN password_changed_at timestamptz');
}

export async function down({ context }: { context: QueryInterface }): Promise<void> {
  await context.sequelize.query('ALTER TABLE users DROP COLUMN IF EXISTS password_changed_at');
}
