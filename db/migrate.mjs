// Schema changes, applied programmatically with umzug. Shared by the start/test scripts
// (through db/cli.mjs) and by the server's tests. Plain ESM so it runs without a build step.
//
// A migration is a file db/migrations/NNNN-kebab-name.mjs exporting
//   up({ queryInterface, Sequelize })  and  down({ queryInterface, Sequelize })
// Files run once each, in name order; the applied names are kept in the table `schema_migrations`.
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { Sequelize } from 'sequelize';
import { SequelizeStorage, Umzug } from 'umzug';

export const migrationsDir = path.join(path.dirname(fileURLToPath(import.meta.url)), 'migrations');
export const MIGRATION_TABLE = 'schema_migrations';

function migrationFiles() {
  return fs
    .readdirSync(migrationsDir)
    .filter((f) => /^\d{4}-[a-z0-9-]+\.mjs$/.test(f))
    .sort();
}

/**
 * @param {import('sequelize').Sequelize} sequelize a connected instance (any database)
 * @param {{ log?: (message: string) => void }} [opts]
 */
export function createMigrator(sequelize, opts = {}) {
  const context = { queryInterface: sequelize.getQueryInterface(), Sequelize };
  const log = opts.log ?? (() => {});
  return new Umzug({
    migrations: migrationFiles().map((file) => {
      const load = () => import(pathToFileURL(path.join(migrationsDir, file)).href);
      return {
        name: file.replace(/\.mjs$/, ''),
        up: async () => (await load()).up(context),
        down: async () => (await load()).down(context),
      };
    }),
    context,
    storage: new SequelizeStorage({ sequelize, tableName: MIGRATION_TABLE }),
    logger: {
      info: (event) => {
        if (event.event === 'migrated') log(`migrated ${event.name}`);
      },
      warn: (event) => log(`migration warning: ${JSON.stringify(event)}`),
      error: (event) => log(`migration error: ${JSON.stringify(event)}`),
      debug: () => {},
    },
  });
}

/** Apply every pending migration; resolves with the names applied now (empty when up to date). */
export async function migrate(sequelize, opts = {}) {
  const applied = await createMigrator(sequelize, opts).up();
  return applied.map((m) => m.name);
}
