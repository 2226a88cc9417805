import { createHash, randomBytes, randomUUID } from 'node:crypto';
import request from 'supertest';
import { bearer, register, type Session, signIn, startTestApp, type TestApp } from './support/accounts.js';
import { createTestDatabase, type TestDatabase } from './support/test-database.js';

/**
 * Every route × every kind of caller, each against a fresh project so that no cell depends on
 * another. The route list is checked against the OpenAPI document, so a new route without a row
 * here fails this test.
 */
const ROLES = ['anonymous', 'outsider', 'viewer', 'reviewer', 'editor', 'owner', 'admin'] as const;
type Role = (typeof ROLES)[number];
type Expect = Record<Role, number>;

const all = (status: number): Expect => ({ anonymous: status, outsider: status, viewer: status, reviewer: status, editor: status, owner: status, admin: status });
const signedIn = (status: number): Expect => ({ ...all(status), anonymous: 401 });
/** Project routes: outsiders and site admins (not members) see 404; members per role. */
const members = (ok: number, allowed: Role[], denied = 403): Expect => ({
  anonymous: 401,
  outsider: 404,
  admin: 404,
  viewer: allowed.includes('viewer') ? ok : denied,
  reviewer: allowed.includes('reviewer') ? ok : denied,
  editor: allowed.includes('editor') ? ok : denied,
  owner: allowed.includes('owner') ? ok : denied,
});
const ANY: Role[] = ['viewer', 'reviewer', 'editor', 'owner'];
/** OpenAPI tags of the routes this matrix covers. */
const MATRIX_TAGS = ['auth', 'users', 'projects', 'members', 'invitations', 'admin'];

interface Fixture {
  projectId: string;
  extraUserId: string;
  invitationId: string;
  invitationToken: string;
}
interface Call {
  path: string;
  body?: object;
}
interface Row {
  method: 'get' | 'post' | 'patch' | 'delete';
  /** As in the OpenAPI document. */
  route: string;
  expect: Expect;
  call(f: Fixture, role: Role): Promise<Call> | Call;
}

const PASSWORD = 'matrix-password-8080';
const sha256 = (s: string) => createHash('sha256').update(s).digest('hex');
let unique = 0;
const fresh = (what: string) => `${what}-${process.pid}-${++unique}@example.org`;

describe('role matrix: every route × every role', () => {
  let db: TestDatabase;
  let t: TestApp;
  const sessions = {} as Record<Exclude<Role, 'anonymous'>, Session>;
  let extra: Session;

  beforeAll(async () => {
    db = await createTestDatabase();
    t = await startTestApp(db.config);
    for (const role of ROLES) {
      if (role === 'anonymous') continue;
      sessions[role] = await register(t.http, `${role}@example.org`, `Matrix ${role}`, PASSWORD);
    }
    extra = await register(t.http, 'extra@example.org', 'Matrix extra', PASSWORD);
    await db.sequelize.query("UPDATE users SET site_role = 'admin' WHERE id = ?", { replacements: [sessions.admin.user.id] });
    // The outsider belongs to a project of their own.
    await request(t.http).post('/api/projects').set('authorization', bearer(sessions.outsider)).send({ name: 'Elsewhere' }).expect(201);
  });

  afterAll(async () => {
    await t?.close();
    await db?.drop();
  });

  /** A fresh project with one member per project role, an extra viewer and a pending invitation. */
  async function fixture(): Promise<Fixture> {
    const projectId = randomUUID();
    const q = (sql: string, replacements: unknown[]) => db.sequelize.query(sql, { replacements });
    await q('INSERT INTO projects (id, name, description, created_by) VALUES (?, ?, ?, ?)', [projectId, 'Matrix project', '', sessions.owner.user.id]);
    const memberRows: [string, string][] = [
      [sessions.owner.user.id, 'owner'],
      [sessions.editor.user.id, 'editor'],
      [sessions.reviewer.user.id, 'reviewer'],
      [sessions.viewer.user.id, 'viewer'],
      [extra.user.id, 'viewer'],
    ];
    await q(`INSERT INTO memberships (project_id, user_id, role) VALUES ${memberRows.map(() => '(?, ?, ?)').join(', ')}`, memberRows.flatMap(([u, r]) => [projectId, u, r]));
    const invitationId = randomUUID();
    const invitationToken = randomBytes(32).toString('base64url');
    await q('INSERT INTO invitations (id, project_id, email, role, token_hash, invited_by, expires_at) VALUES (?, ?, ?, ?, ?, ?, NOW(3) + INTERVAL 1 HOUR)', [
      invitationId,
      projectId,
      fresh('invitee'),
      'viewer',
      sha256(invitationToken),
      sessions.owner.user.id,
    ]);
    return { projectId, extraUserId: extra.user.id, invitationId, invitationToken };
  }

  const P = (f: Fixture, rest = '') => `/api/projects/${f.projectId}${rest}`;

  const rows: Row[] = [
    { method: 'get', route: '/api/health', expect: all(200), call: () => ({ path: '/api/health' }) },
    {
      method: 'post', route: '/api/auth/register', expect: all(201),
      call: () => ({ path: '/api/auth/register', body: { email: fresh('new'), displayName: 'New Person', password: PASSWORD } }),
    },
    { method: 'post', route: '/api/auth/sign-in', expect: all(200), call: () => ({ path: '/api/auth/sign-in', body: { email: 'extra@example.org', password: PASSWORD } }) },
    {
      method: 'post', route: '/api/auth/refresh', expect: all(200),
      call: async () => ({ path: '/api/auth/refresh', body: { refreshToken: (await signIn(t.http, 'extra@example.org', PASSWORD)).refreshToken } }),
    },
    {
      method: 'post', route: '/api/auth/sign-out', expect: all(204),
      call: async () => ({ path: '/api/auth/sign-out', body: { refreshToken: (await signIn(t.http, 'extra@example.org', PASSWORD)).refreshToken } }),
    },
    // A wrong current password: signed-in callers reach the check (400), nothing changes.
    {
      method: 'post', route: '/api/auth/password/change', expect: signedIn(400),
      call: () => ({ path: '/api/auth/password/change', body: { currentPassword: 'not-my-password', newPassword: 'another-pass-4242' } }),
    },
    { method: 'post', route: '/api/auth/password/forgot', expect: all(202), call: () => ({ path: '/api/auth/password/forgot', body: { email: 'extra@example.org' } }) },
    // An unknown reset token: public route, 400 naming `token` for everyone.
    { method: 'post', route: '/api/auth/password/reset', expect: all(400), call: () => ({ path: '/api/auth/password/reset', body: { token: 'unknown', password: 'another-pass-4242' } }) },
    { method: 'get', route: '/api/users/me', expect: signedIn(200), call: () => ({ path: '/api/users/me' }) },
    { method: 'patch', route: '/api/users/me', expect: signedIn(200), call: (_f, role) => ({ path: '/api/users/me', body: { displayName: `Matrix ${role}` } }) },
    { method: 'get', route: '/api/projects', expect: signedIn(200), call: () => ({ path: '/api/projects' }) },
    { method: 'post', route: '/api/projects', expect: signedIn(201), call: () => ({ path: '/api/projects', body: { name: 'Made in the matrix' } }) },
    { method: 'get', route: '/api/projects/{projectId}', expect: members(200, ANY), call: (f) => ({ path: P(f) }) },
    { method: 'patch', route: '/api/projects/{projectId}', expect: members(200, ['owner']), call: (f) => ({ path: P(f), body: { name: 'Renamed' } }) },
    { method: 'post', route: '/api/projects/{projectId}/archive', expect: members(200, ['owner']), call: (f) => ({ path: P(f, '/archive') }) },
    { method: 'post', route: '/api/projects/{projectId}/unarchive', expect: members(200, ['owner']), call: (f) => ({ path: P(f, '/unarchive') }) },
    { method: 'post', route: '/api/projects/{projectId}/delete-confirmation', expect: members(200, ['owner']), call: (f) => ({ path: P(f, '/delete-confirmation') }) },
    {
      // Everyone presents a valid token the owner obtained; only the owner may use it.
      method: 'delete', route: '/api/projects/{projectId}', expect: members(204, ['owner']),
      call: async (f) => {
        const res = await request(t.http).post(P(f, '/delete-confirmation')).set('authorization', bearer(sessions.owner)).expect(200);
        return { path: P(f), body: { confirmationToken: res.body.confirmationToken } };
      },
    },
    { method: 'get', route: '/api/projects/{projectId}/members', expect: members(200, ANY), call: (f) => ({ path: P(f, '/members') }) },
    {
      method: 'patch', route: '/api/projects/{projectId}/members/{userId}', expect: members(200, ['owner']),
      call: (f) => ({ path: P(f, `/members/${f.extraUserId}`), body: { role: 'reviewer' } }),
    },
    // Removing someone else (leaving is covered in projects.e2e-spec.ts).
    { method: 'delete', route: '/api/projects/{projectId}/members/{userId}', expect: members(204, ['owner']), call: (f) => ({ path: P(f, `/members/${f.extraUserId}`) }) },
    {
      method: 'post', route: '/api/projects/{projectId}/invitations', expect: members(201, ['owner']),
      call: (f) => ({ path: P(f, '/invitations'), body: { email: fresh('invited'), role: 'editor' } }),
    },
    { method: 'get', route: '/api/projects/{projectId}/invitations', expect: members(200, ['owner']), call: (f) => ({ path: P(f, '/invitations') }) },
    {
      method: 'delete', route: '/api/projects/{projectId}/invitations/{invitationId}', expect: members(204, ['owner']),
      call: (f) => ({ path: P(f, `/invitations/${f.invitationId}`) }),
    },
    { method: 'post', route: '/api/invitations/preview', expect: all(200), call: (f) => ({ path: '/api/invitations/preview', body: { token: f.invitationToken } }) },
    {
      // Sent to a fresh address: anonymous callers register with it (200); signed-in callers have another address (403).
      method: 'post', route: '/api/invitations/accept', expect: { ...all(403), anonymous: 200 },
      call: (f) => ({ path: '/api/invitations/accept', body: { token: f.invitationToken, displayName: 'Invitee', password: PASSWORD } }),
    },
    { method: 'get', route: '/api/admin/mail', expect: { ...signedIn(403), admin: 200 }, call: () => ({ path: '/api/admin/mail' }) },
  ];

  it('gives every caller the expected status on every route', async () => {
    // Coverage: the rows are exactly the documented routes of these features (tags below); routes of
    // other features (maps, sync, …) belong in their own matrix and are only counted here.
    const doc = (await request(t.http).get('/api/docs-json').expect(200)).body as { paths: Record<string, Record<string, { tags?: string[] }>> };
    const ops = Object.entries(doc.paths).flatMap(([p, byMethod]) => Object.entries(byMethod).map(([m, op]) => ({ key: `${m.toUpperCase()} ${p}`, tags: op.tags ?? [] })));
    const ours = ops.filter((o) => o.key === 'GET /api/health' || o.tags.some((tag) => MATRIX_TAGS.includes(tag)));
    expect(rows.map((r) => `${r.method.toUpperCase()} ${r.route}`).sort()).toEqual(ours.map((o) => o.key).sort());
    const others = ops.length - ours.length;

    const mismatches: string[] = [];
    const table: string[] = [`${'route'.padEnd(62)} ${ROLES.map((r) => r.slice(0, 9).padStart(9)).join(' ')}`];
    for (const row of rows) {
      // The callers of one route run side by side, each on a fixture of its own.
      const got = await Promise.all(
        ROLES.map(async (role) => {
          const f = await fixture();
          const { path, body } = await row.call(f, role);
          let req = request(t.http)[row.method](path);
          if (role !== 'anonymous') req = req.set('authorization', bearer(sessions[role]));
          const res = body ? await req.send(body) : await req;
          if (res.status !== row.expect[role]) {
            mismatches.push(`${row.method.toUpperCase()} ${row.route} as ${role}: expected ${row.expect[role]}, got ${res.status} ${JSON.stringify(res.body)}`);
          }
          if (res.status === 401) expect(res.body.details?.reason).toBe('token_missing');
          if (res.status === 404) expect(res.body).toEqual({ statusCode: 404, error: 'Not Found', message: 'No such project', details: null });
          return res.status;
        }),
      );
      table.push(`${`${row.method.toUpperCase()} ${row.route}`.padEnd(62)} ${got.map((s) => String(s).padStart(9)).join(' ')}`);
    }
    process.stdout.write(
      `\nrole matrix: ${rows.length} routes × ${ROLES.length} callers = ${rows.length * ROLES.length} requests (${others} documented routes of other features not in this matrix)\n${table.join('\n')}\n`,
    );
    expect(mismatches).toEqual([]);
  });
});
