#!/usr/bin/env node
// `node db/cli.mjs migrate|seed|status` against the database named by PW_DB_* (see db/connection.mjs).
// Prints one JSON line on stdout so scripts can read the outcome.
import { connectFromEnv } from './connection.mjs';
import { createMigrator, migrate } from './migrate.mjs';
import { seedDemo } from './seeders/index.mjs';

const command = process.argv[2];
const commands = ['migrate', 'seed', 'status'];
if (!commands.includes(command)) {
  process.stderr.write(`usage: node db/cli.mjs ${commands.join('|')}\n`);
  process.exit(2);
}

const sequelize = connectFromEnv();
try {
  await sequelize.authenticate();
  let out;
  if (command === 'migrate') out = { applied: await migrate(sequelize, { log: (m) => process.stderr.write(`${m}\n`) }) };
  else if (command === 'seed') out = await seedDemo(sequelize);
  else {
    const migrator = createMigrator(sequelize);
    out = {
      executed: (await migrator.executed()).map((m) => m.name),
      pending: (await migrator.pending()).map((m) => m.name),
    };
  }
  process.stdout.write(`${JSON.stringify(out)}\n`);
} catch (err) {
  const where = `${process.env.PW_DB_HOST ?? '127.0.0.1'}:${process.env.PW_DB_PORT ?? '3307'}/${process.env.PW_DB_NAME ?? 'phasewright'}`;
  process.stderr.write(`db ${command} failed on ${where}: ${err.message}\n`);
  process.exitCode = 1;
} finally {
  await sequelize.close();
}
