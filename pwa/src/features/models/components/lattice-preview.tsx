/**
 * A live drawing of the cluster a model spec builds: sites, bonds coloured by the term that
 * acts on them, conditional hops as arcs through their intermediate site, and arrows along
 * every hop whose amplitude is complex, pointing the way in which the hop phase is positive
 * (Im t > 0 for t·b†_to b_from). Bonds that leave the cluster through a periodic boundary are
 * drawn as dashed stubs.
 */
import type { CompiledModel } from '@phasewright/physics-core';
import { useMemo, type ReactElement } from 'react';
import { PLOT } from '../../maps/lib/plot-colors.js';

/** Fill of the sites of even sublattices (odd ones are drawn in the surface colour); follows the theme. */
const SUBLATTICE_B = 'var(--color-ink-100)';

/** Term colours: Okabe–Ito hues (see lib/phase-colors.ts), in an order distinct from phases. */
export const TERM_COLORS = ['#0072b2', '#d55e00', '#009e73', '#cc79a7', '#e69f00', '#56b4e9'] as const;

export function termColor(termIndex: number): string {
  return TERM_COLORS[termIndex % TERM_COLORS.length];
}

interface Props {
  model: CompiledModel;
  width?: number;
  height?: number;
  /** Per-site fill (0…1 density) for the point detail; undefined draws plain sites. */
  siteValues?: readonly number[];
  title?: string;
}

interface Placed {
  x: number;
  y: number;
}

const PAD = 26;

export function useClusterFrame(model: CompiledModel, width: number, height: number) {
  return useMemo(() => {
    const sites = model.lattice.sites;
    const xs = sites.map((s) => s.x);
    const ys = sites.map((s) => s.y);
    const minX = Math.min(...xs);
    const maxX = Math.max(...xs);
    const minY = Math.min(...ys);
    const maxY = Math.max(...ys);
    const spanX = Math.max(maxX - minX, 1e-9);
    const spanY = Math.max(maxY - minY, 1e-9);
    const scale = Math.min((width - 2 * PAD) / (spanX || 1), (height - 2 * PAD) / (spanY || 1), 80);
    const offX = (width - scale * (maxX - minX)) / 2;
    const offY = (height - scale * (maxY - minY)) / 2;
    // y grows upwards in the lattice, downwards in SVG.
    const place = (x: number, y: number): Placed => ({ x: offX + scale * (x - minX), y: height - (offY + scale * (y - minY)) });
    return { place, scale };
  }, [model, width, height]);
}

function arrowHead(x: number, y: number, ux: number, uy: number, size: number): string {
  const bx = x - ux * size;
  const by = y - uy * size;
  const px = -uy * size * 0.55;
  const py = ux * size * 0.55;
  return `M${x},${y} L${bx + px},${by + py} L${bx - px},${by - py} Z`;
}

export function LatticePreview({ model, width = 560, height = 240, siteValues, title }: Props) {
  const { place, scale } = useClusterFrame(model, width, height);
  const lattice = model.lattice;
  const radius = Math.max(4, Math.min(11, scale * 0.16));

  const drawing = useMemo(() => {
    const lines: ReactElement[] = [];
    const arrows: ReactElement[] = [];
    const perBond = new Map<number, number[]>();
    for (const term of model.terms) {
      if (term.kind !== 'hop' && term.kind !== 'interaction') continue;
      for (const e of term.entries) {
        const list = perBond.get(e.bond) ?? [];
        if (!list.includes(term.termIndex)) list.push(term.termIndex);
        perBond.set(e.bond, list);
      }
    }
    for (const term of model.terms) {
      const color = termColor(term.termIndex);
      if (term.kind === 'hop' || term.kind === 'interaction') {
        for (const [n, e] of term.entries.entries()) {
          const bond = lattice.bonds[e.bond];
          const from = lattice.sites[bond.from];
          const a = place(from.x, from.y);
          const b = place(from.x + bond.dx, from.y + bond.dy);
          const len = Math.hypot(b.x - a.x, b.y - a.y) || 1;
          const ux = (b.x - a.x) / len;
          const uy = (b.y - a.y) / len;
          const on = perBond.get(e.bond) ?? [term.termIndex];
          const shift = (on.indexOf(term.termIndex) - (on.length - 1) / 2) * 3.5;
          const ox = -uy * shift;
          const oy = ux * shift;
          const wraps = bond.wrap.some((w) => w !== 0);
          const dash = term.kind === 'interaction' ? '2 3' : wraps ? '5 4' : undefined;
          const end = wraps ? 0.45 : 1;
          lines.push(
            <line
              key={`t${term.termIndex}-${n}`}
              x1={a.x + ox}
              y1={a.y + oy}
              x2={a.x + ox + (b.x - a.x) * end}
              y2={a.y + oy + (b.y - a.y) * end}
              stroke={color}
              strokeWidth={term.kind === 'interaction' ? 1.6 : 2.2}
              strokeDasharray={dash}
              strokeLinecap="round"
              data-term={term.termIndex}
            />,
          );
          if (wraps) {
            const to = lattice.sites[bond.to];
            const c = place(to.x, to.y);
            lines.push(
              <line key={`t${term.termIndex}-${n}-w`} x1={c.x + ox} y1={c.y + oy} x2={c.x + ox - (b.x - a.x) * 0.45} y2={c.y + oy - (b.y - a.y) * 0.45} stroke={color} strokeWidth={2.2} strokeDasharray="5 4" strokeLinecap="round" />,
            );
          }
          if ('im' in e && Math.abs(e.im) > 1e-12 * Math.max(1, Math.hypot(e.re, e.im))) {
            // The bond runs from→to in the direction (ux, uy); Im t > 0 points that way.
            const s = e.im > 0 ? 1 : -1;
            const mx = a.x + ox + (b.x - a.x) * (wraps ? 0.3 : 0.5) + s * ux * 4;
            const my = a.y + oy + (b.y - a.y) * (wraps ? 0.3 : 0.5) + s * uy * 4;
            arrows.push(<path key={`a${term.termIndex}-${n}`} d={arrowHead(mx, my, s * ux, s * uy, 7)} fill={color} />);
          }
        }
      } else if (term.kind === 'conditional-hop') {
        for (const [n, e] of term.entries.entries()) {
          const path = lattice.paths[e.path];
          if (path.wrap.some((w) => w !== 0)) continue;
          const from = lattice.sites[path.from];
          const via = lattice.sites[path.via];
          const a = place(from.x, from.y);
          const b = place(from.x + path.dx, from.y + path.dy);
          const k = place(via.x, via.y);
          // A quadratic curve from j to i pulled half-way towards k.
          const cx = (a.x + b.x) / 2 + ((k.x - (a.x + b.x) / 2) * 0.55);
          const cy = (a.y + b.y) / 2 + ((k.y - (a.y + b.y) / 2) * 0.55);
          lines.push(
            <path
              key={`c${term.termIndex}-${n}`}
              d={`M${a.x},${a.y} Q${cx},${cy} ${b.x},${b.y}`}
              fill="none"
              stroke={color}
              strokeOpacity={0.75}
              strokeWidth={1.4}
              data-term={term.termIndex}
            />,
          );
          if (Math.abs(e.im) > 1e-12 * Math.max(1, Math.hypot(e.re, e.im))) {
            const s = e.im > 0 ? 1 : -1;
            // Mid-point of the curve and its tangent (B'(½) ∝ b − a).
            const mx = 0.25 * a.x + 0.5 * cx + 0.25 * b.x;
            const my = 0.25 * a.y + 0.5 * cy + 0.25 * b.y;
            const tl = Math.hypot(b.x - a.x, b.y - a.y) || 1;
            arrows.push(
              <path key={`ca${term.termIndex}-${n}`} d={arrowHead(mx + (s * 3 * (b.x - a.x)) / tl, my + (s * 3 * (b.y - a.y)) / tl, (s * (b.x - a.x)) / tl, (s * (b.y - a.y)) / tl, 6)} fill={color} />,
            );
          }
        }
      }
    }
    return { lines, arrows };
  }, [model, lattice, place]);

  return (
    <svg
      viewBox={`0 0 ${width} ${height}`}
      width="100%"
      role="img"
      data-ink-aware=""
      aria-label={title ?? `Cluster of ${model.nSites} sites`}
      className="block rounded-lg bg-surface ring-1 ring-line"
      data-testid="lattice-preview"
    >
      {title ? <title>{title}</title> : null}
      <g>{drawing.lines}</g>
      <g>{drawing.arrows}</g>
      <g>
        {lattice.sites.map((s) => {
          const p = place(s.x, s.y);
          const v = siteValues?.[s.index];
          return (
            <g key={s.index}>
              <circle
                cx={p.x}
                cy={p.y}
                r={radius}
                fill={v === undefined ? (s.sublattice % 2 ? PLOT.surface : SUBLATTICE_B) : PLOT.ink}
                fillOpacity={v === undefined ? 1 : Math.max(0, Math.min(1, v))}
                stroke={PLOT.ink}
                strokeWidth={1.4}
              >
                <title>{`site ${s.index} (${s.x.toFixed(2)}, ${s.y.toFixed(2)})${v === undefined ? '' : `, n = ${v.toFixed(3)}`}`}</title>
              </circle>
              {radius >= 8 && v === undefined ? (
                <text x={p.x} y={p.y + 3} textAnchor="middle" fontSize={8} fill={PLOT.ink} fontFamily="Manrope, sans-serif">
                  {s.index}
                </text>
              ) : null}
            </g>
          );
        })}
      </g>
    </svg>
  );
}
