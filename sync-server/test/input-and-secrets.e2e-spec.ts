import { QueryTypes } from 'sequelize';
import request from 'supertest';
import { bearer, register, type Session, signIn, startTestApp, type StoredMail, type TestApp, tokenOf } from './support/accounts.js';
import { createTestDatabase, type TestDatabase } from './support/test-database.js';

const TABLES = ['users', 'refresh_tokens', 'password_resets', 'projects', 'memberships', 'invitations'];

describe('bad input is a 400 naming the field, and nothing is half-written', () => {
  let db: TestDatabase;
  let t: TestApp;
  let owner: Session;
  let projectId: string;

  beforeAll(async () => {
    db = await createTestDatabase();
    t = await startTestApp(db.config);
    owner = await register(t.http, 'noor.ledger@example.org', 'Noor Ledger', 'silver-fjord-5150');
    projectId = (await request(t.http).post('/api/projects').set('authorization', bearer(owner)).send({ name: 'Input checks' }).expect(201)).body.id;
  });

  afterAll(async () => {
    await t?.close();
    await db?.drop();
  });

  async function counts(): Promise<Record<string, number>> {
    const out: Record<string, number> = {};
    for (const table of TABLES) {
      const [row] = (await db.sequelize.query(`SELECT COUNT(*) AS n FROM ${table}`, { type: QueryTypes.SELECT })) as { n: number }[];
      out[table] = Number(row!.n);
    }
    return out;
  }

  const good = { email: 'fresh.person@example.org', displayName: 'Fresh Person', password: 'orchid-signal-4477' };
  const cases: { name: string; path: string; auth?: boolean; body: unknown; raw?: boolean; field: string | null; problem: RegExp }[] = [
    { name: 'malformed JSON', path: '/api/auth/register', body: '{"email": "a@b.org", ', raw: true, field: null, problem: /JSON|Unexpected|Expected/i },
    { name: 'wrong type (number for displayName)', path: '/api/auth/register', body: { ...good, displayName: 42 }, field: 'displayName', problem: /must be a string/ },
    { name: 'wrong type (array for email)', path: '/api/auth/register', body: { ...good, email: ['x@y.org'] }, field: 'email', problem: /email/ },
    { name: 'unknown field', path: '/api/auth/register', body: { ...good, siteRole: 'admin' }, field: 'siteRole', problem: /should not exist/ },
    { name: 'overlong display name', path: '/api/auth/register', body: { ...good, displayName: 'x'.repeat(101) }, field: 'displayName', problem: /shorter than or equal to 100/ },
    { name: 'overlong e-mail', path: '/api/auth/register', body: { ...good, email: `${'a'.repeat(250)}@example.org` }, field: 'email', problem: /254|email/ },
    { name: 'not an e-mail', path: '/api/auth/register', body: { ...good, email: 'not-an-address' }, field: 'email', problem: /email must be an email/ },
    { name: 'duplicate e-mail (other case)', path: '/api/auth/register', body: { ...good, email: 'NOOR.LEDGER@example.org' }, field: 'email', problem: /already registered/ },
    { name: 'weak password (short)', path: '/api/auth/register', body: { ...good, password: 'abc123' }, field: 'password', problem: /at least 10 characters/ },
    { name: 'weak password (few characters)', path: '/api/auth/register', body: { ...good, password: 'aaaaaaaaaaaabbbb' }, field: 'password', problem: /5 different/ },
    { name: 'weak password (contains the address)', path: '/api/auth/register', body: { ...good, password: 'fresh.person-2024' }, field: 'password', problem: /e-mail address/ },
    { name: 'missing field', path: '/api/auth/register', body: { email: good.email, password: good.password }, field: 'displayName', problem: /must be a string/ },
    { name: 'overlong project name', path: '/api/projects', auth: true, body: { name: 'p'.repeat(121) }, field: 'name', problem: /shorter than or equal to 120/ },
    { name: 'project name of spaces only', path: '/api/projects', auth: true, body: { name: '   ' }, field: 'name', problem: /longer than or equal to 1/ },
    { name: 'overlong description', path: '/api/projects', auth: true, body: { name: 'ok', description: 'd'.repeat(2001) }, field: 'description', problem: /2000/ },
    { name: 'unknown role in an invitation', path: `/api/projects/{projectId}/invitations`, auth: true, body: { email: 'x@example.org', role: 'admin' }, field: 'role', problem: /one of the following values/ },
    { name: 'weak new password on change', path: '/api/auth/password/change', auth: true, body: { currentPassword: 'silver-fjord-5150', newPassword: 'short' }, field: 'newPassword', problem: /at least 10/ },
  ];

  it.each(cases)('$name → 400 naming $field, row counts unchanged', async (c) => {
    const before = await counts();
    let req = request(t.http).post(c.path.replace('{projectId}', projectId));
    if (c.auth) req = req.set('authorization', bearer(owner));
    const res = c.raw ? await req.set('content-type', 'application/json').send(c.body as string) : await req.send(c.body as object);
    expect(res.status).toBe(400);
    expect(Object.keys(res.body).sort()).toEqual(['details', 'error', 'message', 'statusCode']);
    if (c.field === null) {
      expect(res.body.message).toMatch(c.problem);
    } else {
      const entry = (res.body.details as { path: string; problems: string[] }[]).find((d) => d.path === c.field);
      expect(entry).toBeDefined();
      expect(entry!.problems.join('; ')).toMatch(c.problem);
      expect(res.body.message).toContain(c.field);
    }
    expect(await counts()).toEqual(before);
  });

  it('two registrations of one address at once: one account, the other a 400 naming email', async () => {
    const before = await counts();
    const body = { email: 'race@example.org', displayName: 'Race', password: 'orchid-signal-4477' };
    const results = await Promise.all([1, 2, 3, 4].map(() => request(t.http).post('/api/auth/register').send(body)));
    expect(results.map((r) => r.status).sort()).toEqual([201, 400, 400, 400]);
    for (const r of results.filter((x) => x.status === 400)) expect(r.body.details).toEqual([{ path: 'email', problems: ['email is already registered'] }]);
    const after = await counts();
    expect(after.users - before.users).toBe(1);
    expect(after.refresh_tokens - before.refresh_tokens).toBe(1);
  });

  it('a refused invitation accept (address registered meanwhile) leaves nothing behind', async () => {
    await request(t.http).post(`/api/projects/${projectId}/invitations`).set('authorization', bearer(owner)).send({ email: 'late.joiner@example.org', role: 'viewer' }).expect(201);
    await register(t.http, 'late.joiner@example.org', 'Late Joiner', 'orchid-signal-4477');
    const before = await counts();
    const mails = (await db.sequelize.query("SELECT text FROM mail_messages WHERE mail_to = 'late.joiner@example.org' ORDER BY id DESC", { type: QueryTypes.SELECT })) as { text: string }[];
    const token = tokenOf(/https?:\/\/\S+#token=\S+/.exec(mails[0]!.text)![0]);
    await request(t.http).post('/api/invitations/accept').send({ token, displayName: 'Someone Else', password: 'orchid-signal-4477' }).expect(409);
    expect(await counts()).toEqual(before);
  });

  it('a failure after the first write rolls the whole transaction back (registration)', async () => {
    // Make the second write of a registration (its refresh token) fail inside MariaDB itself.
    await db.sequelize.query(
      "CREATE TRIGGER refuse_refresh BEFORE INSERT ON refresh_tokens FOR EACH ROW SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'refused by test trigger'",
    );
    try {
      const before = await counts();
      const res = await request(t.http).post('/api/auth/register').send({ email: 'half.written@example.org', displayName: 'Half Written', password: 'orchid-signal-4477' });
      expect(res.status).toBe(500);
      expect(res.body.message).toBe('Internal server error; the server log has the details');
      expect(await counts()).toEqual(before);
      const logged = t.logger.lines.find((l) => l.includes('refused by test trigger'));
      expect(logged).toMatch(/^error SequelizeDatabaseError: refused by test trigger \(errno 1644, SQLSTATE 45000\)/);
      // The statement and its parameters (here the refresh token's hash) stay out of the log.
      expect(t.logger.lines.join('\n')).not.toMatch(/INSERT INTO/);
    } finally {
      await db.sequelize.query('DROP TRIGGER refuse_refresh');
    }
    await request(t.http).post('/api/auth/register').send({ email: 'half.written@example.org', displayName: 'Half Written', password: 'orchid-signal-4477' }).expect(201);
  });
});

describe('passwords and tokens never appear in responses or logs', () => {
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

  it('runs every flow with secrets, then greps the captured log and the response bodies', async () => {
    const secrets: string[] = [];
    const bodies: { route: string; text: string }[] = [];
    const keep = (route: string, res: request.Response) => {
      bodies.push({ route, text: JSON.stringify(res.body) + JSON.stringify(res.headers) });
      return res;
    };
    const pw = { owner: 'kestrel-orbit-1001', newOwner: 'kestrel-orbit-2002', reset: 'kestrel-orbit-3003', invitee: 'kestrel-orbit-4004', wrong: 'wrong-secret-5005' };
    secrets.push(...Object.values(pw));

    const reg = keep('register', await request(t.http).post('/api/auth/register').send({ email: 'sec.owner@example.org', displayName: 'Sec Owner', password: pw.owner }).expect(201));
    const admin = await register(t.http, 'sec.admin@example.org', 'Sec Admin', 'kestrel-orbit-6006');
    secrets.push('kestrel-orbit-6006');
    await db.sequelize.query("UPDATE users SET site_role = 'admin' WHERE id = ?", { replacements: [admin.user.id] });
    const registered = reg.body as Session;
    secrets.push(registered.refreshToken, registered.accessToken);
    keep('sign-in (wrong)', await request(t.http).post('/api/auth/sign-in').send({ email: 'sec.owner@example.org', password: pw.wrong }).expect(401));
    let s: Session = keep('sign-in', await request(t.http).post('/api/auth/sign-in').send({ email: 'sec.owner@example.org', password: pw.owner }).expect(200)).body;
    const rotated = keep('refresh', await request(t.http).post('/api/auth/refresh').send({ refreshToken: s.refreshToken }).expect(200)).body;
    // A retry inside the grace window (PW_REFRESH_REUSE_GRACE_S) gets the same successor again …
    keep('refresh retry (grace)', await request(t.http).post('/api/auth/refresh').send({ refreshToken: s.refreshToken }).expect(200));
    const next = keep('refresh (successor)', await request(t.http).post('/api/auth/refresh').send({ refreshToken: rotated.refreshToken }).expect(200)).body;
    // … and once the successor has been used, presenting the old token again is reuse.
    keep('refresh reuse', await request(t.http).post('/api/auth/refresh').send({ refreshToken: s.refreshToken }).expect(401));
    secrets.push(s.refreshToken, rotated.refreshToken, next.refreshToken, next.accessToken, s.accessToken);
    const changed = keep('change password', await request(t.http).post('/api/auth/password/change').set('authorization', bearer(s)).send({ currentPassword: pw.owner, newPassword: pw.newOwner }).expect(200)).body as Session;
    secrets.push(changed.refreshToken, changed.accessToken);
    keep('forgot', await request(t.http).post('/api/auth/password/forgot').send({ email: 'sec.owner@example.org' }).expect(202));
    const mail = async (to: string) =>
      ((await request(t.http).get('/api/admin/mail').query({ to }).set('authorization', bearer(admin)).expect(200)).body as StoredMail[])[0]!;
    const resetToken = tokenOf((await mail('sec.owner@example.org')).links[0]!);
    secrets.push(resetToken);
    keep('reset', await request(t.http).post('/api/auth/password/reset').send({ token: resetToken, password: pw.reset }).expect(204));
    s = await signIn(t.http, 'sec.owner@example.org', pw.reset);
    const project = keep('create project', await request(t.http).post('/api/projects').set('authorization', bearer(s)).send({ name: 'Secrets' }).expect(201)).body;
    keep('invite', await request(t.http).post(`/api/projects/${project.id}/invitations`).set('authorization', bearer(s)).send({ email: 'sec.invitee@example.org', role: 'viewer' }).expect(201));
    const invitationToken = tokenOf((await mail('sec.invitee@example.org')).links[0]!);
    secrets.push(invitationToken);
    keep('preview', await request(t.http).post('/api/invitations/preview').send({ token: invitationToken }).expect(200));
    const accepted = keep('accept', await request(t.http).post('/api/invitations/accept').send({ token: invitationToken, displayName: 'Sec Invitee', password: pw.invitee }).expect(200)).body;
    secrets.push(accepted.session.refreshToken);
    keep('delete token', await request(t.http).post(`/api/projects/${project.id}/delete-confirmation`).set('authorization', bearer(s)).expect(200));
    keep('sign-out', await request(t.http).post('/api/auth/sign-out').send({ refreshToken: s.refreshToken }).expect(204));
    keep('members', await request(t.http).get(`/api/projects/${project.id}/members`).set('authorization', bearer(s)).expect(200));
    keep('me', await request(t.http).get('/api/users/me').set('authorization', bearer(s)).expect(200));

    // Password hashes never leave the server either.
    const hashes = ((await db.sequelize.query('SELECT password_hash FROM users', { type: QueryTypes.SELECT })) as { password_hash: string }[]).map((r) => r.password_hash);
    // Nothing logged at any level may contain a password, a token (access, refresh, reset, invitation) or a hash.
    const log = t.logger.lines.join('\n');
    expect(t.logger.lines.length).toBeGreaterThan(20); // the access log and mail lines were captured
    expect(log).toMatch(/POST \/api\/auth\/sign-in 200/);
    for (const secret of [...secrets, ...hashes]) expect(log).not.toContain(secret);

    // Responses carry a refresh/access token only where one is issued; passwords, hashes, reset and invitation tokens never.
    const issuing = new Set(['sign-in', 'refresh', 'refresh retry (grace)', 'refresh (successor)', 'change password', 'register', 'accept']);
    for (const { route, text } of bodies) {
      for (const secret of [...Object.values(pw), 'kestrel-orbit-6006', resetToken, invitationToken, ...hashes]) {
        expect(`${route}: ${text.includes(secret)}`).toBe(`${route}: false`);
      }
      if (!issuing.has(route)) expect(`${route}: ${/refreshToken|accessToken/.test(text)}`).toBe(`${route}: false`);
      expect(text).not.toMatch(/password_?hash|scrypt\$/i);
    }
  });
});
