/** A 1D cut: any scalar observable against the first axis, points marked (unconverged hollow). */
import type { SweepSpec } from '@phasewright/physics-core';
import { AxisBottom, AxisLeft } from '@visx/axis';
import { Group } from '@visx/group';
import { scaleLinear, scaleLog } from '@visx/scale';
import { LinePath } from '@visx/shape';
import { forwardRef } from 'react';
import { axisInfo, scalar, type MapCell } from '../lib/map-data.js';
import { measuredOnCut, type MeasurementRow } from '../lib/measurements.js';
import { PLOT } from '../lib/plot-colors.js';
import { plotDomain, TICK_SPECIFIER } from '../lib/plot-domain.js';

interface Props {
  sweep: SweepSpec;
  cells: MapCell[];
  observable: string;
  selectedKeys: ReadonlySet<string>;
  onSelect: (cell: MapCell) => void;
  colorOf: (cell: MapCell) => string;
  width?: number;
  /** Uploaded measurements to draw over the cut (points with error bars). */
  measured?: MeasurementRow[];
}

const M = { top: 28, right: 16, bottom: 44, left: 84 };
const INK = PLOT.ink;

export const CutPlot = forwardRef<SVGSVGElement, Props>(function CutPlot({ sweep, cells, observable, selectedKeys, onSelect, colorOf, width = 620, measured = [] }, ref) {
  const a = axisInfo(sweep)[0];
  const height = 260;
  const iw = width - M.left - M.right;
  const ih = height - M.top - M.bottom;
  // Along a 1D sweep every point is on the line; on a grid, the row of the first value of axis 2.
  const axis2 = sweep.axes[1]?.parameter;
  const row = axis2 ? Math.min(...cells.map((c) => c.point.parameters[axis2])) : undefined;
  const pts = cells
    .filter((c) => row === undefined || c.point.parameters[axis2 as string] === row)
    .map((c) => ({ c, xv: c.at[0], yv: scalar(c.point, observable) }))
    .filter((p): p is { c: MapCell; xv: number; yv: number } => p.yv !== undefined)
    .sort((p, q) => p.xv - q.xv);
  const meas = measuredOnCut(measured, a.parameter, observable, axis2 && row !== undefined ? { parameter: axis2, value: row } : undefined);
  const ys = [...pts.map((p) => p.yv), ...meas.flatMap((m) => [m.y - (m.err ?? 0), m.y + (m.err ?? 0)])];
  const x = a.log ? scaleLog<number>({ domain: [a.min, a.max], range: [0, iw] }) : scaleLinear<number>({ domain: [a.min, a.max === a.min ? a.min + 1 : a.max], range: [0, iw] });
  const y = scaleLinear<number>({ domain: plotDomain(ys), range: [ih, 0], nice: true });
  const title = `${observable} along ${a.parameter}${row !== undefined ? ` (${axis2} = ${row})` : ''}${meas.length ? ` · ${meas.length} measured` : ''}`;
  return (
    <svg ref={ref} viewBox={`0 0 ${width} ${height}`} width="100%" role="img" aria-label={title} data-testid="cut-plot" data-ink-aware="" className="block">
      <title>{title}</title>
      <text x={M.left} y={17} fontSize={13} fontWeight={600} fill={INK}>
        {title}
      </text>
      <Group left={M.left} top={M.top}>
        {/* Axes first: the points at the ends of the range stay clickable above them. */}
        <AxisBottom top={ih} scale={x} numTicks={6} stroke={INK} tickStroke={INK} label={a.parameter} labelProps={{ fontSize: 12, fill: INK, textAnchor: 'middle', fontFamily: 'Manrope, sans-serif' }} tickLabelProps={{ fontSize: 10, fill: INK, fontFamily: 'Manrope, sans-serif' }} />
        <AxisLeft scale={y} numTicks={5} tickFormat={y.tickFormat(5, TICK_SPECIFIER)} stroke={INK} tickStroke={INK} label={observable} labelOffset={56} labelProps={{ fontSize: 12, fill: INK, textAnchor: 'middle', fontFamily: 'Manrope, sans-serif' }} tickLabelProps={{ fontSize: 10, fill: INK, fontFamily: 'Manrope, sans-serif' }} />
        <LinePath data={pts} x={(p) => x(p.xv) ?? 0} y={(p) => y(p.yv) ?? 0} stroke={INK} strokeWidth={1.5} />
        <g data-testid="cut-measured" data-count={meas.length}>
          {meas.map((m) => {
            const cx = x(m.x) ?? 0;
            const cy = y(m.y) ?? 0;
            return (
              <g key={`${m.line}`} stroke={PLOT.measured} strokeWidth={1.4}>
                {m.err !== undefined ? (
                  <>
                    <line x1={cx} x2={cx} y1={y(m.y - m.err) ?? cy} y2={y(m.y + m.err) ?? cy} />
                    <line x1={cx - 4} x2={cx + 4} y1={y(m.y - m.err) ?? cy} y2={y(m.y - m.err) ?? cy} />
                    <line x1={cx - 4} x2={cx + 4} y1={y(m.y + m.err) ?? cy} y2={y(m.y + m.err) ?? cy} />
                  </>
                ) : null}
                <rect x={cx - 3.5} y={cy - 3.5} width={7} height={7} fill={PLOT.surface}>
                  <title>{`measured (line ${m.line}): ${observable} = ${m.y}${m.err !== undefined ? ` ± ${m.err}` : ''} at ${a.parameter} = ${m.x}`}</title>
                </rect>
              </g>
            );
          })}
        </g>
        {pts.map((p) => (
          <circle
            key={p.c.key}
            cx={x(p.xv) ?? 0}
            cy={y(p.yv) ?? 0}
            r={selectedKeys.has(p.c.key) ? 6 : 4}
            fill={p.c.point.convergence.converged ? colorOf(p.c) : PLOT.surface}
            stroke={INK}
            strokeWidth={selectedKeys.has(p.c.key) ? 2 : 1}
            onClick={() => onSelect(p.c)}
            style={{ cursor: 'pointer' }}
            data-point={p.c.key}
          >
            <title>{`${p.c.key}: ${p.yv.toPrecision(6)}${p.c.point.convergence.converged ? '' : ' (not converged)'}`}</title>
          </circle>
        ))}
      </Group>
    </svg>
  );
});
