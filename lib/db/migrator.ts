import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { SequelizeStorage, Umzug } from 'umzug';
import type { QueryInterface, Sequelize } from 'sequelize';

type MigrationFn = (params: { context: QueryInterface }) => Promise<void>;
type MigrationModule = { up?: MigrationFn; down?: MigrationFn; default?: { up: MigrationFn; down?: MigrationFn } };

/** The migrator that scripts and tests share: the .ts files in migrations/, in name order. */
export function createMigrator(sequelize: Sequelize) {
  const folder = path.resolve(process.cwd(), 'migrations');
  return new Umzug<QueryInterface>({
    migrations: {
      glob: ['*.ts', { cwd: folder }],
      resolve: ({ name, path: filePath }) => {
        const load = async (): Promise<MigrationModule> => import(pathToFileURL(filePath!).href);
        return {
          name,
          up: async ({ context }) => {
            const mod = await load();
            const up = mod.up ?? mod.default?.up;
            if (!up) throw new Error(`migration ${name} has no up()`);
            await up({ context });
          },
          down: async ({ context }) => {
            const mod = await load();
            const down = mod.down ?? mod.default?.down;
            if (down) await down({ context });
          },
        };
      },
    },
    context: sequelize.getQueryInterface(),
    storage: new SequelizeStorage({ sequelize, tableName: 'schema_migrations' }),
    logger: undefined,
  });
}
