/**
 * One point in full: the cluster with densities as site fill, bond currents as arrows whose
 * width is the magnitude, plaquette flux as fill colour, S(q) as a small heatmap, and the point's
 * convergence and warnings. The full result is recomputed in a worker (maps keep scalars only).
 * Below, with the point's model and a bands computer, the one-particle bands of the same model at
 * the same parameters (bands-panel.tsx).
 */
import type { MapPoint, ModelSpec, Result } from '@phasewright/physics-core';
import { diverging, PLOT } from '../lib/plot-colors.js';
import type { BandsComputer } from '../workers/bands-client.js';
import { BandsPanel } from './bands-panel.js';

const INK = PLOT.ink;

interface Props {
  pointKey: string;
  point: MapPoint;
  result: Result | undefined;
  error: string | undefined;
  labelName: string | undefined;
  /** The point's model and the way to compute its one-particle bands; no bands panel without them. */
  bands?: { model: ModelSpec; compute: BandsComputer; fileBase?: string };
}

export function ClusterResult({ result, width = 520, height = 240 }: { result: Result; width?: number; height?: number }) {
  const sites = result.sites;
  const xs = sites.map((s) => s.x);
  const ys = sites.map((s) => s.y);
  const minX = Math.min(...xs);
  const minY = Math.min(...ys);
  const spanX = Math.max(...xs) - minX || 1;
  const spanY = Math.max(...ys) - minY || 1;
  const pad = 28;
  const scale = Math.min((width - 2 * pad) / spanX, (height - 2 * pad) / spanY, 90);
  const ox = (width - scale * spanX) / 2;
  const oy = (height - scale * (Math.max(...ys) - minY)) / 2;
  const P = (i: number) => ({ x: ox + scale * (sites[i].x - minX), y: height - (oy + scale * (sites[i].y - minY)) });
  const dist = (b: { from: number; to: number }) => Math.hypot(sites[b.from].x - sites[b.to].x, sites[b.from].y - sites[b.to].y);
  const shortest = Math.min(...result.bonds.map(dist).filter((d) => d > 1e-9), Infinity);
  const inside = result.bonds.filter((b) => dist(b) <= 2.05 * shortest);
  const maxI = Math.max(1e-300, ...result.bonds.map((b) => Math.abs(b.current)));
  const r = Math.max(5, Math.min(12, scale * 0.18));
  return (
    <svg viewBox={`0 0 ${width} ${height}`} width="100%" role="img" aria-label="Cluster: densities, currents and fluxes" data-testid="point-cluster" data-ink-aware="" className="block rounded-lg bg-surface ring-1 ring-line">
      {result.plaquettes.map((p, i) => {
        if (p.sites.some((s) => dist({ from: s, to: p.sites[0] }) > 2.5 * shortest)) return null;
        return <polygon key={`p${i}`} points={p.sites.map((s) => `${P(s).x},${P(s).y}`).join(' ')} {...diverging(p.flux, Math.PI, 0.75)} stroke="none"><title>{`flux ${p.flux.toFixed(3)} rad, circulation ${p.circulation.toPrecision(3)}`}</title></polygon>;
      })}
      {inside.map((b, i) => {
        const a = P(b.from);
        const c = P(b.to);
        return <line key={`b${i}`} x1={a.x} y1={a.y} x2={c.x} y2={c.y} stroke={INK} strokeOpacity={0.25} strokeWidth={1} />;
      })}
      {inside.map((b, i) => {
        const m = Math.abs(b.current) / maxI;
        if (m < 1e-6 || maxI < 1e-10) return null;
        const [s, t] = b.current > 0 ? [P(b.from), P(b.to)] : [P(b.to), P(b.from)];
        const len = Math.hypot(t.x - s.x, t.y - s.y) || 1;
        const ux = (t.x - s.x) / len;
        const uy = (t.y - s.y) / len;
        const w = 0.8 + 4.5 * m;
        const mx = (s.x + t.x) / 2 + ux * 5;
        const my = (s.y + t.y) / 2 + uy * 5;
        const hs = 4 + 3 * m;
        return (
          <g key={`c${i}`}>
            <line x1={s.x + ux * r} y1={s.y + uy * r} x2={t.x - ux * r} y2={t.y - uy * r} stroke={PLOT.accent} strokeWidth={w} strokeOpacity={0.85} />
            <path d={`M${mx},${my} L${mx - ux * hs * 2 - uy * hs},${my - uy * hs * 2 + ux * hs} L${mx - ux * hs * 2 + uy * hs},${my - uy * hs * 2 - ux * hs} Z`} fill={PLOT.accent} />
            <title>{`current ${b.from}→${b.to}: ${b.current.toPrecision(3)}`}</title>
          </g>
        );
      })}
      {sites.map((s, i) => {
        const p = P(i);
        return (
          <circle key={`s${i}`} cx={p.x} cy={p.y} r={r} fill={INK} fillOpacity={Math.max(0, Math.min(1, s.density)).toFixed(3)} stroke={INK} strokeWidth={1.2}>
            <title>{`site ${s.index}: n = ${s.density.toFixed(4)}`}</title>
          </circle>
        );
      })}
    </svg>
  );
}

function StructureFactorGrid({ rows }: { rows: { q: [number, number]; value: number }[] }) {
  if (rows.length === 0) return null;
  const qx = [...new Set(rows.map((r) => +r.q[0].toFixed(6)))].sort((a, b) => a - b);
  const qy = [...new Set(rows.map((r) => +r.q[1].toFixed(6)))].sort((a, b) => a - b);
  const max = Math.max(...rows.map((r) => r.value), 1e-12);
  const cell = Math.max(8, Math.min(28, 220 / Math.max(qx.length, qy.length)));
  const w = qx.length * cell;
  const h = qy.length * cell;
  return (
    <svg viewBox={`0 0 ${w + 2} ${h + 2}`} width={Math.min(240, w + 2)} role="img" aria-label="Structure factor S(q)" data-testid="structure-factor" data-ink-aware="">
      {rows.map((r, i) => {
        const ix = qx.indexOf(+r.q[0].toFixed(6));
        const iy = qy.indexOf(+r.q[1].toFixed(6));
        return (
          <rect key={i} x={1 + ix * cell} y={1 + (qy.length - 1 - iy) * cell} width={cell - 1} height={cell - 1} fill={INK} fillOpacity={(0.06 + (0.94 * Math.max(0, r.value)) / max).toFixed(3)}>
            <title>{`q = (${r.q[0].toFixed(3)}, ${r.q[1].toFixed(3)}): S = ${r.value.toPrecision(4)}`}</title>
          </rect>
        );
      })}
    </svg>
  );
}

/**
 * How an ED point was solved, in words: the cluster's Hilbert-space size and, when the solver
 * used momentum sectors, how many and the ground state's crystal momentum (only the momenta the
 * finite cluster allows exist). Null for other methods.
 */
export function edSolverNote(result: Result): string | null {
  if (result.method !== 'ed') return null;
  const extras = (result.extras ?? {}) as { dimension?: number; symmetry?: { kind?: string; sectors?: number; lengths?: number[]; momenta?: number[][]; reason?: string } };
  const size = typeof extras.dimension === 'number' ? `${result.sites.length} sites, ${extras.dimension.toLocaleString('en-GB')} basis states` : `${result.sites.length} sites`;
  const s = extras.symmetry;
  if (s?.kind === 'translations' && s.lengths && s.momenta?.length) {
    const k = (m: number[]) => `(${m.map((x, a) => `2π·${x}/${s.lengths?.[a]}`).join(', ')})`;
    const ground = s.momenta[0];
    const degenerate = result.degenerate ? `; the ground manifold averaged here spans ${[...new Set(s.momenta.slice(0, result.energies.length).map((m) => k(m)))].length > 1 ? 'several momenta' : 'one momentum'}` : '';
    return `Exact diagonalization: ${size}, solved in ${s.sectors} momentum sectors; ground state at k = ${k(ground)}${degenerate}. A finite cluster has only these momenta.`;
  }
  return `Exact diagonalization: ${size}, full basis${s?.reason ? ` (no momentum sectors: ${s.reason})` : ''}.`;
}

export function PointDetail({ pointKey, point, result, error, labelName, bands }: Props) {
  return (
    <section className="space-y-3 rounded-xl border border-line bg-surface p-4" aria-label={`Point ${pointKey}`} data-testid="point-detail">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h2 className="text-base font-bold text-ink-900">Point {pointKey}</h2>
        <span className="text-sm text-ink-700">{labelName ?? 'no label'}</span>
      </div>
      <dl className="grid grid-cols-2 gap-x-3 gap-y-0.5 text-sm sm:grid-cols-4">
        <dt className="text-ink-600">Energy</dt>
        <dd className="font-semibold">{point.energy.toPrecision(8)}</dd>
        <dt className="text-ink-600">Converged</dt>
        <dd className="font-semibold">{point.convergence.converged ? `yes (${point.convergence.iterations} it.)` : `NO (residual ${point.convergence.residual.toExponential(1)})`}</dd>
        {typeof point.observables.gap === 'number' ? (
          <>
            <dt className="text-ink-600">Gap</dt>
            <dd className="font-semibold">{point.observables.gap.toPrecision(5)}</dd>
          </>
        ) : null}
        <dt className="text-ink-600">Time</dt>
        <dd className="font-semibold">{point.wallMs.toFixed(0)} ms</dd>
      </dl>
      {point.warnings?.length ? (
        <ul className="list-disc pl-5 text-sm text-amber-950">
          {point.warnings.map((w) => (
            <li key={w}>{w}</li>
          ))}
        </ul>
      ) : null}
      {error ? <p className="text-sm text-red-800">{error}</p> : null}
      {result ? (
        <div className="grid gap-3 md:grid-cols-[minmax(0,1fr)_auto]">
          <div>
            <ClusterResult result={result} />
            <p className="mt-1 text-xs text-ink-600">Site fill: density ⟨n⟩ (empty 0, full ink 1). Arrows: bond currents, width ∝ |current|. Plaquettes: flux, blue negative, vermillion positive.</p>
            {edSolverNote(result) ? (
              <p className="mt-1 text-xs text-ink-600" data-testid="ed-solver-note">
                {edSolverNote(result)}
              </p>
            ) : null}
          </div>
          <div>
            <p className="text-xs font-semibold text-ink-700">S(q)</p>
            <StructureFactorGrid rows={result.structureFactor} />
          </div>
        </div>
      ) : error ? null : (
        <p className="text-sm text-ink-600" role="status">
          Recomputing this point in a worker for the full picture…
        </p>
      )}
      {bands ? <BandsPanel model={bands.model} parameters={point.parameters} compute={bands.compute} fileBase={bands.fileBase} /> : null}
    </section>
  );
}
