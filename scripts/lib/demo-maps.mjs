// The demo project's first map, so that a new user who opens it finds a phase map to look at, review
// and compare against. Computed once, on the first `npm start` whose demo project has no map, with
// physics-core in this process, and handed to the running server through its own sync push, signed
// in as the demo editor: the server stores and merges it exactly as a map from the app. Invented
// model and numbers of our own (see db/seeders/0001-demo-accounts.mjs for the scenario). Nothing but
// Node built-ins at the top: scripts/start.mjs imports this before dependencies are installed.
import { randomUUID } from 'node:crypto';
import os from 'node:os';

/** Hardcore bosons on a 12-site kagome strip at half filling: −J hops, conditional second-neighbour hops −g·e^{i·turn·θ} through an occupied common neighbour, V n n. */
export const DEMO_MODEL = {
  spec: 'phasewright.model/1',
  name: 'kagome strip, conditional second-neighbour hops',
  lattice: { kind: 'kagome', size: [4, 1], boundary: ['periodic', 'open'] },
  particles: { kind: 'hardcore', filling: 0.5 },
  parameters: { J: 1, g: 0.5, theta: 'pi/2', V: 1 },
  terms: [
    { kind: 'hop', neighbors: 1, amplitude: '-J' },
    { kind: 'conditional-hop', neighbors: 2, legs: 'nn', via: 'common-neighbor', when: 'occupied', amplitude: '-g', phase: 'turn*theta' },
    { kind: 'interaction', neighbors: 1, amplitude: 'V' },
  ],
};

/** ED on the 12-site strip over (g, θ), refined once where neighbouring labels differ. */
export const DEMO_SWEEP = {
  spec: 'phasewright.sweep/1',
  name: 'kagome strip: g × theta (ED, 12 sites)',
  model: DEMO_MODEL,
  axes: [
    { parameter: 'g', kind: 'linear', from: 0, to: 1.5, points: 7 },
    { parameter: 'theta', kind: 'linear', from: 0, to: Math.PI, points: 7 },
  ],
  method: 'ed',
  solver: { states: 2 },
  seed: 1,
  refine: { maxDepth: 1, on: ['label'] },
};

/**
 * One API call. A kept-alive connection that the server closed while the map was being computed
 * fails at once ("other side closed"); the call is then made once more on a new connection, which
 * is safe here: the reads change nothing and a push with the same batch id is stored once.
 */
async function call(baseUrl, path, { method = 'GET', token, body } = {}) {
  const request = () =>
    fetch(`${baseUrl}${path}`, {
      method,
      headers: { ...(token ? { authorization: `Bearer ${token}` } : {}), ...(body ? { 'content-type': 'application/json' } : {}) },
      ...(body ? { body: JSON.stringify(body) } : {}),
    });
  const res = await request().catch((err) => {
    if (err?.cause?.code === 'UND_ERR_SOCKET') return request();
    throw err;
  });
  const text = await res.text();
  if (!res.ok) throw new Error(`${method} ${path}: ${res.status} ${text.slice(0, 300)}`);
  return text ? JSON.parse(text) : null;
}

/**
 * Adds the demo map when the demo project has none. Returns what it did, in one line.
 * @param {string} baseUrl the running server
 * @param {{ email: string, password: string }} editor a demo account with the editor role
 */
export async function ensureDemoMap(baseUrl, editor) {
  // Imported here, not at the top: `npm start` loads this file before it installs the dependencies.
  const { DEMO_PROJECT } = await import('../../db/seeders/0001-demo-accounts.mjs');
  const session = await call(baseUrl, '/api/auth/sign-in', { method: 'POST', body: editor });
  const token = session.accessToken;
  const projects = await call(baseUrl, '/api/projects', { token });
  const project = projects.find((p) => p.name === DEMO_PROJECT.name);
  if (!project) return 'no demo project (was the seed run?)';
  const maps = await call(baseUrl, `/api/projects/${project.id}/maps`, { token });
  if (maps.length > 0) return `the demo project has ${maps.length} map${maps.length === 1 ? '' : 's'} already`;

  const { InProcessExecutor, runSweep, solvePoint } = await import('@phasewright/physics-core');
  const t0 = performance.now();
  const { map } = await runSweep(DEMO_SWEEP, {
    executor: new InProcessExecutor(solvePoint),
    runtime: { kind: 'node', version: process.version, cores: os.availableParallelism() },
    author: session.user.displayName,
  });
  const seconds = (performance.now() - t0) / 1000;
  const modelId = randomUUID();
  const sweepId = randomUUID();
  const mapId = randomUUID();
  await call(baseUrl, `/api/projects/${project.id}/sync/push`, {
    method: 'POST',
    token,
    body: {
      batchId: randomUUID(),
      changes: [
        { kind: 'model', id: modelId, data: { name: DEMO_MODEL.name, spec: DEMO_MODEL } },
        { kind: 'sweep', id: sweepId, data: { name: DEMO_SWEEP.name, modelId, mapId, spec: DEMO_SWEEP } },
        { kind: 'map', id: mapId, data: map },
      ],
    },
  });
  return `demo map computed (${Object.keys(map.points).length} ED points in ${seconds.toFixed(1)} s) and pushed as ${session.user.displayName}`;
}
