import { QueryTypes } from 'sequelize';
import request from 'supertest';
import { DEFAULT_REFRESH_REUSE_GRACE_S, refreshReuseGraceS } from '../src/auth/refresh-reuse-grace.js';
import { bearer, register, type Session, startTestApp, type TestApp } from './support/accounts.js';
import { createTestDatabase, type TestDatabase } from './support/test-database.js';

const PASSWORD = 'violet-lattice-27';

/**
 * The refresh-token grace window: a token presented again shortly after its rotation (a reload lost
 * the answer) gets the same successor instead of signing the device out; outside the window, or once
 * the successor was used, it is reuse and revokes the family.
 */
describe('refresh-token reuse grace window against the private MariaDB', () => {
  let db: TestDatabase;
  let t: TestApp;
  let noGrace: TestApp;
  let n = 0;

  beforeAll(async () => {
    db = await createTestDatabase();
    t = await startTestApp(db.config); // default window (30 s)
    noGrace = await startTestApp(db.config, { refreshReuseGraceS: 0 });
  });

  afterAll(async () => {
    await t?.close();
    await noGrace?.close();
    await db?.drop();
  });

  const fresh = (app: TestApp = t): Promise<Session> => register(app.http, `grace.${++n}@example.org`, `Grace ${n}`, PASSWORD);
  const refresh = (token: string, app: TestApp = t) => request(app.http).post('/api/auth/refresh').send({ refreshToken: token });
  const familyOf = async (token: string) =>
    ((await db.sequelize.query('SELECT family_id FROM refresh_tokens WHERE token_hash = SHA2(?, 256)', { type: QueryTypes.SELECT, replacements: [token] })) as { family_id: string }[])[0]!.family_id;
  const live = async (family: string) =>
    Number(((await db.sequelize.query('SELECT COUNT(*) AS n FROM refresh_tokens WHERE family_id = ? AND revoked_at IS NULL', { type: QueryTypes.SELECT, replacements: [family] })) as { n: number }[])[0]!.n);
  const rows = async (family: string) =>
    Number(((await db.sequelize.query('SELECT COUNT(*) AS n FROM refresh_tokens WHERE family_id = ?', { type: QueryTypes.SELECT, replacements: [family] })) as { n: number }[])[0]!.n);
  /** Pretend the token was rotated `seconds` ago. */
  const usedSecondsAgo = (token: string, seconds: number) =>
    db.sequelize.query('UPDATE refresh_tokens SET used_at = NOW(3) - INTERVAL ? SECOND WHERE token_hash = SHA2(?, 256)', { replacements: [seconds, token] });

  it('within the window the old token gets a working access token and the same successor; the family stays one chain', async () => {
    const s0 = await fresh();
    const family = await familyOf(s0.refreshToken);
    const r1 = await refresh(s0.refreshToken).expect(200);
    // The answer of r1 is "lost" (reload): the old token is presented again.
    const again = await refresh(s0.refreshToken).expect(200);
    expect(again.body.refreshToken).toBe(r1.body.refreshToken);
    expect(again.body.refreshExpiresAt).toBe(r1.body.refreshExpiresAt);
    await request(t.http).get('/api/users/me').set('authorization', bearer(again.body.accessToken as string)).expect(200);
    expect(await rows(family)).toBe(2);
    expect(await live(family)).toBe(2);
    // The successor rotates normally afterwards.
    const r2 = await refresh(again.body.refreshToken as string).expect(200);
    expect(r2.body.refreshToken).not.toBe(r1.body.refreshToken);
    expect(await rows(family)).toBe(3);
  });

  it('once the successor has been used, the old token is reuse even within the window: the family is revoked', async () => {
    const s0 = await fresh();
    const family = await familyOf(s0.refreshToken);
    const r1 = await refresh(s0.refreshToken).expect(200);
    const r2 = await refresh(r1.body.refreshToken as string).expect(200);
    const reuse = await refresh(s0.refreshToken).expect(401);
    expect(reuse.body.details).toEqual({ reason: 'refresh_reused' });
    expect(await live(family)).toBe(0);
    expect((await refresh(r2.body.refreshToken as string).expect(401)).body.details).toEqual({ reason: 'token_invalid' });
  });

  it(`both sides of the ${DEFAULT_REFRESH_REUSE_GRACE_S} s window: ${DEFAULT_REFRESH_REUSE_GRACE_S - 2} s after rotation accepted, ${DEFAULT_REFRESH_REUSE_GRACE_S + 2} s after revoked`, async () => {
    const inside = await fresh();
    const r1 = await refresh(inside.refreshToken).expect(200);
    await usedSecondsAgo(inside.refreshToken, DEFAULT_REFRESH_REUSE_GRACE_S - 2);
    expect((await refresh(inside.refreshToken).expect(200)).body.refreshToken).toBe(r1.body.refreshToken);

    const outside = await fresh();
    const family = await familyOf(outside.refreshToken);
    const o1 = await refresh(outside.refreshToken).expect(200);
    await usedSecondsAgo(outside.refreshToken, DEFAULT_REFRESH_REUSE_GRACE_S + 2);
    expect((await refresh(outside.refreshToken).expect(401)).body.details).toEqual({ reason: 'refresh_reused' });
    expect(await live(family)).toBe(0);
    expect((await refresh(o1.body.refreshToken as string).expect(401)).body.details).toEqual({ reason: 'token_invalid' });
  });

  it('two concurrent refreshes with one token both succeed with the same successor (one rotation)', async () => {
    const s0 = await fresh();
    const family = await familyOf(s0.refreshToken);
    const [a, b] = await Promise.all([refresh(s0.refreshToken), refresh(s0.refreshToken)]);
    expect([a.status, b.status]).toEqual([200, 200]);
    expect(a.body.refreshToken).toBe(b.body.refreshToken);
    expect(await rows(family)).toBe(2);
    expect(await live(family)).toBe(2);
  });

  it('with the window set to 0 an immediate second presentation is reuse (the behaviour without a window)', async () => {
    const s0 = await fresh(noGrace);
    const family = await familyOf(s0.refreshToken);
    await refresh(s0.refreshToken, noGrace).expect(200);
    expect((await refresh(s0.refreshToken, noGrace).expect(401)).body.details).toEqual({ reason: 'refresh_reused' });
    expect(await live(family)).toBe(0);
  });

  it('a sign-out ends the window too: the old token is refused after the family was revoked', async () => {
    const s0 = await fresh();
    const r1 = await refresh(s0.refreshToken).expect(200);
    await request(t.http).post('/api/auth/sign-out').send({ refreshToken: r1.body.refreshToken }).expect(204);
    expect((await refresh(s0.refreshToken).expect(401)).body.details).toEqual({ reason: 'token_invalid' });
  });

  it('PW_REFRESH_REUSE_GRACE_S: default 30, whole seconds 0–3600, a clear error otherwise', () => {
    expect(refreshReuseGraceS(undefined, {})).toBe(30);
    expect(refreshReuseGraceS(undefined, { PW_REFRESH_REUSE_GRACE_S: '5' })).toBe(5);
    expect(refreshReuseGraceS(0, { PW_REFRESH_REUSE_GRACE_S: '5' })).toBe(0);
    expect(() => refreshReuseGraceS(undefined, { PW_REFRESH_REUSE_GRACE_S: 'soon' })).toThrow(/PW_REFRESH_REUSE_GRACE_S=soon is not a whole number between 0 and 3600/);
    expect(() => refreshReuseGraceS(undefined, { PW_REFRESH_REUSE_GRACE_S: '-1' })).toThrow(/PW_REFRESH_REUSE_GRACE_S/);
  });
});
