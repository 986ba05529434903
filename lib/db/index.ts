import 'server-only';
import { initModels } from '@/models';
import { getSequelize } from './sequelize';

/** The Sequelize instance with every model described on it. */
export function db() {
  const sequelize = getSequelize();
  initModels(sequelize);
  return sequelize;
}
