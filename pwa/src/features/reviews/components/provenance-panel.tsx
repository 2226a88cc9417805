import { compileModel, type MapPoint } from '@phasewright/physics-core';
import { useMemo } from 'react';
import { Card } from '../../../components/ui/card.js';
import type { MapRecord } from '../../../lib/db.js';
import { LatticePreview } from '../../models/components/lattice-preview.js';

/** Convergence figures of a map's points: how many converged, iterations and residuals. */
export function convergenceStats(points: MapPoint[]) {
  let converged = 0;
  let maxResidual = 0;
  let maxIterations = 0;
  let totalIterations = 0;
  let wallMs = 0;
  for (const p of points) {
    if (p.convergence.converged) converged++;
    maxResidual = Math.max(maxResidual, p.convergence.residual);
    maxIterations = Math.max(maxIterations, p.convergence.iterations);
    totalIterations += p.convergence.iterations;
    wallMs += p.wallMs;
  }
  return { points: points.length, converged, maxResidual, maxIterations, meanIterations: points.length ? totalIterations / points.length : 0, wallMs };
}

const pre = 'max-h-80 overflow-auto rounded-md bg-ink-900/5 p-3 font-mono text-xs text-ink-900';

/** The provenance of a map in full: model, lattice, sweep, solver options, versions, seeds, convergence, warnings. */
export function ProvenancePanel({ map, points }: { map: MapRecord; points: MapPoint[] }) {
  const compiled = useMemo(() => {
    try {
      return compileModel(map.sweep.model);
    } catch {
      return null;
    }
  }, [map.sweep.model]);
  const stats = convergenceStats(points);
  const p = map.provenance;
  return (
    <Card title="Provenance" data={{ testid: 'provenance' }}>
      <div className="grid gap-5 lg:grid-cols-2">
        <div className="space-y-2">
          <h3 className="text-sm font-semibold text-ink-800">Lattice</h3>
          {compiled ? <LatticePreview model={compiled} width={480} height={220} title={`${compiled.nSites} sites, ${compiled.nParticles} particles`} /> : <p className="text-sm">The cluster could not be drawn.</p>}
          <h3 className="text-sm font-semibold text-ink-800">Model (JSON)</h3>
          <pre className={pre} data-testid="provenance-model">{JSON.stringify(map.sweep.model, null, 2)}</pre>
        </div>
        <div className="space-y-2 text-sm text-ink-800">
          <h3 className="font-semibold">Sweep</h3>
          <ul className="list-inside list-disc">
            {map.sweep.axes.map((a) => (
              <li key={a.parameter}>
                {a.parameter}: {JSON.stringify({ ...a, parameter: undefined })}
              </li>
            ))}
          </ul>
          <p>
            Method: <b>{map.method === 'ed' ? 'exact diagonalization (Lanczos)' : 'Gutzwiller mean-field'}</b> · sweep seed {map.sweep.seed ?? 0}
          </p>
          <p data-testid="provenance-refine">
            Refinement:{' '}
            {map.sweep.refine && map.sweep.refine.maxDepth > 0
              ? `depth ${map.sweep.refine.maxDepth}, where ${map.sweep.refine.on.map((c) => (c === 'label' ? 'neighbouring labels differ' : 'the fidelity susceptibility peaks')).join(' or ')}`
              : 'none (the coarse grid only)'}
          </p>
          <h3 className="font-semibold">Solver options</h3>
          <pre className={pre}>{JSON.stringify(map.sweep.solver ?? {}, null, 2)}</pre>
          <h3 className="font-semibold">Versions and runs</h3>
          <p>
            physics-core {p.coreVersion} · identity <span className="font-mono text-xs">{map.identity}</span>
          </p>
          <ul className="list-inside list-disc">
            {p.sources.map((s, i) => (
              <li key={i}>
                {s.author ?? 'no author recorded (computed signed out)'} · {s.createdAt}
                {s.finishedAt ? ` → ${s.finishedAt}` : ' (unfinished)'} · {s.runtime.kind} {s.runtime.version.slice(0, 60)} · {s.runtime.cores} cores
              </li>
            ))}
          </ul>
          <p>Seeds: {p.seeds.length ? p.seeds.join(', ') : 'none'}</p>
          <h3 className="font-semibold">Convergence</h3>
          <p data-testid="provenance-convergence">
            {stats.converged} of {stats.points} points converged · iterations mean {stats.meanIterations.toFixed(1)}, max {stats.maxIterations} · largest residual {stats.maxResidual.toExponential(2)} · compute time {(stats.wallMs / 1000).toFixed(1)} s
          </p>
          <h3 className="font-semibold">Warnings</h3>
          {p.warnings.length ? (
            <ul className="list-inside list-disc text-amber-900">
              {p.warnings.map((w) => (
                <li key={w}>{w}</li>
              ))}
            </ul>
          ) : (
            <p>None recorded.</p>
          )}
          <p className="text-xs text-ink-600">
            {map.method === 'ed'
              ? 'Exact diagonalization of a finite cluster: order parameters and labels are finite-size estimates; fidelity peaks indicate, but do not prove, transitions.'
              : 'Gutzwiller mean-field neglects quantum fluctuations between sites and can overstate ordered phases.'}
          </p>
        </div>
      </div>
    </Card>
  );
}
