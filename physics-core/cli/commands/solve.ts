/**
 * `phasewright solve MODEL.json --method ed [--states k] [--set g=0.4 --set V=1]`
 *
 * Solves one model and prints one JSON Result (phasewright.result/1) on stdout. Bad input ends
 * with one line on stderr naming the file, the JSON path or the flag, and a non-zero exit.
 */
import type { Command } from 'commander';
import { PhasewrightError } from '../../src/errors.js';
import { parseModelSpec } from '../../src/model/validate.js';
import { solve } from '../../src/solve.js';
import { ED_OBSERVABLES, type EdObservable } from '../../src/ed/solve-ed.js';
import type { Method } from '../../src/result.js';
import type { SupercellSpec } from '../../src/meanfield/supercell.js';
import { inFile, readJsonFile } from '../io.js';

export interface SolveCommandOptions {
  method: string;
  states?: string;
  set: string[];
  tolerance?: string;
  seed?: string;
  memoryBudget?: string;
  observables?: string;
  symmetry?: string;
  reorthogonalize?: boolean;
  supercell?: string;
  starts?: string;
  mu?: string;
  pretty?: boolean;
}

/** `--supercell 2x1`, `2,2`, `sqrt3` or a JSON list of integer vectors such as `[[2,1],[-1,1]]`. */
export function parseSupercell(text: string): SupercellSpec {
  const t = text.trim();
  if (t === 'sqrt3') return 'sqrt3';
  if (t.startsWith('[')) {
    try {
      return JSON.parse(t) as SupercellSpec;
    } catch {
      throw new PhasewrightError(`--supercell: not valid JSON (got "${text}")`, 'usage');
    }
  }
  const counts = t.split(/[x,×]/).map((c) => number(c, '--supercell', (x) => Number.isInteger(x) && x >= 1, 'cell counts such as 2x1, or sqrt3'));
  return counts;
}

function number(text: string, flag: string, check: (x: number) => boolean, what: string): number {
  const x = Number(text);
  if (text.trim() === '' || !Number.isFinite(x) || !check(x)) {
    throw new PhasewrightError(`${flag} must be ${what} (got "${text}")`, 'usage');
  }
  return x;
}

/** Parses repeated `--set name=value` flags into numeric overrides. */
export function parseOverrides(sets: string[]): Record<string, number> {
  const overrides: Record<string, number> = {};
  for (const s of sets) {
    const eq = s.indexOf('=');
    if (eq <= 0) throw new PhasewrightError(`--set expects name=value (got "${s}")`, 'usage');
    const name = s.slice(0, eq).trim();
    overrides[name] = number(s.slice(eq + 1), `--set ${name}`, () => true, 'a number');
  }
  return overrides;
}

function symmetryOption(value: string): 'auto' | 'none' {
  if (value !== 'auto' && value !== 'none') throw new PhasewrightError(`--symmetry must be 'auto' or 'none' (got "${value}")`, 'usage');
  return value;
}

export function solveCommand(file: string, opts: SolveCommandOptions): string {
  const spec = inFile(file, () => parseModelSpec(readJsonFile(file)));
  const method = opts.method as Method;
  if (method !== 'ed' && method !== 'meanfield') {
    throw new PhasewrightError(`--method must be 'ed' or 'meanfield' (got "${opts.method}")`, 'usage');
  }
  const observables = opts.observables?.split(',').map((o) => o.trim()).filter(Boolean);
  for (const o of observables ?? []) {
    if (!ED_OBSERVABLES.includes(o as EdObservable)) {
      throw new PhasewrightError(`--observables: unknown '${o}' (known: ${ED_OBSERVABLES.join(', ')})`, 'usage');
    }
  }
  const ed = {
    ...(opts.states !== undefined ? { states: number(opts.states, '--states', (x) => Number.isInteger(x) && x >= 1, 'an integer ≥ 1') } : {}),
    ...(opts.tolerance !== undefined ? { tolerance: number(opts.tolerance, '--tolerance', (x) => x > 0 && x < 1, 'a number in (0, 1)') } : {}),
    ...(opts.seed !== undefined ? { seed: number(opts.seed, '--seed', Number.isInteger, 'an integer') } : {}),
    ...(opts.memoryBudget !== undefined
      ? { memoryBudgetBytes: number(opts.memoryBudget, '--memory-budget', (x) => x > 0, 'a positive number of bytes') }
      : {}),
    ...(observables ? { observables: observables as EdObservable[] } : {}),
    ...(opts.symmetry !== undefined ? { symmetry: symmetryOption(opts.symmetry) } : {}),
    ...(opts.reorthogonalize ? { reorthogonalize: true } : {}),
  };
  const meanfield = {
    ...(opts.supercell !== undefined ? { supercell: parseSupercell(opts.supercell) } : {}),
    ...(opts.starts !== undefined ? { starts: number(opts.starts, '--starts', (x) => Number.isInteger(x) && x >= 1, 'an integer ≥ 1') } : {}),
    ...(opts.mu !== undefined ? { mu: number(opts.mu, '--mu', () => true, 'a number') } : {}),
    ...(opts.seed !== undefined ? { seed: number(opts.seed, '--seed', Number.isInteger, 'an integer') } : {}),
  };
  const overrides = parseOverrides(opts.set);
  const result = inFile(file, () => solve(spec, { method, overrides, ed, meanfield }));
  return JSON.stringify(result, null, opts.pretty ? 2 : undefined);
}

export function registerSolve(program: Command): void {
  program
    .command('solve')
    .description('solve one model and print its result as JSON')
    .argument('<model>', 'model spec (phasewright.model/1) as a JSON file')
    .option('--method <method>', 'ed or meanfield', 'ed')
    .option('--states <k>', 'ED: lowest eigenstates to compute (≥ 2 gives the gap)')
    .option('--set <name=value>', 'override a parameter (repeatable)', (v: string, acc: string[]) => [...acc, v], [] as string[])
    .option('--tolerance <x>', 'ED: relative Lanczos residual')
    .option('--seed <n>', 'seed of the Lanczos start vector (ED) or of the random starts (mean-field)')
    .option('--memory-budget <bytes>', 'ED: memory budget in bytes (default 1.5 GiB)')
    .option('--observables <list>', `ED: comma-separated subset of ${ED_OBSERVABLES.join(',')}`)
    .option('--symmetry <mode>', 'ED: auto (momentum sectors when the model is translation invariant) or none (full basis)')
    .option('--reorthogonalize', 'ED: thick-restart Lanczos with full reorthogonalization (slower; a cross-check)')
    .option('--supercell <cells>', 'mean-field: supercell as 2x1, 2,2, sqrt3 or a JSON list of integer vectors')
    .option('--starts <n>', 'mean-field: number of starts (default 8)')
    .option('--mu <x>', 'mean-field: fixed chemical potential instead of the filling')
    .option('--pretty', 'indent the JSON')
    .action((file: string, opts: SolveCommandOptions) => {
      process.stdout.write(`${solveCommand(file, opts)}\n`);
    });
}
