import { useLiveQuery } from 'dexie-react-hooks';
import { useState } from 'react';
import { Link } from 'react-router-dom';
import { Button } from '../../../components/ui/button.js';
import { ConfirmDialog } from '../../../components/ui/confirm-dialog.js';
import { db } from '../../../lib/db.js';
import { deleteLocal, describeDeletion, planLocalDelete, type LocalDeletion } from '../api/delete-local.js';

type Kind = 'model' | 'sweep' | 'map';
type Row = { kind: Kind; id: string; name: string; updatedAt: number; detail: string; method?: string; lattice?: string; ownerId: string | null };

/** A map's review state as the route read it from the server (see features/reviews/lib/review-state.ts). */
export interface ReviewStateInfo {
  state: string;
  text: string;
  /** Shown as a tooltip (reviewer, time). */
  detail?: string;
}

interface ProjectItemsProps {
  projectId: string;
  /** Display names of the project's members by user id (the author filter); empty offline. */
  authors?: Record<string, string>;
  /** The signed-in user (shown as "me"). */
  myUserId?: string;
  /** Review state per map id; undefined while unknown (offline, signed out, loading). */
  reviewStates?: Record<string, ReviewStateInfo>;
  /** The review states to offer in the filter, in order, with their words. */
  reviewStateOptions?: readonly { value: string; label: string }[];
  /** Why review states are not available (shown beside the disabled filter). */
  reviewStatesNote?: string;
  /**
   * This device's own space only: offer Delete on each item, refusing sweeps for which this returns
   * true (a run going on in this tab).
   */
  deletable?: { isRunning: (sweepId: string) => boolean };
}

const selectClass = 'rounded border border-line bg-surface px-2 py-1.5 disabled:opacity-60';

/** A project's models, sweeps and maps as stored on this device, newest first, with search and filters. */
export function ProjectItems({ projectId, authors = {}, myUserId, reviewStates, reviewStateOptions = [], reviewStatesNote, deletable }: ProjectItemsProps) {
  const [deletion, setDeletion] = useState<{ plan?: LocalDeletion; busy?: boolean; error?: string }>({});
  const askDelete = async (kind: Kind, id: string) => {
    try {
      setDeletion({ plan: await planLocalDelete(kind, id, deletable?.isRunning) });
    } catch (e) {
      setDeletion({ error: e instanceof Error ? e.message : String(e) });
    }
  };
  const confirmDelete = async () => {
    const plan = deletion.plan;
    if (!plan) return;
    setDeletion({ plan, busy: true });
    try {
      await deleteLocal(plan);
      setDeletion({});
    } catch (e) {
      setDeletion({ plan, error: `Nothing was deleted: ${e instanceof Error ? e.message : String(e)}` });
    }
  };
  const [q, setQ] = useState('');
  const [kind, setKind] = useState<'all' | Kind>('all');
  const [method, setMethod] = useState<'all' | 'ed' | 'meanfield'>('all');
  const [lattice, setLattice] = useState('all');
  const [author, setAuthor] = useState('all');
  const [review, setReview] = useState('all');
  const rows = useLiveQuery(async (): Promise<Row[]> => {
    const [models, sweeps, maps] = await Promise.all([
      db.models.where('projectId').equals(projectId).toArray(),
      db.sweeps.where('projectId').equals(projectId).toArray(),
      db.maps.where('projectId').equals(projectId).toArray(),
    ]);
    return [
      ...models.map((m) => ({ kind: 'model' as const, id: m.id, name: m.name, updatedAt: m.updatedAt, detail: `${m.spec.lattice.kind} ${m.spec.lattice.size.join('×')}`, lattice: m.spec.lattice.kind, ownerId: m.ownerId })),
      ...sweeps.map((s) => ({ kind: 'sweep' as const, id: s.id, name: s.name, updatedAt: s.updatedAt, detail: `${s.spec.axes.map((a) => a.parameter).join(' × ')}`, method: s.spec.method, lattice: s.spec.model.lattice.kind, ownerId: s.ownerId })),
      ...maps.map((m) => ({ kind: 'map' as const, id: m.id, name: m.name, updatedAt: m.updatedAt, detail: `${m.pointCount} points`, method: m.method, lattice: m.lattice, ownerId: m.ownerId })),
    ].sort((a, b) => b.updatedAt - a.updatedAt);
  }, [projectId]);
  const all = rows ?? [];
  const authorName = (id: string | null) => (id === null ? 'unknown' : id === myUserId ? `${authors[id] ?? 'me'} (me)` : (authors[id] ?? `member ${id.slice(0, 8)}…`));
  // Everyone who authored something here, and every member (so that "by me" is there even when one person did all).
  const authorIds = [...new Set([...all.map((r) => r.ownerId ?? ''), ...Object.keys(authors)])].sort((a, b) => authorName(a || null).localeCompare(authorName(b || null)));
  const lattices = [...new Set(all.map((r) => r.lattice).filter((l): l is string => !!l))].sort();
  const needle = q.trim().toLowerCase();
  const shown = all.filter(
    (r) =>
      (kind === 'all' || r.kind === kind) &&
      (method === 'all' || r.method === method) &&
      (lattice === 'all' || r.lattice === lattice) &&
      (author === 'all' || (r.ownerId ?? '') === author) &&
      (review === 'all' || (r.kind === 'map' && reviewStates?.[r.id]?.state === review)) &&
      (!needle || `${r.name} ${r.detail} ${r.lattice ?? ''}`.toLowerCase().includes(needle)),
  );
  const href = (r: Row) => (r.kind === 'model' ? `/models/${r.id}` : r.kind === 'sweep' ? `/sweeps/${r.id}` : `/maps/${r.id}`);
  return (
    <div className="space-y-5">
      <div className="flex flex-wrap items-center gap-3 text-sm">
        <input className="w-64 rounded border border-line bg-surface px-2 py-1.5" placeholder="Search names, lattices, axes" aria-label="Search" value={q} onChange={(e) => setQ(e.target.value)} />
        <select className={selectClass} aria-label="Kind" value={kind} onChange={(e) => setKind(e.target.value as typeof kind)}>
          <option value="all">models, sweeps and maps</option>
          <option value="model">models</option>
          <option value="sweep">sweeps</option>
          <option value="map">maps</option>
        </select>
        <select className={selectClass} aria-label="Method" value={method} onChange={(e) => setMethod(e.target.value as typeof method)}>
          <option value="all">any method</option>
          <option value="ed">exact diagonalization</option>
          <option value="meanfield">mean-field</option>
        </select>
        <select className={selectClass} aria-label="Lattice" value={lattice} onChange={(e) => setLattice(e.target.value)}>
          <option value="all">any lattice</option>
          {lattices.map((l) => (
            <option key={l} value={l}>
              {l}
            </option>
          ))}
        </select>
        {authorIds.length > 1 || author !== 'all' ? (
        <select className={selectClass} aria-label="Author" value={author} onChange={(e) => setAuthor(e.target.value)}>
          <option value="all">anyone</option>
          {authorIds.map((id) => (
            <option key={id || 'unknown'} value={id}>
              by {authorName(id || null)}
            </option>
          ))}
        </select>
        ) : null}
        {reviewStateOptions.length > 0 ? (
        <select className={selectClass} aria-label="Review state" value={review} onChange={(e) => setReview(e.target.value)} disabled={!reviewStates}>
          <option value="all">any review state</option>
          {reviewStateOptions.map((o) => (
            <option key={o.value} value={o.value}>
              maps {o.label}
            </option>
          ))}
        </select>
        ) : null}
        {!reviewStates && reviewStatesNote ? <span className="text-xs text-ink-600">{reviewStatesNote}</span> : null}
      </div>
      {deletion.error && !deletion.plan ? (
        <p className="text-sm text-red-800" role="alert">
          {deletion.error}
        </p>
      ) : null}
      {rows === undefined ? (
        <p role="status">Loading…</p>
      ) : shown.length === 0 ? (
        <p className="text-ink-600">{rows.length === 0 ? 'Nothing here yet on this device: start with a new model.' : 'Nothing matches.'}</p>
      ) : (
        <ul className="divide-y divide-line rounded-xl bg-surface ring-1 ring-line" aria-label="Items">
          {shown.map((r) => {
            const rs = r.kind === 'map' ? reviewStates?.[r.id] : undefined;
            return (
              <li key={`${r.kind}:${r.id}`} className="flex flex-wrap items-baseline gap-3 px-4 py-2.5" data-kind={r.kind} data-review-state={rs?.state}>
                <span className="w-14 text-xs font-semibold tracking-wide text-ink-600 uppercase">{r.kind}</span>
                <Link to={href(r)} className="font-semibold text-ink-900 underline-offset-2 hover:underline">
                  {r.name}
                </Link>
                <span className="text-sm text-ink-600">{r.detail}</span>
                {r.method ? <span className="text-xs text-ink-600">{r.method === 'ed' ? 'ED' : 'mean-field'}</span> : null}
                {/* This device's own space has no owners (nothing there leaves the browser): no "by". */}
                {r.ownerId !== null || Object.keys(authors).length > 0 ? <span className="text-xs text-ink-600">by {authorName(r.ownerId)}</span> : null}
                {rs && rs.state !== 'none' ? (
                  <span className={`text-xs font-semibold ${rs.state === 'approved' ? 'text-good-700' : rs.state === 'requested' ? 'text-ink-700' : 'text-amber-900'}`} title={rs.detail}>
                    {rs.text}
                  </span>
                ) : null}
                <span className="ml-auto text-xs text-ink-500">{new Date(r.updatedAt).toLocaleString()}</span>
                {deletable ? (
                  <Button variant="ghost" className="px-2 py-0.5 text-xs" onClick={() => void askDelete(r.kind, r.id)} aria-label={`Delete ${r.kind} ${r.name}`}>
                    Delete
                  </Button>
                ) : null}
              </li>
            );
          })}
        </ul>
      )}
      <ConfirmDialog
        open={!!deletion.plan}
        title={`Delete this ${deletion.plan?.kind ?? 'item'}?`}
        confirmLabel="Delete for good"
        busy={deletion.busy}
        error={deletion.plan ? deletion.error : undefined}
        onConfirm={() => void confirmDelete()}
        onClose={() => setDeletion({})}
      >
        {deletion.plan ? (
          <>
            <p>This deletes {describeDeletion(deletion.plan)} from this browser.</p>
            <p>It was never sent to a server, so no copy remains anywhere: export it first (data package or JSON) if you may want it again.</p>
          </>
        ) : null}
      </ConfirmDialog>
    </div>
  );
}
