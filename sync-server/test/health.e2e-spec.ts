import type { NestExpressApplication } from '@nestjs/platform-express';
import { CORE_VERSION } from '@phasewright/physics-core';
import fs from 'node:fs';
import path from 'node:path';
import request from 'supertest';
import { createApp } from '../src/app.js';
import { type AppConfig, loadConfig } from '../src/config/app-config.js';
import { serverVersion } from '../src/config/repo-paths.js';
import { unusedPort } from './support/free-port.js';
import { createTestDatabase, type TestDatabase } from './support/test-database.js';

const ERROR_FIELDS = ['details', 'error', 'message', 'statusCode'];

async function appFor(db: AppConfig['db'], pwaDist?: string): Promise<NestExpressApplication> {
  const base = loadConfig();
  const app = await createApp({ ...base, pwaDist: pwaDist ?? base.pwaDist, db }, { logger: false });
  await app.init();
  return app;
}

describe('GET /api/health against the private MariaDB', () => {
  let testDb: TestDatabase;
  let app: NestExpressApplication;

  beforeAll(async () => {
    testDb = await createTestDatabase();
    app = await appFor(testDb.config);
  });

  afterAll(async () => {
    await app?.close();
    await testDb?.drop();
  });

  it('reports the database up with the schema the migrations wrote', async () => {
    const res = await request(app.getHttpServer()).get('/api/health').expect(200);
    expect(res.body.status).toBe('ok');
    expect(res.body.database.status).toBe('up');
    expect(res.body.database.schema).toBe('phasewright/1');
    expect(res.body.database.latencyMs).toBeGreaterThanOrEqual(0);
    expect(res.body.database.error).toBeUndefined();
    expect(res.body.server.version).toBe(serverVersion);
    expect(res.body.server.node).toBe(process.version);
    expect(res.body.core.version).toBe(CORE_VERSION);
  });

  it('reads the value from the database on every call (not a cached constant)', async () => {
    const marker = `probe-${process.pid}-${Date.now()}`;
    await testDb.sequelize.query("UPDATE schema_info SET value = ? WHERE name = 'schema'", { replacements: [marker] });
    const res = await request(app.getHttpServer()).get('/api/health').expect(200);
    expect(res.body.database.schema).toBe(marker);
    await testDb.sequelize.query("UPDATE schema_info SET value = 'phasewright/1' WHERE name = 'schema'");
  });
});

describe('GET /api/health for a database that is reachable but not migrated', () => {
  it('says up, schema null, overall degraded', async () => {
    const bare = await createTestDatabase({ migrated: false });
    const app = await appFor(bare.config);
    try {
      const res = await request(app.getHttpServer()).get('/api/health').expect(200);
      expect(res.body.status).toBe('degraded');
      expect(res.body.database.status).toBe('up');
      expect(res.body.database.schema).toBeNull();
      expect(res.body.database.error).toMatch(/not migrated/);
    } finally {
      await app.close();
      await bare.drop();
    }
  });
});

describe('GET /api/health with no database listening', () => {
  let app: NestExpressApplication;
  let port: number;

  beforeAll(async () => {
    port = await unusedPort();
    // The app must boot although nothing answers on this port.
    app = await appFor({ ...loadConfig().db, port });
  });

  afterAll(async () => {
    await app?.close();
  });

  it('keeps answering and reports the database down with the reason', async () => {
    const res = await request(app.getHttpServer()).get('/api/health').expect(200);
    expect(res.body.status).toBe('degraded');
    expect(res.body.database.status).toBe('down');
    expect(res.body.database.schema).toBeNull();
    expect(res.body.database.error).toMatch(/ECONNREFUSED|connect/i);
    expect(res.body.server.version).toBe(serverVersion);
  });

  it('still serves other routes (API docs) while the database is down', async () => {
    const res = await request(app.getHttpServer()).get('/api/docs-json').expect(200);
    expect(Object.keys(res.body.paths)).toContain('/api/health');
  });

  it('answers a route that needs the database with 503 "database unavailable, retry" while it is down', async () => {
    const res = await request(app.getHttpServer()).post('/api/auth/sign-in').send({ email: 'nobody@example.org', password: 'quartz-meadow-5512' }).expect(503);
    expect(res.body).toMatchObject({ statusCode: 503, error: 'Service Unavailable', details: { reason: 'database-unavailable' } });
    expect(res.body.message).toMatch(/^Database unavailable .*retry/);
    expect(res.headers['retry-after']).toBe('5');
  });
});

describe('error shape and static PWA', () => {
  let app: NestExpressApplication;
  const pwaDist = loadConfig().pwaDist;
  const hasPwa = fs.existsSync(path.join(pwaDist, 'index.html'));

  beforeAll(async () => {
    // No database needed here: point at a port where nothing listens.
    app = await appFor({ ...loadConfig().db, port: await unusedPort() });
  });

  afterAll(async () => {
    await app?.close();
  });

  it('answers an unknown /api route with a JSON 404 in the one error shape (never index.html)', async () => {
    const res = await request(app.getHttpServer()).get('/api/no-such-route/xyz').expect(404);
    expect(res.headers['content-type']).toMatch(/application\/json/);
    expect(Object.keys(res.body).sort()).toEqual(ERROR_FIELDS);
    expect(res.body).toMatchObject({ statusCode: 404, error: 'Not Found', details: null });
    expect(res.body.message).toContain('/api/no-such-route/xyz');
  });

  it('answers malformed JSON with a 400 in the one error shape', async () => {
    const res = await request(app.getHttpServer())
      .post('/api/health')
      .set('content-type', 'application/json')
      .send('{"name": ')
      .expect(400);
    expect(Object.keys(res.body).sort()).toEqual(ERROR_FIELDS);
    expect(res.body.error).toBe('Bad Request');
  });

  it('sets security headers (helmet)', async () => {
    const res = await request(app.getHttpServer()).get('/api/health');
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['content-security-policy']).toContain("default-src 'self'");
    expect(res.headers['content-security-policy']).not.toContain('upgrade-insecure-requests');
  });

  it('rejects a body above the size limit with 413 in the one error shape', async () => {
    const small = await createApp({ ...loadConfig(), bodyLimit: '1kb', db: { ...loadConfig().db, port: await unusedPort() } }, { logger: false });
    await small.init();
    try {
      const res = await request(small.getHttpServer())
        .post('/api/health')
        .set('content-type', 'application/json')
        .send(JSON.stringify({ text: 'x'.repeat(4096) }))
        .expect(413);
      expect(Object.keys(res.body).sort()).toEqual(ERROR_FIELDS);
      // The message names the size, the limit (1kb = 1024 bytes) and the setting that raises it.
      const size = Buffer.byteLength(JSON.stringify({ text: 'x'.repeat(4096) }));
      expect(res.body.message).toBe(
        `The request body is ${size} bytes (${(size / 1024).toFixed(1)} KiB), but it is over the server's limit of 1024 bytes (1.0 KiB) per request, set by PW_BODY_LIMIT: ` +
          'send less per request (map sync: push the points in several batches) or raise PW_BODY_LIMIT on the server',
      );
      expect(res.body.details).toEqual({ type: 'entity.too.large', limit: 1024, bytes: size, setting: 'PW_BODY_LIMIT' });
    } finally {
      await small.close();
    }
  });

  const pwaTitle = hasPwa
    ? 'serves the PWA at / and index.html for client routes like /maps/xyz'
    : `SKIPPED: no built PWA at ${pwaDist} (run \`npm run build -w pwa\`), so the history fallback is not checked`;
  (hasPwa ? it : it.skip)(pwaTitle, async () => {
    const index = fs.readFileSync(path.join(pwaDist, 'index.html'), 'utf8');
    const root = await request(app.getHttpServer()).get('/').expect(200);
    expect(root.text).toBe(index);
    const client = await request(app.getHttpServer()).get('/maps/xyz').expect(200);
    expect(client.headers['content-type']).toMatch(/text\/html/);
    expect(client.text).toBe(index);
  });
});
