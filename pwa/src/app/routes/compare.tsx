import type { PhaseMap } from '@phasewright/physics-core';
import { useLiveQuery } from 'dexie-react-hooks';
import { useEffect, useMemo, useState } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import { Notice } from '../../components/ui/notice.js';
import { comparableObservables, compare, differenceCells, differenceScale, divergingColor } from '../../features/compare/lib/compare-data.js';
import { PhaseMapPlot } from '../../features/maps/components/phase-map-plot.js';
import { boundariesOf, labelsOf, mapCells, type MapCell } from '../../features/maps/lib/map-data.js';
import { loadPhaseMap } from '../../features/sweeps/api/sweeps.js';
import { LOCAL_PROJECT_ID, LOCAL_PROJECT_NAME, db } from '../../lib/db.js';
import { phaseColor } from '../../lib/phase-colors.js';

const noop = () => {};
const methodName = (m: string) => (m === 'ed' ? 'ED' : 'mean-field');

function usePhaseMap(id: string | null): PhaseMap | null | undefined {
  const [map, setMap] = useState<{ id: string | null; map: PhaseMap | null } | undefined>(undefined);
  // Re-read when the stored map changes (points still arriving, or pulled).
  const stamp = useLiveQuery(async () => (id ? ((await db.maps.get(id))?.updatedAt ?? 0) : 0), [id]);
  useEffect(() => {
    let stale = false;
    if (!id) return;
    void loadPhaseMap(id).then((m) => !stale && setMap({ id, map: m ?? null }));
    return () => {
      stale = true;
    };
  }, [id, stamp]);
  if (!id) return null;
  return map?.id === id ? map.map : undefined;
}

/** /compare?a=MAP&b=MAP — two maps side by side, a difference map on common points, boundary overlay. */
export function Component() {
  const [params, setParams] = useSearchParams();
  const aId = params.get('a');
  const bId = params.get('b');
  const choices = useLiveQuery(async () => {
    const [maps, projects] = await Promise.all([db.maps.toArray(), db.projects.toArray()]);
    const names = new Map(projects.map((p) => [p.id, p.name]));
    return maps
      .map((m) => ({ id: m.id, label: `${m.name} · ${methodName(m.method)} · ${m.lattice} ${m.sweep.model.lattice.size.join('×')} · ${m.pointCount} pts`, project: m.projectId === LOCAL_PROJECT_ID ? LOCAL_PROJECT_NAME : (names.get(m.projectId) ?? 'shared project') }))
      .sort((x, y) => x.project.localeCompare(y.project) || x.label.localeCompare(y.label));
  }, []);
  const a = usePhaseMap(aId);
  const b = usePhaseMap(bId);
  const [observable, setObservable] = useState<string | null>(null);
  const comparison = useMemo(() => (a && b ? compare(a, b) : null), [a, b]);
  const observables = comparison ? comparableObservables(comparison) : [];
  const obs = observable && observables.includes(observable) ? observable : (observables[0] ?? 'energy');

  const pick = (side: 'a' | 'b', id: string) => {
    const next = new URLSearchParams(params);
    if (id) next.set(side, id);
    else next.delete(side);
    setParams(next, { replace: true });
  };
  const select = (side: 'a' | 'b', value: string | null) => (
    <label className="flex flex-1 flex-col gap-1 text-sm font-semibold text-ink-700">
      Map {side.toUpperCase()}
      <select className="rounded border border-line bg-surface px-2 py-1.5 font-normal" aria-label={`Map ${side.toUpperCase()}`} value={value ?? ''} onChange={(e) => pick(side, e.target.value)}>
        <option value="">choose a map…</option>
        {(choices ?? []).map((c) => (
          <option key={c.id} value={c.id}>
            {c.project} — {c.label}
          </option>
        ))}
      </select>
    </label>
  );

  return (
    <div className="space-y-6">
      <title>Compare maps · Phasewright</title>
      <div>
        <p className="text-sm font-semibold text-ink-600">Compare</p>
        <h1 className="text-2xl font-bold tracking-tight text-ink-900">Two maps</h1>
        <p className="mt-1 max-w-3xl text-sm text-ink-700">
          Any two maps on this device — two methods, two cluster sizes, two people. Points are matched by their parameter values; differences are B − A.
        </p>
      </div>
      <div className="flex flex-wrap gap-4">
        {select('a', aId)}
        {select('b', bId)}
      </div>
      {choices && choices.length < 2 ? <p className="text-ink-600">Comparing needs two maps on this device; run a sweep or sync a project first.</p> : null}
      {(aId && a === null) || (bId && b === null) ? <Notice tone="error" title="Map not on this device">One of the chosen maps is not stored here.</Notice> : null}
      {a && b && comparison ? <ComparisonView a={a} b={b} comparison={comparison} observables={observables} observable={obs} onObservable={setObservable} aId={aId ?? ''} bId={bId ?? ''} /> : null}
    </div>
  );
}

function ComparisonView({ a, b, comparison, observables, observable, onObservable, aId, bId }: { a: PhaseMap; b: PhaseMap; comparison: ReturnType<typeof compare>; observables: string[]; observable: string; onObservable: (o: string) => void; aId: string; bId: string }) {
  const r = comparison.result;
  const side = (m: PhaseMap) => {
    const points = Object.entries(m.points).map(([key, point]) => ({ key, point }));
    return { cells: mapCells(m.sweep, points), boundaries: boundariesOf(m.sweep, points), labels: labelsOf(points) };
  };
  const sa = side(a);
  const sb = side(b);
  const labels = [...new Set([...sa.labels, ...sb.labels])].sort();
  const labelColour = { mode: 'label' as const, observable: '', colorOf: (c: MapCell) => phaseColor(c.labelId, labels, {}) };
  const diffs = differenceCells(a, comparison, observable);
  const scale = differenceScale(diffs);
  const diffByKey = new Map(diffs.map((d) => [d.key, d.difference]));
  const diffCells = mapCells(a.sweep, diffs.map((d) => ({ key: d.key, point: d.point })));
  const methods = a.sweep.method !== b.sweep.method;
  const sizes = a.sweep.model.lattice.size.join('×') !== b.sweep.model.lattice.size.join('×') || a.sweep.model.lattice.kind !== b.sweep.model.lattice.kind;
  const title = (m: PhaseMap, s: string) => `${s}: ${m.sweep.name ?? 'map'} (${methodName(m.sweep.method)}, ${m.sweep.model.lattice.kind} ${m.sweep.model.lattice.size.join('×')})`;

  return (
    <div className="space-y-6" data-testid="comparison" data-common={r.common.length}>
      <p className="text-sm text-ink-800" data-testid="comparison-summary">
        {r.common.length} common points · {r.onlyInA.length} only in A · {r.onlyInB.length} only in B · labels agree on {r.labelAgreement.agree} of {r.labelAgreement.compared}
      </p>
      {methods || sizes ? (
        <Notice tone="warn" title="Read the differences with care">
          {methods ? 'ED on a finite cluster and Gutzwiller mean-field answer different questions: mean-field energies are upper bounds without correlations, and labels from the two need not agree even where both are right. ' : ''}
          {sizes ? 'Different clusters: finite-size shifts of energies per site and of boundaries are expected; compare per-site quantities.' : ''}
        </Notice>
      ) : null}
      {!comparison.sameAxes ? (
        <Notice tone="info" title="The maps sweep different parameters">
          Points are matched on the parameters they share ({r.sharedParameters.join(', ') || 'none'}); the maps are shown side by side, without a difference map.
        </Notice>
      ) : null}
      <div className="grid gap-4 lg:grid-cols-2">
        <PhaseMapPlot sweep={a.sweep} cells={sa.cells} colouring={labelColour} boundaries={sa.boundaries} selectedKeys={new Set()} onHover={noop} onSelect={noop} title={title(a, 'A')} />
        <PhaseMapPlot sweep={b.sweep} cells={sb.cells} colouring={labelColour} boundaries={sb.boundaries} selectedKeys={new Set()} onHover={noop} onSelect={noop} title={title(b, 'B')} />
      </div>
      <p className="text-xs text-ink-600">
        Phase colours are shared by both maps. <Link className="underline" to={`/maps/${aId}`}>Open A</Link> · <Link className="underline" to={`/maps/${bId}`}>Open B</Link>
      </p>

      {comparison.sameAxes && r.common.length > 0 ? (
        <section className="space-y-2" aria-label="Difference map">
          <div className="flex flex-wrap items-center gap-3 text-sm">
            <label className="flex items-center gap-1.5">
              Difference B − A of
              <select className="rounded border border-line bg-surface px-1.5 py-1" aria-label="Observable" value={observable} onChange={(e) => onObservable(e.target.value)}>
                {observables.map((o) => (
                  <option key={o} value={o}>
                    {o}
                  </option>
                ))}
              </select>
            </label>
            <span className="text-xs text-ink-600" data-testid="difference-scale">
              blue: B lower · paper: equal · orange: B higher · |Δ| up to {scale.toPrecision(3)}; dashed lines: B's boundaries over A's
            </span>
          </div>
          <PhaseMapPlot
            sweep={a.sweep}
            cells={diffCells}
            colouring={{ mode: 'observable', observable, colorOf: (c) => divergingColor(diffByKey.get(c.key), scale) }}
            boundaries={sa.boundaries}
            overlayBoundaries={sb.boundaries}
            selectedKeys={new Set()}
            onHover={noop}
            onSelect={noop}
            title={`${observable}: B − A on ${r.common.length} common points`}
          />
        </section>
      ) : null}

      <table className="w-full max-w-3xl text-left text-sm" aria-label="Differences by observable">
        <thead className="text-xs tracking-wide text-ink-600 uppercase">
          <tr>
            <th className="py-1.5">Observable</th>
            <th>Points</th>
            <th>max |B − A|</th>
            <th>at</th>
          </tr>
        </thead>
        <tbody className="divide-y divide-line bg-surface">
          {observables.map((o) => (
            <tr key={o} data-observable={o}>
              <td className="py-1.5 pl-2 font-semibold">{o}</td>
              <td>{r.summary[o].count}</td>
              <td className="font-mono">{r.summary[o].maxAbsDifference.toPrecision(4)}</td>
              <td className="font-mono text-xs">{r.summary[o].worstKey}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
