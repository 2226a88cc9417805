/**
 * The one-particle picture of a point's model (N = 1): band energies along the high-symmetry
 * path, the Berry curvature of the lowest band group over one reciprocal cell, and the Chern
 * numbers with the limits of the lattice method stated. Sweeps solve the many-body problem (ED,
 * mean-field); these bands are of the same Hamiltonian with a single particle, where
 * interactions and `when: 'occupied'` hops drop out — said in the panel, not hidden.
 */
import type { ModelSpec } from '@phasewright/physics-core';
import { AxisBottom, AxisLeft } from '@visx/axis';
import { Group } from '@visx/group';
import { scaleLinear } from '@visx/scale';
import { LinePath } from '@visx/shape';
import { forwardRef, useEffect, useRef, useState } from 'react';
import { Button } from '../../../components/ui/button.js';
import { bandNames, signed, SMALL_GAP, type BandsView } from '../lib/bands.js';
import { exportPng, exportSvg } from '../lib/export-figure.js';
import { diverging, PLOT } from '../lib/plot-colors.js';
import type { BandsComputer } from '../workers/bands-client.js';

const FONT = 'Manrope, sans-serif';
const tickLabel = { fontSize: 10, fill: PLOT.ink, fontFamily: FONT };
const axisLabel = { fontSize: 12, fill: PLOT.ink, textAnchor: 'middle' as const, fontFamily: FONT };

/** Band lines: the lowest group (whose curvature is drawn) in the accent, the others in ink. */
export const BandStructurePlot = forwardRef<SVGSVGElement, { view: BandsView; title: string; width?: number }>(function BandStructurePlot({ view, title, width = 620 }, ref) {
  const height = 300;
  const m = { top: 28, right: 14, bottom: 30, left: 56 };
  const iw = width - m.left - m.right;
  const ih = height - m.top - m.bottom;
  const d = view.path.distance;
  const all = view.path.energies.flat();
  const lo = Math.min(...all);
  const hi = Math.max(...all);
  const pad = (hi - lo || Math.abs(hi) || 1) * 0.06;
  const x = scaleLinear<number>({ domain: [0, d[d.length - 1] || 1], range: [0, iw] });
  const y = scaleLinear<number>({ domain: [lo - pad, hi + pad], range: [ih, 0], nice: true });
  const lowest = new Set(view.chern?.groups[0]?.bands ?? [0]);
  return (
    <svg ref={ref} viewBox={`0 0 ${width} ${height}`} width="100%" role="img" aria-label={title} data-testid="band-structure" data-ink-aware="" className="block">
      <title>{title}</title>
      <text x={m.left} y={17} fontSize={13} fontWeight={600} fill={PLOT.ink}>
        {title}
      </text>
      <Group left={m.left} top={m.top}>
        {view.path.labels.map((l) => (
          <line key={`${l.label}${l.index}`} x1={x(d[l.index])} x2={x(d[l.index])} y1={0} y2={ih} stroke={PLOT.ink} strokeOpacity={0.18} />
        ))}
        {view.path.energies.map((band, b) => (
          <LinePath
            key={b}
            data={band}
            x={(_, i) => x(d[i]) ?? 0}
            y={(e) => y(e) ?? 0}
            stroke={lowest.has(b) ? PLOT.accent : PLOT.ink}
            strokeWidth={lowest.has(b) ? 2 : 1.5}
            data-testid="band-line"
            data-band={b}
          />
        ))}
        <AxisBottom top={ih} scale={x} tickValues={view.path.labels.map((l) => d[l.index])} tickFormat={(v) => view.path.labels.find((l) => Math.abs(d[l.index] - Number(v)) < 1e-12)?.label ?? ''} stroke={PLOT.ink} tickStroke={PLOT.ink} tickLabelProps={{ ...tickLabel, fontSize: 12 }} />
        <AxisLeft scale={y} numTicks={5} stroke={PLOT.ink} tickStroke={PLOT.ink} label="E (one particle)" labelOffset={38} labelProps={axisLabel} tickLabelProps={tickLabel} />
      </Group>
    </svg>
  );
});

/** Ω(k) of the lowest band group on the mesh plaquettes, drawn as parallelograms in Cartesian k. */
export const BerryCurvatureMap = forwardRef<SVGSVGElement, { curvature: NonNullable<BandsView['curvature']>; title: string }>(function BerryCurvatureMap({ curvature, title }, ref) {
  const { mesh: N, values, reciprocal: [g1, g2] } = curvature;
  const size = 240;
  const top = 24;
  const pad = 8;
  const kAt = (i: number, j: number): [number, number] => [(i / N) * g1[0] + (j / N) * g2[0], (i / N) * g1[1] + (j / N) * g2[1]];
  const corners = [kAt(0, 0), kAt(N, 0), kAt(N, N), kAt(0, N)];
  const minX = Math.min(...corners.map((c) => c[0]));
  const maxX = Math.max(...corners.map((c) => c[0]));
  const minY = Math.min(...corners.map((c) => c[1]));
  const maxY = Math.max(...corners.map((c) => c[1]));
  const s = Math.min((size - 2 * pad) / (maxX - minX || 1), (size - 2 * pad) / (maxY - minY || 1));
  const ox = (size - s * (maxX - minX)) / 2;
  const oy = (size - s * (maxY - minY)) / 2;
  const P = ([kx, ky]: [number, number]) => `${(ox + s * (kx - minX)).toFixed(2)},${(top + size - oy - s * (ky - minY)).toFixed(2)}`;
  const max = Math.max(...values.map(Math.abs));
  const [gx, gy] = P([0, 0]).split(',').map(Number);
  return (
    <svg ref={ref} viewBox={`0 0 ${size} ${size + top}`} width={size} role="img" aria-label={title} data-testid="berry-curvature" data-ink-aware="" className="block max-w-full">
      <title>{title}</title>
      <text x={4} y={15} fontSize={12} fontWeight={600} fill={PLOT.ink}>
        {title}
      </text>
      {values.map((v, idx) => {
        const i = Math.floor(idx / N);
        const j = idx % N;
        return (
          <polygon key={idx} points={[kAt(i, j), kAt(i + 1, j), kAt(i + 1, j + 1), kAt(i, j + 1)].map(P).join(' ')} {...diverging(v, max, 0.9)} shapeRendering="crispEdges">
            <title>{`Ω = ${v.toPrecision(4)}`}</title>
          </polygon>
        );
      })}
      <polygon points={corners.map(P).join(' ')} fill="none" stroke={PLOT.ink} strokeOpacity={0.5} />
      <circle cx={gx} cy={gy} r={2.5} fill={PLOT.ink} />
      <text x={gx + 4} y={gy - 4} fontSize={11} fill={PLOT.ink} fontFamily={FONT}>
        Γ
      </text>
    </svg>
  );
});

function ChernList({ view }: { view: BandsView }) {
  const chern = view.chern;
  if (!chern) return <p className="text-sm text-ink-700">One-dimensional lattice: no Berry curvature and no Chern number.</p>;
  const closing = chern.groups.filter((g) => g.directGapAbove !== null && g.directGapAbove < SMALL_GAP);
  return (
    <div className="space-y-1 text-sm">
      <p className="font-semibold text-ink-800">Chern numbers</p>
      <ul className="space-y-0.5" data-testid="chern-numbers">
        {chern.groups.map((g) => (
          <li key={g.bands.join('-')} data-chern={g.chern} data-bands={g.bands.join(' ')}>
            {bandNames(g.bands)}
            {g.bands.length > 1 ? ' (touching)' : ''}: <span className="font-semibold">C = {signed(g.chern)}</span>
            {g.directGapAbove !== null ? <span className="text-ink-600"> · gap above ≥ {g.directGapAbove.toPrecision(3)}</span> : null}
          </li>
        ))}
      </ul>
      <p className="text-xs text-ink-600" data-testid="chern-caveat">
        Computed on a {chern.mesh}×{chern.mesh} k-grid (Fukui–Hatsugai–Suzuki lattice method); a gap closing makes it ill-defined. Sign: C = (1/2π)∫Ω d²k with Ω = ∂ₓA_y − ∂_yA_x, A = i⟨u|∇u⟩. Sum over bands: {signed(chern.total)}.
      </p>
      {closing.length ? (
        <p className="text-xs font-semibold text-amber-900" role="note">
          The gap above {closing.map((g) => bandNames(g.bands)).join(', ')} nearly closes on the grid (below {SMALL_GAP}): the Chern numbers there are not to be trusted.
        </p>
      ) : null}
    </div>
  );
}

interface Props {
  model: ModelSpec;
  parameters: Record<string, number>;
  compute: BandsComputer;
  /** Start of exported file names. */
  fileBase?: string;
}

/** Computes (through `compute`, a worker in the app) and draws the one-particle bands of `model` at `parameters`. */
export function BandsPanel({ model, parameters, compute, fileBase = 'point' }: Props) {
  const [state, setState] = useState<{ for: string; view?: BandsView; error?: string } | null>(null);
  const bandsSvg = useRef<SVGSVGElement>(null);
  const curvatureSvg = useRef<SVGSVGElement>(null);
  const key = JSON.stringify(parameters);
  useEffect(() => {
    let stale = false;
    compute(model, parameters).then(
      (view) => !stale && setState({ for: key, view }),
      (e: unknown) => !stale && setState({ for: key, error: e instanceof Error ? e.message : String(e) }),
    );
    return () => {
      stale = true;
    };
    // `key` stands for `parameters` (a fresh object on every render of the map).
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [model, key, compute]);
  const current = state?.for === key ? state : null;
  const view = current?.view;
  return (
    <section className="space-y-2 border-t border-line pt-3" aria-label="One-particle bands" data-testid="bands-panel" data-state={view ? 'done' : current?.error ? 'error' : 'computing'} data-ms={view ? view.ms.toFixed(0) : undefined}>
      <h3 className="text-sm font-bold text-ink-900">One-particle bands of this model (N = 1), not of the many-body state</h3>
      <p className="text-xs text-ink-600">
        The same Hamiltonian at this point's parameters with a single particle in the unit cell's Bloch picture: the many-body ground state above need not resemble any of these bands.
      </p>
      {current?.error ? (
        <p className="text-sm text-red-800" role="alert">
          No one-particle bands for this model: {current.error}
        </p>
      ) : !view ? (
        <p className="text-sm text-ink-600" role="status">
          Computing the one-particle bands in a worker…
        </p>
      ) : (
        <>
          {view.warnings.length ? (
            <ul className="list-disc pl-5 text-xs text-amber-900" data-testid="bands-warnings">
              {view.warnings.map((w) => (
                <li key={w}>{w}</li>
              ))}
            </ul>
          ) : null}
          <div className="grid gap-3 md:grid-cols-[minmax(0,1fr)_15rem]">
            <div className="space-y-1">
              <BandStructurePlot ref={bandsSvg} view={view} title={`${view.nBands} band${view.nBands === 1 ? '' : 's'} along ${view.path.labels.map((l) => l.label).join('–')}`} />
              <div className="flex flex-wrap gap-2">
                <Button variant="secondary" onClick={() => bandsSvg.current && exportSvg(bandsSvg.current, `${fileBase}-bands.svg`)}>
                  Export bands SVG
                </Button>
                <Button variant="secondary" onClick={() => bandsSvg.current && void exportPng(bandsSvg.current, `${fileBase}-bands.png`)}>
                  Export bands PNG
                </Button>
              </div>
            </div>
            <div className="space-y-2">
              {view.curvature ? (
                <div>
                  <BerryCurvatureMap ref={curvatureSvg} curvature={view.curvature} title={`Berry curvature Ω of ${bandNames(view.curvature.bands)}`} />
                  <p className="text-xs text-ink-600">
                    Over one reciprocal cell k = s₁G₁ + s₂G₂ (0 ≤ s &lt; 1). Blue Ω &lt; 0, vermillion Ω &gt; 0; |Ω| up to {Math.max(...view.curvature.values.map(Math.abs)).toPrecision(3)}.
                  </p>
                  <Button variant="ghost" className="mt-1 px-2 py-1 text-xs" onClick={() => curvatureSvg.current && exportSvg(curvatureSvg.current, `${fileBase}-berry-curvature.svg`)}>
                    Export curvature SVG
                  </Button>
                </div>
              ) : null}
              <ChernList view={view} />
            </div>
          </div>
        </>
      )}
    </section>
  );
}
