// Applies every pending migration to the database named by DATABASE_URL (or the default).
import { createMigrator } from '../lib/db/migrator';
import { closeSequelize, getSequelize } from '../lib/db/sequelize';

const migrator = createMigrator(getSequelize());
const applied = await migrator.up();
console.log(applied.length ? `migrate: applied ${applied.map((m) => m.name).join(', ')}` : 'migrate: up to date');
await closeSequelize();
