import { Sequelize } from 'sequelize';
import { migrate } from '../../../db/migrate.mjs';
import { type DatabaseConfig, loadConfig } from '../../src/config/app-config.js';

export interface TestDatabase {
  config: DatabaseConfig;
  /** A plain connection to the test database, for arranging and checking rows. */
  sequelize: Sequelize;
  drop(): Promise<void>;
}

function connect(db: DatabaseConfig, database?: string): Sequelize {
  return new Sequelize({
    dialect: 'mariadb',
    host: db.host,
    port: db.port,
    database,
    username: db.user,
    password: db.password,
    logging: false,
    dialectOptions: { connectTimeout: db.connectTimeoutMs },
  });
}

let counter = 0;

/**
 * Create a fresh database on the private MariaDB (named <app db>_test_<pid>_<n>, which the app user
 * may create), optionally apply the migrations, and return a handle that drops it again.
 * The server under test is then pointed at it. Needs `npm run db:start` (npm test does it).
 */
export async function createTestDatabase(opts: { migrated?: boolean } = {}): Promise<TestDatabase> {
  const base = loadConfig().db;
  const name = `${base.name}_test_${process.pid}_${++counter}`;
  const admin = connect(base);
  try {
    await admin.authenticate();
  } catch (err) {
    throw new Error(
      `cannot reach the private MariaDB at ${base.host}:${base.port} (${(err as Error).message}); run \`npm run db:start\` first`,
      { cause: err },
    );
  }
  await admin.query(`CREATE DATABASE \`${name}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
  await admin.close();
  const sequelize = connect(base, name);
  if (opts.migrated ?? true) await migrate(sequelize);
  return {
    config: { ...base, name },
    sequelize,
    async drop() {
      await sequelize.query(`DROP DATABASE IF EXISTS \`${name}\``);
      await sequelize.close();
    },
  };
}
