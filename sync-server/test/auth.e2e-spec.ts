import { JwtService } from '@nestjs/jwt';
import { QueryTypes } from 'sequelize';
import request from 'supertest';
import { bearer, register, type Session, signIn, startTestApp, type StoredMail, type TestApp, TEST_ONLY_JWT_SECRET, tokenOf } from './support/accounts.js';
import { createTestDatabase, type TestDatabase } from './support/test-database.js';

const PASSWORD = 'violet-lattice-27';

describe('accounts and tokens against the private MariaDB', () => {
  let db: TestDatabase;
  let t: TestApp;
  let ada: Session;
  let admin: Session;

  beforeAll(async () => {
    db = await createTestDatabase();
    t = await startTestApp(db.config);
    ada = await register(t.http, 'Ada.Quill@Example.org', 'Ada Quill', PASSWORD);
    admin = await register(t.http, 'root.admin@example.org', 'Site Admin', 'admin-password-42');
    await db.sequelize.query("UPDATE users SET site_role = 'admin' WHERE id = ?", { replacements: [admin.user.id] });
  });

  afterAll(async () => {
    await t?.close();
    await db?.drop();
  });

  const count = async (table: string, where = '1=1', replacements: unknown[] = []) =>
    Number(((await db.sequelize.query(`SELECT COUNT(*) AS n FROM ${table} WHERE ${where}`, { type: QueryTypes.SELECT, replacements })) as { n: number }[])[0]!.n);

  async function mailTo(address: string): Promise<StoredMail[]> {
    const res = await request(t.http).get('/api/admin/mail').query({ to: address }).set('authorization', bearer(admin)).expect(200);
    return res.body as StoredMail[];
  }

  it('registers with a normalised address, stores only an scrypt hash, and signs in', async () => {
    expect(ada.user.email).toBe('ada.quill@example.org');
    expect(ada.user.siteRole).toBe('member');
    const [row] = (await db.sequelize.query('SELECT password_hash FROM users WHERE id = ?', { type: QueryTypes.SELECT, replacements: [ada.user.id] })) as { password_hash: string }[];
    expect(row!.password_hash).toMatch(/^scrypt\$12\$8\$1\$[A-Za-z0-9+/=]+\$[A-Za-z0-9+/=]+$/);
    expect(row!.password_hash).not.toContain(PASSWORD);
    const s = await signIn(t.http, 'ADA.QUILL@example.org ', PASSWORD);
    const me = await request(t.http).get('/api/users/me').set('authorization', bearer(s)).expect(200);
    expect(me.body).toMatchObject({ id: ada.user.id, displayName: 'Ada Quill' });
    expect(Object.keys(me.body).sort()).toEqual(['createdAt', 'displayName', 'email', 'id', 'siteRole']);
  });

  it('refuses a wrong password and an unknown address alike (401 bad_credentials)', async () => {
    const wrong = await request(t.http).post('/api/auth/sign-in').send({ email: 'ada.quill@example.org', password: 'not-the-password' }).expect(401);
    const unknown = await request(t.http).post('/api/auth/sign-in').send({ email: 'nobody@example.org', password: 'not-the-password' }).expect(401);
    expect(wrong.body).toEqual(unknown.body);
    expect(wrong.body.details).toEqual({ reason: 'bad_credentials' });
  });

  it('explains each 401 on a protected route: token_missing, token_invalid, token_expired', async () => {
    const missing = await request(t.http).get('/api/users/me').expect(401);
    expect(missing.body).toMatchObject({ statusCode: 401, error: 'Unauthorized', details: { reason: 'token_missing' } });

    const garbage = await request(t.http).get('/api/users/me').set('authorization', 'Bearer not.a.jwt').expect(401);
    expect(garbage.body.details).toEqual({ reason: 'token_invalid' });

    const foreign = await new JwtService({ secret: 'some-other-secret-of-at-least-32-chars!!' }).signAsync({ sub: ada.user.id, ver: 0, typ: 'access' });
    expect((await request(t.http).get('/api/users/me').set('authorization', bearer(foreign)).expect(401)).body.details).toEqual({ reason: 'token_invalid' });

    // Signed with the server's (test-only) secret, but expired a minute ago.
    const jwt = new JwtService({ secret: TEST_ONLY_JWT_SECRET });
    const expired = await jwt.signAsync({ sub: ada.user.id, ver: 0, typ: 'access', exp: Math.floor(Date.now() / 1000) - 60 });
    const res = await request(t.http).get('/api/users/me').set('authorization', bearer(expired)).expect(401);
    expect(res.body.details).toEqual({ reason: 'token_expired' });
    expect(res.body.message).toMatch(/expired/);

    // The same claims, not expired, are accepted: the 401 above is about expiry only.
    const fresh = await jwt.signAsync({ sub: ada.user.id, ver: 0, typ: 'access' }, { expiresIn: 60 });
    await request(t.http).get('/api/users/me').set('authorization', bearer(fresh)).expect(200);
  });

  it('rotates refresh tokens and revokes the whole family when an old one is reused', async () => {
    const s0 = await signIn(t.http, 'ada.quill@example.org', PASSWORD);
    const r1 = await request(t.http).post('/api/auth/refresh').send({ refreshToken: s0.refreshToken }).expect(200);
    expect(r1.body.refreshToken).not.toBe(s0.refreshToken);
    expect(r1.body.expiresIn).toBe(900);
    await request(t.http).get('/api/users/me').set('authorization', bearer(r1.body.accessToken)).expect(200);
    const r2 = await request(t.http).post('/api/auth/refresh').send({ refreshToken: r1.body.refreshToken }).expect(200);

    const family = ((await db.sequelize.query('SELECT family_id FROM refresh_tokens WHERE token_hash = SHA2(?, 256)', { type: QueryTypes.SELECT, replacements: [s0.refreshToken] })) as { family_id: string }[])[0]!.family_id;
    expect(await count('refresh_tokens', 'family_id = ?', [family])).toBe(3);
    expect(await count('refresh_tokens', 'family_id = ? AND revoked_at IS NULL', [family])).toBe(3);

    // The first token again: reuse → 401 refresh_reused, and the newest token of the family dies too.
    const reuse = await request(t.http).post('/api/auth/refresh').send({ refreshToken: s0.refreshToken }).expect(401);
    expect(reuse.body.details).toEqual({ reason: 'refresh_reused' });
    expect(await count('refresh_tokens', 'family_id = ? AND revoked_at IS NULL', [family])).toBe(0);
    const after = await request(t.http).post('/api/auth/refresh').send({ refreshToken: r2.body.refreshToken }).expect(401);
    expect(after.body.details).toEqual({ reason: 'token_invalid' });

    // Other sign-ins of the same person are a different family and keep working.
    const other = await signIn(t.http, 'ada.quill@example.org', PASSWORD);
    await request(t.http).post('/api/auth/refresh').send({ refreshToken: other.refreshToken }).expect(200);
  });

  it('expired refresh token → 401 token_expired; unknown → token_invalid', async () => {
    const s = await signIn(t.http, 'ada.quill@example.org', PASSWORD);
    await db.sequelize.query('UPDATE refresh_tokens SET expires_at = NOW(3) - INTERVAL 1 SECOND WHERE token_hash = SHA2(?, 256)', { replacements: [s.refreshToken] });
    expect((await request(t.http).post('/api/auth/refresh').send({ refreshToken: s.refreshToken }).expect(401)).body.details).toEqual({ reason: 'token_expired' });
    expect((await request(t.http).post('/api/auth/refresh').send({ refreshToken: 'x'.repeat(43) }).expect(401)).body.details).toEqual({ reason: 'token_invalid' });
  });

  it('sign-out revokes the refresh token (works with an expired access token: no Authorization needed)', async () => {
    const s = await signIn(t.http, 'ada.quill@example.org', PASSWORD);
    await request(t.http).post('/api/auth/sign-out').send({ refreshToken: s.refreshToken }).expect(204);
    expect((await request(t.http).post('/api/auth/refresh').send({ refreshToken: s.refreshToken }).expect(401)).body.details).toEqual({ reason: 'token_invalid' });
  });

  it('change password: the old password and every older token stop working', async () => {
    const bo = await register(t.http, 'bo.lantern@example.org', 'Bo Lantern', 'amber-orbit-9134');
    const bad = await request(t.http).post('/api/auth/password/change').set('authorization', bearer(bo)).send({ currentPassword: 'wrong-wrong-1', newPassword: 'teal-comet-5521' }).expect(400);
    expect(bad.body.details).toEqual([{ path: 'currentPassword', problems: ['currentPassword is not correct'] }]);
    const res = await request(t.http).post('/api/auth/password/change').set('authorization', bearer(bo)).send({ currentPassword: 'amber-orbit-9134', newPassword: 'teal-comet-5521' }).expect(200);
    await request(t.http).get('/api/users/me').set('authorization', bearer(res.body.accessToken)).expect(200);
    expect((await request(t.http).get('/api/users/me').set('authorization', bearer(bo)).expect(401)).body.details).toEqual({ reason: 'token_invalid' });
    expect((await request(t.http).post('/api/auth/refresh').send({ refreshToken: bo.refreshToken }).expect(401)).body.details).toEqual({ reason: 'token_invalid' });
    await request(t.http).post('/api/auth/sign-in').send({ email: 'bo.lantern@example.org', password: 'amber-orbit-9134' }).expect(401);
    await signIn(t.http, 'bo.lantern@example.org', 'teal-comet-5521');
  });

  it('password reset by e-mail link: single use, same answer for unknown addresses', async () => {
    const before = await count('mail_messages');
    const unknown = await request(t.http).post('/api/auth/password/forgot').send({ email: 'nobody@example.org' }).expect(202);
    expect(await count('mail_messages')).toBe(before);
    const known = await request(t.http).post('/api/auth/password/forgot').send({ email: 'ada.quill@example.org' }).expect(202);
    expect(known.body).toEqual(unknown.body);

    const [mail] = await mailTo('ada.quill@example.org');
    expect(mail!.subject).toBe('Reset your Phasewright password');
    expect(mail!.text).toContain('Hello Ada Quill');
    expect(mail!.html).toContain('<a href="http://127.0.0.1:8080/reset-password#token=');
    const link = mail!.links.find((l) => l.includes('/reset-password#token='))!;
    const token = tokenOf(link);
    expect(await count('password_resets', 'token_hash = SHA2(?, 256)', [token])).toBe(1);

    await request(t.http).post('/api/auth/password/reset').send({ token, password: 'new-prism-7788' }).expect(204);
    const again = await request(t.http).post('/api/auth/password/reset').send({ token, password: 'other-prism-7788' }).expect(400);
    expect(again.body.details[0].path).toBe('token');
    await request(t.http).post('/api/auth/sign-in').send({ email: 'ada.quill@example.org', password: PASSWORD }).expect(401);
    ada = await signIn(t.http, 'ada.quill@example.org', 'new-prism-7788');
  });

  it('the admin mail list is for site admins only', async () => {
    const res = await request(t.http).get('/api/admin/mail').set('authorization', bearer(ada)).expect(403);
    expect(res.body.error).toBe('Forbidden');
  });

  it('answers CORS only for the configured origin', async () => {
    const ok = await request(t.http).options('/api/auth/sign-in').set('origin', 'http://127.0.0.1:8080').set('access-control-request-method', 'POST');
    expect(ok.headers['access-control-allow-origin']).toBe('http://127.0.0.1:8080');
    const other = await request(t.http).options('/api/auth/sign-in').set('origin', 'https://evil.example').set('access-control-request-method', 'POST');
    expect(other.headers['access-control-allow-origin']).toBeUndefined();
  });
});
