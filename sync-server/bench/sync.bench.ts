/**
 * `npm run bench:sync`: push and pull of a 10,000-point map over loopback HTTP against the private
 * MariaDB (a throw-away database). Prints seconds and rows per second for: the first push (all
 * points new), a second push of the same points from another client (the merge path), and a
 * paged pull of everything. Target (issue 7): each under 2 s.
 *
 * Each figure also gives the CPU seconds of this process (server and client share it), which say
 * more than wall time on a shared, loaded machine. PW_BENCH_VERBOSE=1 prints the server's own
 * timings (checks; load, merge, canonical texts + hashes, write) as well.
 *
 * The server is the built one (`dist/`, emitted by tsc with decorator metadata, which Nest's
 * injection needs); the script builds physics-core and the server first. The points are TEST
 * FIXTURES: closed-form numbers shaped like real points (energies, 12 site densities, S(q) rows),
 * not solver output.
 */
import { randomUUID } from 'node:crypto';
import type { AddressInfo } from 'node:net';
import { createMap, type MapPoint, type PhaseMap, planSweep, pointSeed, type SweepSpec } from '@phasewright/physics-core';
import { loadConfig } from '../src/config/app-config.js';
import { createTestDatabase } from '../test/support/test-database.js';

const N_SIDE = 100;
const sweep: SweepSpec = {
  spec: 'phasewright.sweep/1',
  name: 'bench grid',
  model: {
    spec: 'phasewright.model/1',
    name: 'zigzag strip, bench',
    lattice: { kind: 'zigzag', size: [6], boundary: ['periodic'] },
    particles: { kind: 'hardcore', filling: 0.5 },
    parameters: { J: 1, V: 1 },
    terms: [
      { kind: 'hop', class: 'zig', amplitude: '-J' },
      { kind: 'interaction', class: 'zig', amplitude: 'V' },
    ],
  },
  axes: [
    { parameter: 'V', kind: 'linear', from: 0, to: 4, points: N_SIDE },
    { parameter: 'J', kind: 'linear', from: 0.5, to: 1.5, points: N_SIDE },
  ],
  method: 'meanfield',
  seed: 11,
};

function fixtureMap(author: string): PhaseMap {
  const runtime = { kind: 'node' as const, version: process.version, cores: 1 };
  const map = createMap(sweep, runtime, author);
  for (const item of planSweep(sweep).items) {
    const { V, J } = item.parameters;
    const e = -3 * J + 0.25 * V + (author === 'client-b' ? 1e-3 : 0);
    const point: MapPoint = {
      parameters: item.parameters,
      level: 0,
      energy: e,
      observables: {
        energyPerSite: e / 12,
        densities: Array.from({ length: 12 }, (_, i) => 0.5 + (i % 2 ? -0.1 : 0.1) * Math.tanh(V - 2 * J)),
        structureFactor: [[0, 0, 0], [Math.PI, 0, 0.25 + V / 8]],
      },
      convergence: { converged: true, iterations: 40, residual: 1e-9, startsAtMinimum: 6, starts: 8 },
      wallMs: 3.5,
      seed: pointSeed(11, item.key),
      computed: { at: new Date().toISOString(), runtime, author },
      label: { id: V > 2 * J ? 'density-wave' : 'superfluid', confidence: 0.8, evidence: { fixture: true } },
    };
    map.points[item.key] = point;
  }
  return map;
}

async function main(): Promise<void> {
  // Built by the npm script before this runs (see the header).
  const { createApp } = (await import('../dist/src/app.js')) as typeof import('../src/app.js');
  const { loadAccountsConfig } = (await import('../dist/src/common/accounts-config.js')) as typeof import('../src/common/accounts-config.js');
  const db = await createTestDatabase();
  const publicUrl = 'http://127.0.0.1:8080';
  const defaults = loadAccountsConfig({ publicUrl }, {});
  // The fake SMTP server on any free port, so a running dev server's port 2525 is left alone.
  const accounts = { ...defaults, mail: { ...defaults.mail, smtpPort: 0, fakeServer: true } };
  const app = await createApp({ ...loadConfig(), db: db.config, accounts, publicUrl: accounts.publicUrl, bodyLimit: '64mb' }, { logger: process.env.PW_BENCH_VERBOSE ? ['error', 'warn', 'log', 'verbose'] : ['error'] });
  await app.listen(0, '127.0.0.1');
  const base = `http://127.0.0.1:${(app.getHttpServer().address() as AddressInfo).port}/api`;
  const call = async (method: string, path: string, token: string | undefined, body?: unknown) => {
    const res = await fetch(`${base}${path}`, {
      method,
      headers: { 'content-type': 'application/json', ...(token ? { authorization: `Bearer ${token}` } : {}) },
      ...(body === undefined ? {} : { body: typeof body === 'string' ? body : JSON.stringify(body) }),
    });
    const json = (await res.json()) as Record<string, unknown>;
    if (!res.ok) throw new Error(`${method} ${path}: ${res.status} ${JSON.stringify(json).slice(0, 300)}`);
    return json;
  };
  try {
    const session = await call('POST', '/auth/register', undefined, { email: 'bench@example.org', displayName: 'Bench Runner', password: 'copper-lantern-4471' });
    const token = session.accessToken as string;
    const project = await call('POST', '/projects', token, { name: 'Bench' });
    const projectId = project.id as string;
    const rows = N_SIDE * N_SIDE;
    const lines: string[] = [];
    // CPU seconds of this process (server and client share it; all threads): the machine is shared,
    // so wall time alone says little. The database server's CPU is not included.
    const cpuSeconds = (since: NodeJS.CpuUsage) => {
      const u = process.cpuUsage(since);
      return (u.user + u.system) / 1e6;
    };
    const report = (what: string, seconds: number, bytes: number, cpu: number) => {
      lines.push(`${what.padEnd(44)} ${seconds.toFixed(3)} s (cpu ${cpu.toFixed(3)} s)   ${Math.round(rows / seconds).toLocaleString('en-US').padStart(9)} rows/s   ${(bytes / 1e6).toFixed(1)} MB`);
    };
    for (const [what, author] of [['push 10,000 new points (one batch)', 'client-a'], ['push 10,000 overlapping points (merge)', 'client-b']] as const) {
      const body = JSON.stringify({ batchId: randomUUID(), changes: [{ kind: 'map', id: randomUUID(), data: fixtureMap(author) }] });
      const t0 = performance.now();
      const c0 = process.cpuUsage();
      const res = await call('POST', `/projects/${projectId}/sync/push`, token, body);
      const s = (performance.now() - t0) / 1000;
      const cpu = cpuSeconds(c0);
      const points = (res.results as { points: { added: number; updated: number } }[])[0].points;
      if (points.added + points.updated !== rows) throw new Error(`expected ${rows} points written, got ${JSON.stringify(points)}`);
      report(what, s, Buffer.byteLength(body), cpu);
    }
    let after = 0;
    let pulled = 0;
    let bytes = 0;
    let pages = 0;
    const t0 = performance.now();
    const c0 = process.cpuUsage();
    for (;;) {
      const res = await fetch(`${base}/projects/${projectId}/sync/pull?after=${after}&limit=10000`, { headers: { authorization: `Bearer ${token}` } });
      const text = await res.text();
      bytes += text.length;
      const page = JSON.parse(text) as { changes: { kind: string; data: { points?: object } }[]; cursor: number; hasMore: boolean };
      pages++;
      for (const c of page.changes) if (c.kind === 'points') pulled += Object.keys(c.data.points ?? {}).length;
      after = page.cursor;
      if (!page.hasMore) break;
    }
    const s = (performance.now() - t0) / 1000;
    const cpu = cpuSeconds(c0);
    if (pulled !== rows) throw new Error(`pulled ${pulled} points, expected ${rows}`);
    report(`pull 10,000 points (${pages} page${pages > 1 ? 's' : ''} of ≤ 10,000 points)`, s, bytes, cpu);
    process.stdout.write(`sync bench (loopback, private MariaDB, Node ${process.version}; target < 2 s each; cpu = this process, server and client)\n${lines.join('\n')}\n`);
  } finally {
    await app.close();
    await db.drop();
  }
}

main().catch((error: unknown) => {
  process.stderr.write(`bench:sync failed: ${error instanceof Error ? (error.stack ?? error.message) : String(error)}\n`);
  process.exit(1);
});
