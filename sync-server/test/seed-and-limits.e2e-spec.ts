import { QueryTypes } from 'sequelize';
import request from 'supertest';
import { seedDemo } from '../../db/seeders/index.mjs';
import { bearer, signIn, startTestApp, type TestApp } from './support/accounts.js';
import { createTestDatabase, type TestDatabase } from './support/test-database.js';

describe('demo seed', () => {
  let db: TestDatabase;
  let t: TestApp;

  beforeAll(async () => {
    db = await createTestDatabase();
    t = await startTestApp(db.config);
  });

  afterAll(async () => {
    await t?.close();
    await db?.drop();
  });

  const count = async (table: string) =>
    Number(((await db.sequelize.query(`SELECT COUNT(*) AS n FROM ${table}`, { type: QueryTypes.SELECT })) as { n: number }[])[0]!.n);

  it('is idempotent and every printed sign-in works with the role it claims', async () => {
    const first = await seedDemo(db.sequelize);
    const counts = { users: await count('users'), projects: await count('projects'), memberships: await count('memberships') };
    expect(counts).toEqual({ users: 5, projects: 1, memberships: 4 });
    const second = await seedDemo(db.sequelize);
    expect(second.signIns).toEqual(first.signIns);
    expect({ users: await count('users'), projects: await count('projects'), memberships: await count('memberships') }).toEqual(counts);

    const roles = new Map<string, string>();
    for (const s of first.signIns) {
      const session = await signIn(t.http, s.email, s.password);
      const projects = (await request(t.http).get('/api/projects').set('authorization', bearer(session)).expect(200)).body as { name: string; myRole: string }[];
      roles.set(s.role, projects.map((p) => `${p.name}:${p.myRole}`).join(',') || `site:${session.user.siteRole}`);
    }
    expect(Object.fromEntries(roles)).toEqual({
      'site admin': 'site:admin',
      'group owner': 'Demo: kagome strip survey:owner',
      editor: 'Demo: kagome strip survey:editor',
      reviewer: 'Demo: kagome strip survey:reviewer',
      viewer: 'Demo: kagome strip survey:viewer',
    });
  });
});

describe('rate limits on sign-in, registration and password reset', () => {
  let db: TestDatabase;
  let t: TestApp;

  beforeAll(async () => {
    db = await createTestDatabase();
    t = await startTestApp(db.config, { rateLimit: { windowS: 900, signIn: 3, register: 2, reset: 2 } });
  });

  afterAll(async () => {
    await t?.close();
    await db?.drop();
  });

  it('answers 429 in the one error shape once a limit is used up', async () => {
    for (let i = 0; i < 3; i++) await request(t.http).post('/api/auth/sign-in').send({ email: 'x@example.org', password: 'whatever-123' }).expect(401);
    const blocked = await request(t.http).post('/api/auth/sign-in').send({ email: 'x@example.org', password: 'whatever-123' }).expect(429);
    expect(blocked.body).toMatchObject({ statusCode: 429, error: 'Too Many Requests', details: { limit: 3, windowS: 900 } });
    expect(blocked.headers['ratelimit-policy']).toBe('3;w=900');

    await request(t.http).post('/api/auth/register').send({ email: 'r1@example.org', displayName: 'R1', password: 'granite-spoke-1618' }).expect(201);
    await request(t.http).post('/api/auth/register').send({ email: 'r2@example.org', displayName: 'R2', password: 'granite-spoke-1618' }).expect(201);
    await request(t.http).post('/api/auth/register').send({ email: 'r3@example.org', displayName: 'R3', password: 'granite-spoke-1618' }).expect(429);
    // Accepting an invitation (it can register) shares the registration limit.
    await request(t.http).post('/api/invitations/accept').send({ token: 'unknown' }).expect(429);

    await request(t.http).post('/api/auth/password/forgot').send({ email: 'r1@example.org' }).expect(202);
    await request(t.http).post('/api/auth/password/reset').send({ token: 'unknown', password: 'granite-spoke-1618' }).expect(400);
    await request(t.http).post('/api/auth/password/forgot').send({ email: 'r1@example.org' }).expect(429);

    // Other routes are not limited.
    await request(t.http).get('/api/health').expect(200);
    const s = await request(t.http).post('/api/auth/refresh').send({ refreshToken: 'unknown' });
    expect(s.status).toBe(401);
  });
});
