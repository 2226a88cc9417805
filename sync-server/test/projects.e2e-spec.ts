import { QueryTypes } from 'sequelize';
import request from 'supertest';
import { bearer, register, type Session, startTestApp, type StoredMail, type TestApp, tokenOf } from './support/accounts.js';
import { createTestDatabase, type TestDatabase } from './support/test-database.js';

describe('projects, members and invitations against the private MariaDB', () => {
  let db: TestDatabase;
  let t: TestApp;
  let owner: Session;
  let admin: Session;
  let stranger: Session;
  let projectId: string;

  beforeAll(async () => {
    db = await createTestDatabase();
    t = await startTestApp(db.config);
    owner = await register(t.http, 'mira.fold@example.org', 'Mira Fold', 'copper-braid-3141');
    stranger = await register(t.http, 'otto.vane@example.org', 'Otto Vane', 'quiet-harbor-2718');
    admin = await register(t.http, 'site.keeper@example.org', 'Site Keeper', 'granite-spoke-1618');
    await db.sequelize.query("UPDATE users SET site_role = 'admin' WHERE id = ?", { replacements: [admin.user.id] });
    const res = await request(t.http).post('/api/projects').set('authorization', bearer(owner)).send({ name: '  Triangular ring exchange  ', description: 'invented demo' }).expect(201);
    projectId = res.body.id;
  });

  afterAll(async () => {
    await t?.close();
    await db?.drop();
  });

  const rows = async <T>(sql: string, replacements: unknown[] = []) => (await db.sequelize.query(sql, { type: QueryTypes.SELECT, replacements })) as T[];

  async function mailTo(address: string): Promise<StoredMail[]> {
    return (await request(t.http).get('/api/admin/mail').query({ to: address }).set('authorization', bearer(admin)).expect(200)).body as StoredMail[];
  }

  it('creates a project with its creator as owner and lists it with my role', async () => {
    const list = await request(t.http).get('/api/projects').set('authorization', bearer(owner)).expect(200);
    expect(list.body).toHaveLength(1);
    expect(list.body[0]).toMatchObject({ id: projectId, name: 'Triangular ring exchange', description: 'invented demo', archived: false, myRole: 'owner' });
    expect(await rows('SELECT role FROM memberships WHERE project_id = ? AND user_id = ?', [projectId, owner.user.id])).toEqual([{ role: 'owner' }]);
    expect((await request(t.http).get('/api/projects').set('authorization', bearer(stranger)).expect(200)).body).toEqual([]);
  });

  it('renames, describes, archives and unarchives (owner)', async () => {
    const renamed = await request(t.http).patch(`/api/projects/${projectId}`).set('authorization', bearer(owner)).send({ name: 'Ring exchange survey', description: 'second try' }).expect(200);
    expect(renamed.body).toMatchObject({ name: 'Ring exchange survey', description: 'second try' });
    const archived = await request(t.http).post(`/api/projects/${projectId}/archive`).set('authorization', bearer(owner)).expect(200);
    expect(archived.body.archived).toBe(true);
    expect(archived.body.archivedAt).not.toBeNull();
    const back = await request(t.http).post(`/api/projects/${projectId}/unarchive`).set('authorization', bearer(owner)).expect(200);
    expect(back.body).toMatchObject({ archived: false, archivedAt: null });
  });

  it('shows outsiders and site admins a 404 that looks like a missing project', async () => {
    const outsider = await request(t.http).get(`/api/projects/${projectId}`).set('authorization', bearer(stranger)).expect(404);
    const missing = await request(t.http).get('/api/projects/00000000-0000-4000-8000-000000000000').set('authorization', bearer(stranger)).expect(404);
    expect(outsider.body).toEqual(missing.body);
    await request(t.http).get(`/api/projects/${projectId}`).set('authorization', bearer(admin)).expect(404);
  });

  it('invitation round trip: e-mail through the fake SMTP server, register on accept, read the project, owner told', async () => {
    const invite = await request(t.http).post(`/api/projects/${projectId}/invitations`).set('authorization', bearer(owner)).send({ email: 'Lena.Quartz@example.org', role: 'reviewer' }).expect(201);
    expect(invite.body).toMatchObject({ email: 'lena.quartz@example.org', role: 'reviewer', state: 'pending', mailSent: true });
    expect(JSON.stringify(invite.body)).not.toMatch(/token/i);

    const [mail] = await mailTo('lena.quartz@example.org');
    expect(mail!.subject).toBe('Mira Fold invites you to "Ring exchange survey" on Phasewright');
    expect(mail!.text).toContain('as reviewer');
    expect(mail!.html).toContain('Mira Fold invites you to join the project &quot;Ring exchange survey&quot;');
    const link = mail!.links.find((l) => l.startsWith('http://127.0.0.1:8080/invitations/accept#token='))!;
    const token = tokenOf(link);
    // Stored hashed only.
    expect(await rows('SELECT id FROM invitations WHERE token_hash = SHA2(?, 256)', [token])).toHaveLength(1);
    expect(await rows('SELECT id FROM invitations WHERE token_hash = ?', [token])).toHaveLength(0);

    const preview = await request(t.http).post('/api/invitations/preview').send({ token }).expect(200);
    expect(preview.body).toMatchObject({ projectName: 'Ring exchange survey', role: 'reviewer', email: 'lena.quartz@example.org', invitedBy: 'Mira Fold', accountExists: false });

    const noName = await request(t.http).post('/api/invitations/accept').send({ token, password: 'mossy-anchor-6021' }).expect(400);
    expect(noName.body.details).toEqual([{ path: 'displayName', problems: ['displayName is needed to create an account (or sign in first)'] }]);

    const accepted = await request(t.http).post('/api/invitations/accept').send({ token, displayName: 'Lena Quartz', password: 'mossy-anchor-6021' }).expect(200);
    expect(accepted.body).toMatchObject({ projectId, role: 'reviewer' });
    const lena = accepted.body.session as Session;
    expect(lena.user.email).toBe('lena.quartz@example.org');

    const read = await request(t.http).get(`/api/projects/${projectId}`).set('authorization', bearer(lena)).expect(200);
    expect(read.body).toMatchObject({ name: 'Ring exchange survey', myRole: 'reviewer' });
    const members = await request(t.http).get(`/api/projects/${projectId}/members`).set('authorization', bearer(lena)).expect(200);
    expect(members.body.map((m: { email: string; role: string }) => [m.email, m.role])).toEqual([
      ['mira.fold@example.org', 'owner'],
      ['lena.quartz@example.org', 'reviewer'],
    ]);

    // Single use.
    const again = await request(t.http).post('/api/invitations/accept').send({ token, displayName: 'Lena Again', password: 'mossy-anchor-6021' }).expect(400);
    expect(again.body.details[0].path).toBe('token');
    const listed = await request(t.http).get(`/api/projects/${projectId}/invitations`).set('authorization', bearer(owner)).expect(200);
    expect(listed.body[0]).toMatchObject({ email: 'lena.quartz@example.org', state: 'accepted' });

    const [notice] = await mailTo('mira.fold@example.org');
    expect(notice!.subject).toBe('Lena Quartz joined "Ring exchange survey"');
    expect(notice!.links).toContain(`http://127.0.0.1:8080/projects/${projectId}`);
  });

  it('an existing account accepts while signed in with the invited address; others are turned away', async () => {
    await request(t.http).post(`/api/projects/${projectId}/invitations`).set('authorization', bearer(owner)).send({ email: 'otto.vane@example.org', role: 'editor' }).expect(201);
    const token = tokenOf((await mailTo('otto.vane@example.org'))[0]!.links[0]!);
    expect((await request(t.http).post('/api/invitations/preview').send({ token }).expect(200)).body.accountExists).toBe(true);

    const anonymous = await request(t.http).post('/api/invitations/accept').send({ token, displayName: 'Fake Otto', password: 'mossy-anchor-6021' }).expect(409);
    expect(anonymous.body.details).toEqual({ reason: 'account_exists' });
    const wrongPerson = await request(t.http).post('/api/invitations/accept').set('authorization', bearer(admin)).send({ token }).expect(403);
    expect(wrongPerson.body.details).toEqual({ reason: 'email_mismatch' });
    const badToken = await request(t.http).post('/api/invitations/accept').set('authorization', 'Bearer garbage').send({ token }).expect(401);
    expect(badToken.body.details).toEqual({ reason: 'token_invalid' });

    await request(t.http).post('/api/invitations/accept').set('authorization', bearer(stranger)).send({ token }).expect(200);
    expect((await request(t.http).get(`/api/projects/${projectId}`).set('authorization', bearer(stranger)).expect(200)).body.myRole).toBe('editor');
  });

  it('a withdrawn invitation link stops working; inviting a member is a 409', async () => {
    const inv = await request(t.http).post(`/api/projects/${projectId}/invitations`).set('authorization', bearer(owner)).send({ email: 'pia.loom@example.org', role: 'viewer' }).expect(201);
    const token = tokenOf((await mailTo('pia.loom@example.org'))[0]!.links[0]!);
    await request(t.http).delete(`/api/projects/${projectId}/invitations/${inv.body.id}`).set('authorization', bearer(owner)).expect(204);
    await request(t.http).post('/api/invitations/preview').send({ token }).expect(400);
    const dup = await request(t.http).post(`/api/projects/${projectId}/invitations`).set('authorization', bearer(owner)).send({ email: 'otto.vane@example.org', role: 'viewer' }).expect(409);
    expect(dup.body.details).toEqual({ reason: 'already_member' });
  });

  it('an expired invitation link is refused', async () => {
    await request(t.http).post(`/api/projects/${projectId}/invitations`).set('authorization', bearer(owner)).send({ email: 'ivo.slate@example.org', role: 'viewer' }).expect(201);
    const token = tokenOf((await mailTo('ivo.slate@example.org'))[0]!.links[0]!);
    await db.sequelize.query('UPDATE invitations SET expires_at = NOW(3) - INTERVAL 1 SECOND WHERE token_hash = SHA2(?, 256)', { replacements: [token] });
    const res = await request(t.http).post('/api/invitations/accept').send({ token, displayName: 'Ivo Slate', password: 'mossy-anchor-6021' }).expect(400);
    expect(res.body.details[0].path).toBe('token');
    expect(await rows("SELECT id FROM users WHERE email = 'ivo.slate@example.org'")).toHaveLength(0);
  });

  it('keeps at least one owner: the last owner can neither be demoted nor leave', async () => {
    const demote = await request(t.http).patch(`/api/projects/${projectId}/members/${owner.user.id}`).set('authorization', bearer(owner)).send({ role: 'editor' }).expect(409);
    expect(demote.body.details).toEqual({ reason: 'last_owner' });
    await request(t.http).delete(`/api/projects/${projectId}/members/${owner.user.id}`).set('authorization', bearer(owner)).expect(409);

    // With a second owner both work.
    await request(t.http).patch(`/api/projects/${projectId}/members/${stranger.user.id}`).set('authorization', bearer(owner)).send({ role: 'owner' }).expect(200);
    const demoted = await request(t.http).patch(`/api/projects/${projectId}/members/${owner.user.id}`).set('authorization', bearer(stranger)).send({ role: 'viewer' }).expect(200);
    expect(demoted.body).toMatchObject({ userId: owner.user.id, role: 'viewer' });
    // A viewer may leave but not remove others.
    const lenaId = (await rows<{ id: string }>("SELECT id FROM users WHERE email = 'lena.quartz@example.org'"))[0]!.id;
    await request(t.http).delete(`/api/projects/${projectId}/members/${lenaId}`).set('authorization', bearer(owner)).expect(403);
    await request(t.http).delete(`/api/projects/${projectId}/members/${owner.user.id}`).set('authorization', bearer(owner)).expect(204);
    await request(t.http).get(`/api/projects/${projectId}`).set('authorization', bearer(owner)).expect(404);
  });

  it('deletes a project only with a confirmation token for this project and this owner', async () => {
    const other = (await request(t.http).post('/api/projects').set('authorization', bearer(stranger)).send({ name: 'Scratch' }).expect(201)).body.id as string;
    const otherToken = (await request(t.http).post(`/api/projects/${other}/delete-confirmation`).set('authorization', bearer(stranger)).expect(200)).body.confirmationToken;

    const none = await request(t.http).delete(`/api/projects/${projectId}`).set('authorization', bearer(stranger)).send({}).expect(400);
    expect(none.body.details[0].path).toBe('confirmationToken');
    const foreign = await request(t.http).delete(`/api/projects/${projectId}`).set('authorization', bearer(stranger)).send({ confirmationToken: otherToken }).expect(400);
    expect(foreign.body.message).toMatch(/another project/);

    const step1 = await request(t.http).post(`/api/projects/${projectId}/delete-confirmation`).set('authorization', bearer(stranger)).expect(200);
    expect(step1.body.projectName).toBe('Ring exchange survey');
    await request(t.http).delete(`/api/projects/${projectId}`).set('authorization', bearer(stranger)).send({ confirmationToken: step1.body.confirmationToken }).expect(204);
    await request(t.http).get(`/api/projects/${projectId}`).set('authorization', bearer(stranger)).expect(404);
    expect(await rows('SELECT * FROM memberships WHERE project_id = ?', [projectId])).toEqual([]);
    expect(await rows('SELECT * FROM invitations WHERE project_id = ?', [projectId])).toEqual([]);
  });
});
