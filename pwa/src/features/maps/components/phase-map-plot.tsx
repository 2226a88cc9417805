/**
 * The phase map (visx): a categorical heatmap of phase labels (or a sequential one of a scalar
 * observable), one cell per point sized by its refinement level, boundary lines with their
 * uncertainty, marks on unconverged (×) and degenerate (◦) points. A 1D cut is one band.
 */
import type { Boundary, SweepSpec } from '@phasewright/physics-core';
import { AxisBottom, AxisLeft } from '@visx/axis';
import { Group } from '@visx/group';
import { scaleLinear, scaleLog } from '@visx/scale';
import { forwardRef } from 'react';
import { axisInfo, scalar, type MapCell } from '../lib/map-data.js';
import { PLOT } from '../lib/plot-colors.js';

export interface PlotColouring {
  mode: 'label' | 'observable';
  observable: string;
  colorOf: (cell: MapCell) => string;
}

interface Props {
  sweep: SweepSpec;
  cells: MapCell[];
  colouring: PlotColouring;
  boundaries: Boundary[];
  selectedKeys: ReadonlySet<string>;
  onHover: (cell: MapCell | null, x: number, y: number) => void;
  onSelect: (cell: MapCell) => void;
  title: string;
  width?: number;
  /** A second map's boundaries drawn over this one (dashed, accent colour), for comparing. */
  overlayBoundaries?: Boundary[];
}

const M = { top: 30, right: 16, bottom: 44, left: 58 };
const INK = PLOT.ink;

export const PhaseMapPlot = forwardRef<SVGSVGElement, Props>(function PhaseMapPlot(
  { sweep, cells, colouring, boundaries, selectedKeys, onHover, onSelect, title, width = 620, overlayBoundaries = [] },
  ref,
) {
  const axes = axisInfo(sweep);
  const twoD = axes.length >= 2;
  const height = twoD ? 420 : 150;
  const iw = width - M.left - M.right;
  const ih = height - M.top - M.bottom;
  const mk = (a: (typeof axes)[number], range: [number, number]) => {
    const pad = a.step / 2;
    if (a.log) return scaleLog<number>({ domain: [a.min / 10 ** pad, a.max * 10 ** pad], range });
    return scaleLinear<number>({ domain: [a.min - pad, a.max + pad], range });
  };
  const x = mk(axes[0], [0, iw]);
  const y = twoD ? mk(axes[1], [ih, 0]) : null;
  const span = (scale: (v: number) => number | undefined, a: (typeof axes)[number], at: number, half: number): [number, number] => {
    const lo = a.log ? at / 10 ** half : at - half;
    const hi = a.log ? at * 10 ** half : at + half;
    const p = scale(lo) ?? 0;
    const q = scale(hi) ?? 0;
    return [Math.min(p, q), Math.abs(q - p)];
  };

  return (
    <svg ref={ref} viewBox={`0 0 ${width} ${height}`} width="100%" role="img" aria-label={title} data-testid="phase-map" data-ink-aware="" className="block">
      <title>{title}</title>
      <text x={M.left} y={18} fontSize={13} fontWeight={600} fill={INK}>
        {title}
      </text>
      <Group left={M.left} top={M.top}>
        <rect width={iw} height={ih} fill={PLOT.paper} />
        {cells.map((c) => {
          const [x0, w] = span(x, axes[0], c.at[0], c.half[0]);
          const [y0, h] = y ? span(y, axes[1], c.at[1], c.half[1]) : [0, ih];
          const selected = selectedKeys.has(c.key);
          return (
            <g key={c.key} data-point={c.key} data-label={c.labelId ?? ''}>
              <rect
                x={x0}
                y={y0}
                width={Math.max(1, w)}
                height={Math.max(1, h)}
                fill={colouring.colorOf(c)}
                stroke={selected ? INK : PLOT.surface}
                strokeWidth={selected ? 2 : 0.5}
                onMouseMove={(e) => onHover(c, e.clientX, e.clientY)}
                onMouseLeave={() => onHover(null, 0, 0)}
                onClick={() => onSelect(c)}
                style={{ cursor: 'pointer' }}
              >
                <title>{`${c.key}${c.labelId ? ` · ${c.labelId}` : ''}${colouring.mode === 'observable' ? ` · ${colouring.observable} = ${scalar(c.point, colouring.observable)?.toPrecision(4) ?? '—'}` : ''}`}</title>
              </rect>
              {!c.point.convergence.converged ? (
                <text x={x0 + w / 2} y={y0 + h / 2 + 4} textAnchor="middle" fontSize={11} fill={INK} pointerEvents="none">
                  ×
                </text>
              ) : c.point.observables.degenerate === 1 ? (
                <circle cx={x0 + w / 2} cy={y0 + h / 2} r={Math.min(4, w / 4, h / 4)} fill="none" stroke={INK} strokeWidth={1} pointerEvents="none" />
              ) : null}
            </g>
          );
        })}
        {overlayBoundaries.map((b, i) => {
          const pts = b.vertices.map((v) => ({ px: x(v.at[axes[0].parameter]) ?? 0, py: y ? (y(v.at[axes[1].parameter]) ?? 0) : ih / 2 }));
          return (
            <g key={`o${i}`} data-overlay-boundary={b.between.join('|')} pointerEvents="none">
              {twoD ? (
                <polyline points={pts.map((p) => `${p.px},${p.py}`).join(' ')} fill="none" stroke={PLOT.accent} strokeWidth={2.2} strokeDasharray="6 4" strokeLinejoin="round" />
              ) : (
                pts.map((p, j) => <line key={j} x1={p.px} x2={p.px} y1={-4} y2={ih + 4} stroke={PLOT.accent} strokeWidth={2.2} strokeDasharray="6 4" />)
              )}
            </g>
          );
        })}
        {boundaries.map((b, i) => {
          const pts = b.vertices.map((v) => ({
            px: x(v.at[axes[0].parameter]) ?? 0,
            py: y ? (y(v.at[axes[1].parameter]) ?? 0) : ih / 2,
            ux: Math.abs((x(v.at[axes[0].parameter] + (v.uncertainty[axes[0].parameter] ?? 0)) ?? 0) - (x(v.at[axes[0].parameter]) ?? 0)),
            uy: y ? Math.abs((y(v.at[axes[1].parameter] + (v.uncertainty[axes[1].parameter] ?? 0)) ?? 0) - (y(v.at[axes[1].parameter]) ?? 0)) : 0,
          }));
          return (
            <g key={i} data-boundary={b.between.join('|')} pointerEvents="none">
              {pts.map((p, j) => (
                <rect key={j} x={p.px - p.ux} y={twoD ? p.py - p.uy : 0} width={2 * p.ux} height={twoD ? 2 * p.uy : ih} fill={INK} fillOpacity={0.12} />
              ))}
              {twoD ? (
                <polyline points={pts.map((p) => `${p.px},${p.py}`).join(' ')} fill="none" stroke={INK} strokeWidth={1.8} strokeLinejoin="round" />
              ) : (
                pts.map((p, j) => <line key={`l${j}`} x1={p.px} x2={p.px} y1={-4} y2={ih + 4} stroke={INK} strokeWidth={1.8} />)
              )}
            </g>
          );
        })}
        <AxisBottom top={ih} scale={x} numTicks={6} stroke={INK} tickStroke={INK} label={axes[0].parameter} labelProps={{ fontSize: 12, fill: INK, textAnchor: 'middle', fontFamily: 'Manrope, sans-serif' }} tickLabelProps={{ fontSize: 10, fill: INK, fontFamily: 'Manrope, sans-serif' }} />
        {y ? (
          <AxisLeft scale={y} numTicks={6} stroke={INK} tickStroke={INK} label={axes[1].parameter} labelProps={{ fontSize: 12, fill: INK, textAnchor: 'middle', fontFamily: 'Manrope, sans-serif' }} tickLabelProps={{ fontSize: 10, fill: INK, fontFamily: 'Manrope, sans-serif' }} />
        ) : null}
      </Group>
    </svg>
  );
});
