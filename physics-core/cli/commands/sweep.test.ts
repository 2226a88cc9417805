/**
 * The command line as a user runs it (a child process, real ED): a sweep killed mid-way and
 * resumed loses and repeats no point; spot-check passes on a true map and fails on a tampered
 * one; export writes one CSV row per point; bad input ends with one line and a non-zero code.
 */
import { spawn, spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { parseMapText } from '../../src/maps/map-format.js';
import { chainModel, chainSweep } from '../../src/sweep/fake-solver.js';
import { planSweep } from '../../src/sweep/plan.js';
import { mapToCsv } from './export.js';
import { sweepCommand } from './sweep.js';

const bin = fileURLToPath(new URL('../../bin/phasewright.mjs', import.meta.url));
const dir = mkdtempSync(join(tmpdir(), 'phasewright-cli-'));
const run = (args: string[]) => spawnSync(process.execPath, [bin, ...args], { encoding: 'utf8', env: { ...process.env, PHASEWRIGHT_POINT_SOLVER: '' } });
const pointsIn = (file: string): number => {
  try {
    return Object.keys(parseMapText(readFileSync(file, 'utf8')).points).length;
  } catch {
    return 0; // not written yet
  }
};

describe('phasewright sweep / spot-check (child process, real ED) and export', () => {
  const sweep = chainSweep({ model: chainModel(12), axes: [{ parameter: 'V', kind: 'linear', from: 0, to: 6, points: 41 }] });
  const sweepFile = join(dir, 'cut.json');
  const mapFile = join(dir, 'cut.map.json');
  writeFileSync(sweepFile, JSON.stringify(sweep));

  it('a killed run resumes with no point lost or duplicated', async () => {
    const child = spawn(process.execPath, [bin, 'sweep', sweepFile, '--out', mapFile, '--workers', '1', '--save-every', '0'], { stdio: 'ignore' });
    // Kill (SIGKILL: no chance to clean up) once a few points are on disk.
    const saved = await new Promise<number>((resolve, reject) => {
      const timer = setInterval(() => {
        const n = existsSync(mapFile) ? pointsIn(mapFile) : 0;
        if (n >= 5) {
          clearInterval(timer);
          child.kill('SIGKILL');
          resolve(n);
        }
      }, 20);
      child.on('exit', () => {
        clearInterval(timer);
        reject(new Error('the sweep finished before it could be killed'));
      });
    });
    await new Promise((r) => child.once('exit', r));
    const before = pointsIn(mapFile);
    expect(before).toBeGreaterThanOrEqual(saved);
    expect(before).toBeLessThan(41);
    // Without --resume the map is not overwritten (checked in-process: no child needed).
    await expect(sweepCommand(sweepFile, { out: mapFile, refine: true, saveEvery: '5' })).rejects.toThrow(
      `${mapFile} exists; pass --resume to continue it, or choose another --out`,
    );
    const resumed = run(['sweep', sweepFile, '--out', mapFile, '--workers', '2', '--resume']);
    expect(resumed.status).toBe(0);
    expect(resumed.stderr).toContain(`${41 - before} points computed, ${before} resumed, 0 failed; 41 points`);
    const map = parseMapText(readFileSync(mapFile, 'utf8'));
    expect(Object.keys(map.points).sort()).toEqual(planSweep(sweep).items.map((i) => i.key).sort());
    expect(map.provenance.sources).toHaveLength(2); // the killed run and the resumed one
    expect(map.provenance.finishedAt).toBeDefined();
  }, 120_000);

  it('spot-check passes on the map and fails on a tampered copy; export writes CSV', () => {
    const lines = mapToCsv(parseMapText(readFileSync(mapFile, 'utf8'))).trim().split('\n');
    expect(lines).toHaveLength(42);
    expect(lines[0].split(',')).toEqual(expect.arrayContaining(['V', 'energy', 'fidelitySusceptibility', 'energyPerSite']));
    const ok = run(['spot-check', mapFile, '--sample', '3', '--seed', '5', '--workers', '1']);
    expect(ok.status).toBe(0);
    expect(ok.stdout).toMatch(/labels agree: \d+\/\d+/);
    expect(ok.stdout.trim().split('\n').at(-1)).toMatch(/^PASS: 3 reproduced within 1e-8; \d+\/\d+ labels agree$/);
    const map = JSON.parse(readFileSync(mapFile, 'utf8'));
    for (const p of Object.values(map.points) as { energy: number }[]) p.energy += 1e-6;
    const bad = join(dir, 'tampered.json');
    writeFileSync(bad, JSON.stringify(map));
    const fail = run(['spot-check', bad, '--sample', '2', '--workers', '1']);
    expect(fail.status).toBe(1);
    expect(fail.stderr).toMatch(/^phasewright: FAIL: 0 reproduced within 1e-8, 2 differ;/);
    expect(fail.stdout).toMatch(/^differs: V=[^:]+: relative \|ΔE\| = \d\.\d\de-\d > 1e-8$/m);
  }, 120_000);

  it('bad input: one line, non-zero exit', async () => {
    await expect(sweepCommand(join(dir, 'nope.json'), { out: join(dir, 'x.json'), refine: true, saveEvery: '5' })).rejects.toThrow(/nope\.json: no such file$/);
    writeFileSync(join(dir, 'bad.json'), JSON.stringify({ ...sweep, axes: [{ parameter: 'U', kind: 'linear', from: 0, to: 1, points: 2 }] }));
    const bad = run(['merge', mapFile, join(dir, 'bad.json'), '--out', join(dir, 'y.json')]);
    expect(bad.status).toBe(1);
    expect(bad.stderr.trim().split('\n')).toEqual([`phasewright: ${join(dir, 'bad.json')}: $.spec: must be "phasewright.map/1" (got "phasewright.sweep/1")`]);
  }, 60_000);
});
