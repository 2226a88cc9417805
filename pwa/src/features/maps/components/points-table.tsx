/** A map's points as a sortable, filterable table; selection is shared with the map. */
import { useMemo, useState } from 'react';
import type { MapCell } from '../lib/map-data.js';
import { scalar } from '../lib/map-data.js';

interface Props {
  cells: MapCell[];
  parameters: string[];
  labelName: (id: string | undefined) => string;
  selectedKeys: ReadonlySet<string>;
  onSelect: (cell: MapCell, additive: boolean) => void;
}

type SortKey = string;

export function PointsTable({ cells, parameters, labelName, selectedKeys, onSelect }: Props) {
  const [sort, setSort] = useState<{ key: SortKey; dir: 1 | -1 }>({ key: parameters[0] ?? 'energy', dir: 1 });
  const [filter, setFilter] = useState('');
  const [onlyFlagged, setOnlyFlagged] = useState(false);
  const rows = useMemo(() => {
    const f = filter.trim().toLowerCase();
    const value = (c: MapCell, k: SortKey): number | string => {
      if (parameters.includes(k)) return c.point.parameters[k];
      if (k === 'label') return labelName(c.labelId);
      if (k === 'energy') return c.point.energy;
      if (k === 'time') return c.point.wallMs;
      return scalar(c.point, k) ?? Number.NaN;
    };
    return cells
      .filter((c) => (!onlyFlagged || c.flagged) && (!f || labelName(c.labelId).toLowerCase().includes(f) || c.key.toLowerCase().includes(f)))
      .sort((a, b) => {
        const x = value(a, sort.key);
        const y = value(b, sort.key);
        return (typeof x === 'number' && typeof y === 'number' ? x - y : String(x).localeCompare(String(y))) * sort.dir;
      });
  }, [cells, filter, onlyFlagged, sort, parameters, labelName]);
  const cols: { key: SortKey; label: string }[] = [...parameters.map((p) => ({ key: p, label: p })), { key: 'energy', label: 'Energy' }, { key: 'gap', label: 'Gap' }, { key: 'label', label: 'Label' }, { key: 'time', label: 'Time (ms)' }];
  return (
    <section className="space-y-2" aria-label="Points">
      <div className="flex flex-wrap items-center gap-3 text-sm">
        <label className="flex items-center gap-1.5">
          Filter
          <input className="w-48 rounded border border-line bg-surface px-2 py-1" value={filter} onChange={(e) => setFilter(e.target.value)} placeholder="label or parameter" aria-label="Filter points" />
        </label>
        <label className="flex items-center gap-1.5">
          <input type="checkbox" checked={onlyFlagged} onChange={(e) => setOnlyFlagged(e.target.checked)} />
          only unconverged or degenerate
        </label>
        <span className="text-ink-600">
          {rows.length} of {cells.length} points · {selectedKeys.size} selected
        </span>
      </div>
      <div className="max-h-80 overflow-auto rounded-lg ring-1 ring-line">
        <table className="w-full text-left text-sm" data-testid="points-table">
          <thead className="sticky top-0 bg-paper">
            <tr>
              {cols.map((c) => (
                <th key={c.key} className="px-2 py-1.5 font-semibold" aria-sort={sort.key === c.key ? (sort.dir === 1 ? 'ascending' : 'descending') : 'none'}>
                  <button type="button" onClick={() => setSort((s) => ({ key: c.key, dir: s.key === c.key ? ((-s.dir) as 1 | -1) : 1 }))}>
                    {c.label}
                    {sort.key === c.key ? (sort.dir === 1 ? ' ↑' : ' ↓') : ''}
                  </button>
                </th>
              ))}
              <th className="px-2 py-1.5 font-semibold">Converged</th>
            </tr>
          </thead>
          <tbody>
            {rows.map((c) => (
              <tr
                key={c.key}
                className={`cursor-pointer border-t border-line ${selectedKeys.has(c.key) ? 'bg-accent-50' : 'bg-surface hover:bg-paper'}`}
                onClick={(e) => onSelect(c, e.shiftKey || e.metaKey || e.ctrlKey)}
                aria-selected={selectedKeys.has(c.key)}
                data-row={c.key}
              >
                {parameters.map((p) => (
                  <td key={p} className="px-2 py-1 tabular-nums">
                    {c.point.parameters[p]}
                  </td>
                ))}
                <td className="px-2 py-1 tabular-nums">{c.point.energy.toPrecision(7)}</td>
                <td className="px-2 py-1 tabular-nums">{scalar(c.point, 'gap')?.toPrecision(4) ?? '—'}</td>
                <td className="px-2 py-1">{labelName(c.labelId)}</td>
                <td className="px-2 py-1 tabular-nums">{c.point.wallMs.toFixed(0)}</td>
                <td className="px-2 py-1">{c.point.convergence.converged ? 'yes' : 'no'}{c.point.observables.degenerate === 1 ? ', degenerate' : ''}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </section>
  );
}
