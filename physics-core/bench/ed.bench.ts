/**
 * Exact-diagonalization benchmark (prints figures; no assertions):
 * zigzag strip, half filling, plain hops between the legs (`zig`), conditional hops along the
 * legs through the opposite site with phase turn·θ, nearest interactions, periodic.
 *
 *   npm run bench:ed [-- --sizes 16,20,24] [-- --full] [-- --compare]   (sizes count SITES; the cell holds two)
 *
 * By default the solver's momentum sectors are used (the model is translation invariant);
 * --full also solves every size on the full fixed-number basis, after the sector runs;
 * --compare (with --full) also times CSR against matrix-free products (skipped above 20 sites).
 */
import { compileModel } from '../src/model/compile.js';
import type { ModelSpec } from '../src/model/types.js';
import { EdOperator, estimateOperator } from '../src/operators/ed-operator.js';
import { EdSolver } from '../src/ed/solve-ed.js';

function spec(sites: number): ModelSpec {
  return {
    spec: 'phasewright.model/1',
    name: `benchmark zigzag, ${sites} sites`,
    lattice: { kind: 'zigzag', size: [sites / 2], boundary: ['periodic'], twist: [0] },
    particles: { kind: 'hardcore', filling: 0.5 },
    parameters: { J: 1, g: 0.5, theta: 'pi/2', V: 0.5 },
    terms: [
      { kind: 'hop', class: 'zig', amplitude: '-J' },
      { kind: 'conditional-hop', class: 'leg', legs: 'zig', via: 'common-neighbor', when: 'empty', amplitude: '-g', phase: 'turn*theta' },
      { kind: 'interaction', neighbors: 1, amplitude: 'V' },
    ],
  };
}

function arg(name: string): string | undefined {
  const i = process.argv.indexOf(name);
  return i >= 0 ? process.argv[i + 1] : undefined;
}

const sizes = (arg('--sizes') ?? '16,20,24').split(',').map(Number);
const compare = process.argv.includes('--compare');
const mb = (b: number): string => `${(b / 2 ** 20).toFixed(0)} MB`;
const ms = (x: number): string => `${x.toFixed(0)} ms`;

/** A fixed reference workload (a dependent sum over 16 MB), best of 5: compare runs on a loaded machine by it. */
function calibrationMs(): number {
  const a = new Float64Array(2 ** 21).fill(1);
  let best = Infinity;
  for (let rep = 0; rep < 5; rep++) {
    const t = performance.now();
    let s = 0;
    for (let i = 0; i < a.length; i++) s += a[i];
    if (s !== a.length) throw new Error('calibration sum is wrong');
    best = Math.min(best, performance.now() - t);
  }
  return best;
}

console.log(
  `node ${process.version}; one thread; load average ${(await import('node:os')).loadavg().map((x) => x.toFixed(1)).join(' ')}; ` +
    `reference sum of 2^21 doubles ${calibrationMs().toFixed(2)} ms (a fixed workload: compare runs by it; larger means other processes slowed this run)`,
);
const full = process.argv.includes('--full');

function run(L: number, symmetry: 'auto' | 'none'): void {
  const model = compileModel(spec(L));
  const est = estimateOperator(model);
  const t0 = performance.now();
  const cpu0 = process.cpuUsage();
  const solver = new EdSolver({ states: 2, symmetry });
  const { result, operator } = solver.solve(model);
  const total = performance.now() - t0;
  const cpu = process.cpuUsage(cpu0);
  const cpuMs = (cpu.user + cpu.system) / 1000;
  const extras = result.extras as {
    timing: { operatorMs: number; lanczosMs: number; observablesMs: number };
    verificationIterations: number;
    eigenFallbacks: number;
    secondPassIterations: number;
    storage: string;
    operatorBytes: number;
    symmetry: {
      kind: string;
      groundMomentum?: string[];
      sectorRuns?: { momentum: number[]; dimension: number; iterations: number; abandoned: boolean }[];
      matvecMs?: number;
      matvecEntries?: number;
    };
  };
  const groundMs = extras.timing.operatorMs + extras.timing.lanczosMs;
  const lines = [
    `L=${L} (${symmetry === 'auto' ? 'momentum sectors when translation invariant' : 'full basis'})`,
    `dim=${est.dimension}`,
    `nnz=${est.nnz}`,
    `storage=${extras.storage} (${mb(extras.operatorBytes)})`,
    `build=${ms(extras.timing.operatorMs)}`,
  ];
  if (operator) {
    const x = new Float64Array(2 * operator.dimension).fill(0.5);
    const y = new Float64Array(2 * operator.dimension);
    operator.matvec(x, y);
    const reps = L >= 24 ? 3 : 10;
    const t = performance.now();
    for (let r = 0; r < reps; r++) operator.matvec(x, y);
    const matvec = (performance.now() - t) / reps;
    lines.push(`matvec=${matvec.toFixed(1)} ms (${((matvec * 1e6) / est.nnz).toFixed(2)} ns per off-diagonal nonzero, ${((est.nnz + operator.dimension) / (matvec / 1000) / 1e6).toFixed(0)} M nonzeros/s)`);
    if (compare && L <= 20) {
      const free = new EdOperator(model, { storage: 'matrix-free' });
      free.matvec(x, y);
      const t2 = performance.now();
      for (let r = 0; r < reps; r++) free.matvec(x, y);
      const mf = (performance.now() - t2) / reps;
      lines.push(`matrix-free matvec=${mf.toFixed(1)} ms vs CSR ${matvec.toFixed(1)} ms (operator ${mb(free.bytes)} vs ${mb(operator.bytes)})`);
    }
  }
  const runs = extras.symmetry.sectorRuns;
  const { matvecMs, matvecEntries } = extras.symmetry;
  if (runs && matvecMs !== undefined && matvecEntries !== undefined) {
    lines.push(
      `matvec on sector blocks=${(matvecMs / result.convergence.iterations).toFixed(2)} ms per product on average, ` +
        `${((matvecMs * 1e6) / matvecEntries).toFixed(2)} ns per stored entry (${(matvecEntries / (matvecMs / 1000) / 1e6).toFixed(0)} M entries/s; ${ms(matvecMs)} of the Lanczos time)`,
    );
  }
  if (runs) {
    lines.push(
      `sectors=${runs.length}: ` +
        runs.map((r) => `k=${r.momentum.join(',')} dim ${r.dimension} ${r.iterations} H·x${r.abandoned ? ' (abandoned)' : ''}`).join('; '),
    );
  }
  lines.push(
    `lanczos=${ms(extras.timing.lanczosMs)} (${result.convergence.iterations} H·x${runs ? ' on sector blocks' : ''}: ${extras.verificationIterations} in the degeneracy check, ${extras.secondPassIterations} recomputing vectors that did not fit; ${extras.eigenFallbacks} fallbacks, residual ${result.convergence.residual.toExponential(1)}, converged ${result.convergence.converged})`,
    `ground state (build+Lanczos)=${ms(groundMs)}`,
    `observables=${ms(extras.timing.observablesMs)}`,
    `total=${ms(total)} wall, ${ms(cpuMs)} CPU (wall exceeds CPU when other processes share the cores)`,
    `E0=${result.energy.toFixed(10)} gap=${result.gap?.toFixed(6)}${extras.symmetry.groundMomentum ? ` ground momentum k·L/2π=${extras.symmetry.groundMomentum.join(',')}` : ''}`,
    `peak RSS so far=${mb(process.resourceUsage().maxRSS * 1024)}`,
  );
  console.log(lines.join('\n  '));
}

for (const L of sizes) {
  if (!Number.isInteger(L) || L % 2 !== 0 || L < 4) throw new Error(`--sizes: ${L} is not an even number of sites ≥ 4`);
  run(L, 'auto');
}
// The full basis afterwards (its larger peak memory would otherwise hide the sectors' figure).
if (full) for (const L of sizes) run(L, 'none');
