// Demo data: an invented scenario of our own, loaded by `npm start` after the migrations.
// Every seeder must be idempotent (running `npm start` again adds nothing twice).
//
// A seeder is a file db/seeders/NNNN-kebab-name.mjs exporting
//   seed({ sequelize, queryInterface }) → Promise<{ signIns?: SignIn[] } | void>
// where SignIn is { email, password, role } — printed by `npm start` so people can sign in.
// Seeders run in name order. Accounts and projects arrive with later issues; until then the
// folder holds no seeders and `npm start` says that there are no demo sign-ins yet.
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const seedersDir = path.dirname(fileURLToPath(import.meta.url));

/**
 * Run every seeder once, in name order.
 * @param {import('sequelize').Sequelize} sequelize
 * @returns {Promise<{ seeders: string[], signIns: { email: string, password: string, role: string }[] }>}
 */
export async function seedDemo(sequelize) {
  const files = fs
    .readdirSync(seedersDir)
    .filter((f) => /^\d{4}-[a-z0-9-]+\.mjs$/.test(f))
    .sort();
  const signIns = [];
  for (const file of files) {
    const mod = await import(pathToFileURL(path.join(seedersDir, file)).href);
    const out = await mod.seed({ sequelize, queryInterface: sequelize.getQueryInterface() });
    if (out?.signIns) signIns.push(...out.signIns);
  }
  return { seeders: files.map((f) => f.replace(/\.mjs$/, '')), signIns };
}
