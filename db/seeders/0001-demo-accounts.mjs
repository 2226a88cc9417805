// Demo accounts and one demo project: an invented research group of our own (no real people).
// Idempotent: accounts are matched by e-mail address and the project by name, so a second
// `npm start` adds nothing. The demo passwords are printed by `npm start`; they stay valid unless
// someone changes them in the app.
import { randomBytes, randomUUID, scrypt } from 'node:crypto';
import { promisify } from 'node:util';
import { QueryTypes } from 'sequelize';

const scryptAsync = promisify(scrypt);

// Same format and default cost as sync-server/src/auth/password-hasher.ts (a server test signs in
// with every seeded account): scrypt$<log2 N>$<r>$<p>$<salt base64>$<key base64>.
const LOG2N = 15;
const R = 8;
const P = 1;

async function hashPassword(password) {
  const salt = randomBytes(16);
  const key = await scryptAsync(password.normalize('NFKC'), salt, 64, { N: 2 ** LOG2N, r: R, p: P, maxmem: 256 * 2 ** LOG2N * R });
  return ['scrypt', LOG2N, R, P, salt.toString('base64'), key.toString('base64')].join('$');
}

export const DEMO_PROJECT = {
  name: 'Demo: kagome strip survey',
  description:
    'Invented demo project: hardcore bosons on a kagome strip with conditional hopping; a ground-state phase map over (g, theta) at half filling.',
};

/** site role, project role (null: not a member of the demo project). */
const PEOPLE = [
  { email: 'ada.quill@example.org', displayName: 'Ada Quill', password: 'admin-lantern-4821', siteRole: 'admin', projectRole: null, label: 'site admin' },
  { email: 'mira.fold@example.org', displayName: 'Mira Fold', password: 'owner-meadow-4821', siteRole: 'member', projectRole: 'owner', label: 'group owner' },
  { email: 'otto.vane@example.org', displayName: 'Otto Vane', password: 'editor-pebble-4821', siteRole: 'member', projectRole: 'editor', label: 'editor' },
  { email: 'lena.quartz@example.org', displayName: 'Lena Quartz', password: 'review-thistle-4821', siteRole: 'member', projectRole: 'reviewer', label: 'reviewer' },
  { email: 'pim.arbor@example.org', displayName: 'Pim Arbor', password: 'viewer-sparrow-4821', siteRole: 'member', projectRole: 'viewer', label: 'viewer' },
];

export async function seed({ sequelize }) {
  return sequelize.transaction(async (transaction) => {
    const q = (sql, replacements) => sequelize.query(sql, { replacements, transaction });
    const select = (sql, replacements) => sequelize.query(sql, { replacements, transaction, type: QueryTypes.SELECT });
    const ids = new Map();
    for (const person of PEOPLE) {
      const found = await select('SELECT id FROM users WHERE email = ?', [person.email]);
      if (found.length) {
        ids.set(person.email, found[0].id);
        continue;
      }
      const id = randomUUID();
      await q('INSERT INTO users (id, email, display_name, password_hash, site_role) VALUES (?, ?, ?, ?, ?)', [
        id,
        person.email,
        person.displayName,
        await hashPassword(person.password),
        person.siteRole,
      ]);
      ids.set(person.email, id);
    }

    const owner = PEOPLE.find((p) => p.projectRole === 'owner');
    const projects = await select('SELECT id FROM projects WHERE name = ?', [DEMO_PROJECT.name]);
    if (!projects.length) {
      const projectId = randomUUID();
      await q('INSERT INTO projects (id, name, description, created_by) VALUES (?, ?, ?, ?)', [
        projectId,
        DEMO_PROJECT.name,
        DEMO_PROJECT.description,
        ids.get(owner.email),
      ]);
      for (const person of PEOPLE.filter((p) => p.projectRole)) {
        await q('INSERT INTO memberships (project_id, user_id, role) VALUES (?, ?, ?)', [projectId, ids.get(person.email), person.projectRole]);
      }
    }

    return { signIns: PEOPLE.map((p) => ({ email: p.email, password: p.password, role: p.label })) };
  });
}
