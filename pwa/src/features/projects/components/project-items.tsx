import { useLiveQuery } from 'dexie-react-hooks';
import { useState } from 'react';
import { Link } from 'react-router-dom';
import { db } from '../../../lib/db.js';

type Row = { kind: 'model' | 'sweep' | 'map'; id: string; name: string; updatedAt: number; detail: string; method?: string; lattice?: string };

/** A project's models, sweeps and maps as stored on this device, newest first, with search and filters. */
export function ProjectItems({ projectId }: { projectId: string }) {
  const [q, setQ] = useState('');
  const [kind, setKind] = useState<'all' | Row['kind']>('all');
  const [method, setMethod] = useState<'all' | 'ed' | 'meanfield'>('all');
  const rows = useLiveQuery(async (): Promise<Row[]> => {
    const [models, sweeps, maps] = await Promise.all([
      db.models.where('projectId').equals(projectId).toArray(),
      db.sweeps.where('projectId').equals(projectId).toArray(),
      db.maps.where('projectId').equals(projectId).toArray(),
    ]);
    return [
      ...models.map((m) => ({ kind: 'model' as const, id: m.id, name: m.name, updatedAt: m.updatedAt, detail: `${m.spec.lattice.kind} ${m.spec.lattice.size.join('×')}`, lattice: m.spec.lattice.kind })),
      ...sweeps.map((s) => ({ kind: 'sweep' as const, id: s.id, name: s.name, updatedAt: s.updatedAt, detail: `${s.spec.axes.map((a) => a.parameter).join(' × ')}`, method: s.spec.method, lattice: s.spec.model.lattice.kind })),
      ...maps.map((m) => ({ kind: 'map' as const, id: m.id, name: m.name, updatedAt: m.updatedAt, detail: `${m.pointCount} points`, method: m.method, lattice: m.lattice })),
    ].sort((a, b) => b.updatedAt - a.updatedAt);
  }, [projectId]);
  const needle = q.trim().toLowerCase();
  const shown = (rows ?? []).filter((r) => (kind === 'all' || r.kind === kind) && (method === 'all' || r.method === method) && (!needle || `${r.name} ${r.detail} ${r.lattice ?? ''}`.toLowerCase().includes(needle)));
  const href = (r: Row) => (r.kind === 'model' ? `/models/${r.id}` : r.kind === 'sweep' ? `/sweeps/${r.id}` : `/maps/${r.id}`);
  return (
    <div className="space-y-5">
      <div className="flex flex-wrap gap-3 text-sm">
        <input className="w-64 rounded border border-line bg-surface px-2 py-1.5" placeholder="Search names, lattices, axes" aria-label="Search" value={q} onChange={(e) => setQ(e.target.value)} />
        <select className="rounded border border-line bg-surface px-2" aria-label="Kind" value={kind} onChange={(e) => setKind(e.target.value as typeof kind)}>
          <option value="all">models, sweeps and maps</option>
          <option value="model">models</option>
          <option value="sweep">sweeps</option>
          <option value="map">maps</option>
        </select>
        <select className="rounded border border-line bg-surface px-2" aria-label="Method" value={method} onChange={(e) => setMethod(e.target.value as typeof method)}>
          <option value="all">any method</option>
          <option value="ed">exact diagonalization</option>
          <option value="meanfield">mean-field</option>
        </select>
      </div>
      {rows === undefined ? (
        <p role="status">Loading…</p>
      ) : shown.length === 0 ? (
        <p className="text-ink-600">{rows.length === 0 ? 'Nothing here yet on this device: start with a new model.' : 'Nothing matches.'}</p>
      ) : (
        <ul className="divide-y divide-line rounded-xl bg-surface ring-1 ring-line" aria-label="Items">
          {shown.map((r) => (
            <li key={`${r.kind}:${r.id}`} className="flex flex-wrap items-baseline gap-3 px-4 py-2.5">
              <span className="w-14 text-xs font-semibold tracking-wide text-ink-600 uppercase">{r.kind}</span>
              <Link to={href(r)} className="font-semibold text-ink-900 underline-offset-2 hover:underline">
                {r.name}
              </Link>
              <span className="text-sm text-ink-600">{r.detail}</span>
              {r.method ? <span className="text-xs text-ink-600">{r.method === 'ed' ? 'ED' : 'mean-field'}</span> : null}
              <span className="ml-auto text-xs text-ink-500">{new Date(r.updatedAt).toLocaleString()}</span>
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}
