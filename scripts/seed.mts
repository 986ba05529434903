// Seeds the invented demo scenario (idempotent). Run after migrations.
import { seedDemo } from '../lib/db/seed';
import { closeSequelize } from '../lib/db/sequelize';

const { users, sheets } = await seedDemo();
console.log(`seed: demo team with ${users} accounts and ${sheets} sheets is in place`);
await closeSequelize();
