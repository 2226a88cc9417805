/**
 * A map: the phase heatmap (or an observable), its legend, a 1D cut of any scalar observable,
 * the caveats, the points table and the detail of the selected point. Reads live from Dexie, so
 * it fills in while a sweep runs.
 */
import type { PointRequest, Result } from '@phasewright/physics-core';
import { pointSeed } from '@phasewright/physics-core';
import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import { Button } from '../../../components/ui/button.js';
import { Notice } from '../../../components/ui/notice.js';
import { phaseColor } from '../../../lib/phase-colors.js';
import { annotateLabel, useAnnotations, useMapPoints, useMapRecord } from '../api/maps.js';
import { exportPng, exportSvg } from '../lib/export-figure.js';
import { boundariesOf, caveatsOf, labelsOf, mapCells, scalar, scalarObservables, type MapCell } from '../lib/map-data.js';
import { CutPlot } from './cut-plot.js';
import type { MeasurementRow } from '../lib/measurements.js';
import { MapLegend, type LegendEntry } from './map-legend.js';
import { PhaseMapPlot, type PlotColouring } from './phase-map-plot.js';
import { PointDetail } from './point-detail.js';
import { PointsTable } from './points-table.js';
import { bandsInWorker, type BandsComputer } from '../workers/bands-client.js';

export type DetailSolver = (request: PointRequest) => Promise<{ result: Result }>;

function sequential(t: number): string {
  // Paper → ink, for observables (a single-hue ramp reads in grey and for colour-blind readers).
  const c0 = [245, 241, 232];
  const c1 = [29, 38, 64];
  const u = Math.max(0, Math.min(1, t));
  return `rgb(${c0.map((a, i) => Math.round(a + (c1[i] - a) * u)).join(' ')})`;
}

/**
 * `canAnnotate` false (viewers and reviewers of a shared project) hides renaming and recolouring.
 * `computeBands` draws a selected point's one-particle bands (a worker of its own by default).
 */
export function MapView({ mapId, solveDetail, canAnnotate = true, measured, computeBands = bandsInWorker }: { mapId: string; solveDetail: DetailSolver; canAnnotate?: boolean; measured?: MeasurementRow[]; computeBands?: BandsComputer }) {
  const map = useMapRecord(mapId);
  const rows = useMapPoints(mapId);
  const annotations = useAnnotations(mapId);
  const [selected, setSelected] = useState<Set<string>>(new Set());
  const [hover, setHover] = useState<{ cell: MapCell; x: number; y: number } | null>(null);
  const [colourMode, setColourMode] = useState<'label' | 'observable' | null>(null);
  const [observable, setObservable] = useState<string | null>(null);
  const [cutObservable, setCutObservable] = useState<string | null>(null);
  const [detail, setDetail] = useState<{ key: string; result?: Result; error?: string } | null>(null);
  const mapSvg = useRef<SVGSVGElement>(null);
  const cutSvg = useRef<SVGSVGElement>(null);

  const sweep = map?.sweep;
  const points = useMemo(() => (rows ?? []).map((r) => ({ key: r.key, point: r.point })), [rows]);
  const cells = useMemo(() => (sweep ? mapCells(sweep, points) : []), [sweep, points]);
  const labels = useMemo(() => labelsOf(points), [points]);
  const observables = useMemo(() => scalarObservables(points), [points]);
  const boundaries = useMemo(() => (sweep ? boundariesOf(sweep, points) : []), [sweep, points]);
  const overrides = useMemo(() => Object.fromEntries((annotations ?? []).filter((a) => a.color).map((a) => [a.labelId, a.color as string])), [annotations]);
  const names = useMemo(() => Object.fromEntries((annotations ?? []).filter((a) => a.name).map((a) => [a.labelId, a.name as string])), [annotations]);
  const labelName = useCallback((id: string | undefined) => (id ? (names[id] ?? id) : 'unlabelled'), [names]);

  const mode = colourMode ?? (labels.length > 0 ? 'label' : 'observable');
  const obs = observable ?? observables.find((o) => o === 'fidelitySusceptibility' || o === 'structureFactorMax') ?? observables[0] ?? 'energyPerSite';
  const cutObs = cutObservable ?? (observables.includes('fidelitySusceptibility') ? 'fidelitySusceptibility' : (observables[0] ?? 'energyPerSite'));
  const range = useMemo(() => {
    const v = cells.map((c) => scalar(c.point, obs)).filter((x): x is number => x !== undefined);
    return v.length ? [Math.min(...v), Math.max(...v)] : [0, 1];
  }, [cells, obs]);
  const colouring: PlotColouring = {
    mode,
    observable: obs,
    colorOf: (c) => {
      if (mode === 'label') return phaseColor(c.labelId, labels, overrides);
      const v = scalar(c.point, obs);
      return v === undefined ? '#bdb6a6' : sequential(range[1] > range[0] ? (v - range[0]) / (range[1] - range[0]) : 0.5);
    },
  };
  const legend: LegendEntry[] = labels.map((id) => ({ labelId: id, name: labelName(id), color: phaseColor(id, labels, overrides), count: cells.filter((c) => c.labelId === id).length }));

  const selectCell = (cell: MapCell, additive = false) => {
    setSelected((s) => {
      const next = new Set(additive ? s : []);
      if (additive && s.has(cell.key)) next.delete(cell.key);
      else next.add(cell.key);
      return next;
    });
    if (!additive) setDetail({ key: cell.key });
  };

  useEffect(() => {
    if (!detail || detail.result || detail.error || !sweep) return;
    const cell = cells.find((c) => c.key === detail.key);
    if (!cell) return;
    let stale = false;
    const request: PointRequest = {
      model: sweep.model,
      method: sweep.method,
      solver: sweep.solver ?? {},
      parameters: cell.point.parameters,
      seed: pointSeed(sweep.seed ?? 0, cell.key),
      key: cell.key,
      axes: sweep.axes.map((a) => a.parameter),
    };
    solveDetail(request).then(
      (a) => !stale && setDetail({ key: cell.key, result: a.result }),
      (e: unknown) => !stale && setDetail({ key: cell.key, error: e instanceof Error ? e.message : String(e) }),
    );
    return () => {
      stale = true;
    };
  }, [detail, cells, sweep, solveDetail]);

  if (map === undefined || rows === undefined) return <p role="status">Loading the map…</p>;
  if (map === null || !sweep) return <p>No map with this id on this device.</p>;
  const caveats = caveatsOf(sweep, points);
  const detailCell = detail ? cells.find((c) => c.key === detail.key) : undefined;
  const title = `${map.name} — ${sweep.method === 'ed' ? 'exact diagonalization' : 'mean-field'}`;
  const fileBase = map.name.replace(/[^a-z0-9]+/gi, '-').replace(/^-|-$/g, '').toLowerCase() || 'map';

  return (
    <div className="space-y-5" data-testid="map-view" data-points={cells.length}>
      <Notice tone="warn" title={sweep.method === 'ed' ? 'Finite cluster' : 'Mean-field'}>
        <ul className="list-disc space-y-0.5 pl-4" data-testid="caveats">
          {caveats.map((c) => (
            <li key={c}>{c}</li>
          ))}
        </ul>
      </Notice>
      <div className="grid gap-5 lg:grid-cols-[minmax(0,1fr)_16rem]">
        <div className="relative space-y-2">
          <div className="flex flex-wrap items-center gap-3 text-sm">
            <label className="flex items-center gap-1.5">
              Colour by
              <select className="rounded border border-line bg-surface px-1.5 py-1" value={mode === 'label' ? 'label' : obs} aria-label="Colour by" onChange={(e) => {
                if (e.target.value === 'label') setColourMode('label');
                else {
                  setColourMode('observable');
                  setObservable(e.target.value);
                }
              }}>
                <option value="label" disabled={labels.length === 0}>
                  phase label{labels.length === 0 ? ' (none yet)' : ''}
                </option>
                {observables.map((o) => (
                  <option key={o} value={o}>
                    {o}
                  </option>
                ))}
              </select>
            </label>
            <span className="ml-auto flex gap-2">
              <Button variant="secondary" onClick={() => mapSvg.current && exportSvg(mapSvg.current, `${fileBase}.svg`)}>
                Export SVG
              </Button>
              <Button variant="secondary" onClick={() => mapSvg.current && void exportPng(mapSvg.current, `${fileBase}.png`)}>
                Export PNG
              </Button>
            </span>
          </div>
          {cells.length === 0 ? (
            <p className="rounded-lg bg-surface p-6 text-sm text-ink-600 ring-1 ring-line">No points yet. They appear here as the sweep computes them.</p>
          ) : (
            <PhaseMapPlot
              ref={mapSvg}
              sweep={sweep}
              cells={cells}
              colouring={colouring}
              boundaries={boundaries}
              selectedKeys={selected}
              title={title}
              onHover={(cell, x, y) => setHover(cell ? { cell, x, y } : null)}
              onSelect={(c) => selectCell(c)}
            />
          )}
          {hover ? (
            <div className="pointer-events-none fixed z-20 rounded-md bg-ink-900 px-2 py-1 text-xs text-paper shadow" style={{ left: hover.x + 12, top: hover.y + 12 }} role="tooltip">
              <div className="font-semibold">{hover.cell.key}</div>
              <div>{labelName(hover.cell.labelId)}</div>
              <div>E = {hover.cell.point.energy.toPrecision(6)}</div>
              {mode === 'observable' ? <div>{obs} = {scalar(hover.cell.point, obs)?.toPrecision(4) ?? '—'}</div> : null}
              {hover.cell.flagged ? <div>unconverged or degenerate</div> : null}
            </div>
          ) : null}
          {mode === 'observable' && cells.length ? (
            <p className="text-xs text-ink-600">
              {obs}: {range[0].toPrecision(4)} (paper) … {range[1].toPrecision(4)} (ink)
            </p>
          ) : null}
        </div>
        <aside className="space-y-3">
          <h2 className="text-sm font-bold text-ink-900">Phase labels</h2>
          <MapLegend entries={legend} onRename={canAnnotate ? (id, name) => void annotateLabel(mapId, id, { name }) : undefined} onRecolor={canAnnotate ? (id, color) => void annotateLabel(mapId, id, { color }) : undefined} />
          {boundaries.length ? <p className="text-xs text-ink-600">Lines: boundaries between labels; shaded: their uncertainty (half the spacing of the points on either side).</p> : null}
          <p className="text-xs text-ink-600">× not converged · ◦ degenerate ground state</p>
        </aside>
      </div>

      {cells.length ? (
        <section className="space-y-2" aria-label="Cut">
          <div className="flex flex-wrap items-center gap-3 text-sm">
            <label className="flex items-center gap-1.5">
              Observable along {sweep.axes[0].parameter}
              <select className="rounded border border-line bg-surface px-1.5 py-1" value={cutObs} aria-label="Cut observable" onChange={(e) => setCutObservable(e.target.value)}>
                <option value="energy">energy</option>
                {observables.map((o) => (
                  <option key={o} value={o}>
                    {o}
                  </option>
                ))}
              </select>
            </label>
            <span className="ml-auto flex gap-2">
              <Button variant="secondary" onClick={() => cutSvg.current && exportSvg(cutSvg.current, `${fileBase}-${cutObs}.svg`)}>
                Export cut SVG
              </Button>
              <Button variant="secondary" onClick={() => cutSvg.current && void exportPng(cutSvg.current, `${fileBase}-${cutObs}.png`)}>
                Export cut PNG
              </Button>
            </span>
          </div>
          <CutPlot ref={cutSvg} sweep={sweep} cells={cells} observable={cutObs} selectedKeys={selected} onSelect={(c) => selectCell(c)} colorOf={colouring.colorOf} measured={measured} />
        </section>
      ) : null}

      {detail && detailCell ? <PointDetail pointKey={detail.key} point={detailCell.point} result={detail.result} error={detail.error} labelName={detailCell.labelId ? labelName(detailCell.labelId) : undefined} bands={{ model: sweep.model, compute: computeBands, fileBase: `${fileBase}-${detail.key.replace(/[^a-z0-9.]+/gi, "-")}` }} /> : null}

      {cells.length ? <PointsTable cells={cells} parameters={sweep.axes.map((a) => a.parameter)} labelName={labelName} selectedKeys={selected} onSelect={selectCell} /> : null}
    </div>
  );
}
