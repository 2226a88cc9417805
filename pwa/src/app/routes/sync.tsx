import { useLiveQuery } from 'dexie-react-hooks';
import { useSyncExternalStore } from 'react';
import { Link } from 'react-router-dom';
import { Button } from '../../components/ui/button.js';
import { Notice } from '../../components/ui/notice.js';
import { ConflictCard } from '../../features/sync/components/conflict-card.js';
import { syncStatusText, useSyncStatus } from '../../features/sync/hooks/use-sync-status.js';
import { outboxHold, type OutboxContext } from '../../features/sync/lib/outbox-hold.js';
import { LOCAL_PROJECT_ID, db, type OutboxEntry, type ProjectRole } from '../../lib/db.js';
import { discardRefused, engineState, retryRefused, subscribeEngine, syncNow } from '../../lib/sync-engine.js';
import { useOnlineStatus } from '../../lib/use-online-status.js';

interface Row {
  entry: OutboxEntry;
  name: string;
  project: string;
  href?: string;
}

async function describeEntries(entries: OutboxEntry[]): Promise<Row[]> {
  const projects = new Map((await db.projects.toArray()).map((p) => [p.id, p.name]));
  return Promise.all(
    entries.map(async (entry) => {
      const project = projects.get(entry.projectId) ?? entry.projectId;
      if (entry.entity === 'model') return { entry, project, name: (await db.models.get(entry.entityId))?.name ?? '(deleted)', href: `/models/${entry.entityId}` };
      if (entry.entity === 'sweep') return { entry, project, name: (await db.sweeps.get(entry.entityId))?.name ?? '(deleted)', href: `/sweeps/${entry.entityId}` };
      if (entry.entity === 'map' || entry.entity === 'point') {
        const m = await db.maps.get(entry.entityId);
        return { entry, project, name: m ? `${m.name} (${m.pointCount} points)` : '(deleted)', href: `/maps/${entry.entityId}` };
      }
      const l = await db.labels.get(entry.entityId);
      return { entry, project, name: l ? `label ${l.labelId} → ${l.name ?? l.labelId}` : '(deleted)', href: l ? `/maps/${l.mapId}` : undefined };
    }),
  );
}

/** /sync — what waits to be pushed, what the server refused, and the conflicts to resolve. */
export function Component() {
  const status = useSyncStatus();
  const rows = useLiveQuery(async () => describeEntries(await db.outbox.where('projectId').notEqual(LOCAL_PROJECT_ID).sortBy('seq')), []);
  const conflicts = useLiveQuery(() => db.conflicts.orderBy('id').toArray(), []);
  const states = useLiveQuery(() => db.syncState.toArray(), []);
  const online = useOnlineStatus();
  const engine = useSyncExternalStore(subscribeEngine, engineState, engineState);
  const access = useLiveQuery(async () => {
    const session = await db.session.get('current');
    const projects = session ? await db.projects.where('userId').equals(session.user.id).toArray() : [];
    return { signedIn: !!session, canReach: !!session?.refreshToken, roles: new Map<string, ProjectRole>(projects.map((p) => [p.id, p.myRole])) };
  }, []);
  const context: OutboxContext = {
    conflictIds: new Set((conflicts ?? []).map((c) => c.entityId)),
    roles: access?.roles ?? new Map(),
    signedIn: access?.signedIn ?? false,
    canReach: (access?.canReach ?? false) && !engine.needsSignIn,
    online,
    engineRunning: engine.running,
    lastError: engine.lastError,
  };
  const waiting = (rows ?? []).filter((r) => !r.entry.error);
  const heldCount = waiting.filter((r) => outboxHold(r.entry, context).held).length;
  const refused = (rows ?? []).filter((r) => r.entry.error);
  return (
    <div className="max-w-4xl space-y-6">
      <title>Sync · Phasewright</title>
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <p className="text-sm font-semibold text-ink-600">Sync</p>
          <h1 className="text-2xl font-bold tracking-tight text-ink-900" data-testid="sync-state">
            {status ? syncStatusText(status) : '…'}
          </h1>
          {status?.lastSyncAt ? <p className="text-sm text-ink-600">Last synced {new Date(status.lastSyncAt).toLocaleTimeString()}</p> : null}
        </div>
        <Button onClick={() => void syncNow()} disabled={status?.phase === 'local' || status?.phase === 'syncing'}>
          Sync now
        </Button>
      </div>
      {status?.phase === 'local' ? (
        <Notice tone="info" title="Nothing to sync">
          Work in “This device” stays in this browser. <Link className="font-semibold text-accent-700 underline" to="/sign-in">Sign in</Link> to share maps in projects.
        </Notice>
      ) : null}
      {status?.lastError && status.phase !== 'offline' ? <Notice tone="warn" title="The last attempt failed">{status.lastError}</Notice> : null}

      <section aria-labelledby="conflicts-heading" className="space-y-3">
        <h2 id="conflicts-heading" className="text-lg font-bold text-ink-900">
          Conflicts ({conflicts?.length ?? 0})
        </h2>
        {conflicts && conflicts.length > 0 ? (
          <ul className="space-y-3">{conflicts.map((c) => <ConflictCard key={c.id} conflict={c} />)}</ul>
        ) : (
          <p className="text-sm text-ink-600">None. A conflict appears when someone changed a name or label on the server after this device last saw it.</p>
        )}
      </section>

      <section aria-labelledby="waiting-heading" className="space-y-2">
        <h2 id="waiting-heading" className="text-lg font-bold text-ink-900">
          Waiting to be pushed ({waiting.length})
        </h2>
        {heldCount > 0 ? (
          <p className="text-sm text-ink-700" data-testid="held-summary">
            {heldCount} of them {heldCount === 1 ? 'is' : 'are'} held until the reason given beside {heldCount === 1 ? 'it' : 'them'} is cleared. They stay in this
            browser's database meanwhile; nothing is lost.
          </p>
        ) : null}
        {waiting.length ? (
          <ul className="divide-y divide-line rounded-xl bg-surface text-sm ring-1 ring-line" aria-label="Waiting">
            {waiting.map((r) => {
              const hold = outboxHold(r.entry, context);
              return (
                <li key={r.entry.seq} className="flex flex-wrap items-baseline gap-x-3 gap-y-1 px-4 py-2" data-outbox-state={hold.state} data-held={String(hold.held)}>
                  <span className="w-14 text-xs font-semibold text-ink-600 uppercase">{r.entry.entity}</span>
                  {r.href ? <Link className="font-semibold text-ink-900 hover:underline" to={r.href}>{r.name}</Link> : <span>{r.name}</span>}
                  <span className="text-ink-600">{r.project}</span>
                  <span className="ml-auto text-xs text-ink-500">queued {new Date(r.entry.createdAt).toLocaleTimeString()}</span>
                  <p className={`w-full text-xs ${hold.held ? 'font-semibold text-amber-900' : 'text-ink-600'}`} data-testid="outbox-reason">
                    {hold.state === 'sending' ? 'sending' : 'waiting'} — {hold.reason}
                  </p>
                </li>
              );
            })}
          </ul>
        ) : (
          <p className="text-sm text-ink-600">Nothing waits.</p>
        )}
      </section>

      {refused.length ? (
        <section aria-labelledby="refused-heading" className="space-y-2">
          <h2 id="refused-heading" className="text-lg font-bold text-ink-900">
            Refused by the server ({refused.length})
          </h2>
          <ul className="divide-y divide-line rounded-xl bg-surface text-sm ring-1 ring-red-300">
            {refused.map((r) => (
              <li key={r.entry.seq} className="space-y-1 px-4 py-2">
                <p>
                  <span className="font-semibold">{r.name}</span> <span className="text-ink-600">({r.entry.entity}, {r.project})</span>
                </p>
                <p className="text-red-800">{r.entry.error}</p>
                <div className="flex gap-2">
                  <Button variant="secondary" onClick={() => void retryRefused([r.entry.seq as number])}>
                    Try again
                  </Button>
                  <Button variant="ghost" onClick={() => void discardRefused([r.entry.seq as number])}>
                    Discard (keep it on this device only)
                  </Button>
                </div>
              </li>
            ))}
          </ul>
        </section>
      ) : null}

      {states && states.length ? (
        <p className="text-xs text-ink-600">Pull cursors: {states.map((s) => `${s.projectId.slice(0, 8)}… at ${s.cursor}`).join(' · ')}</p>
      ) : null}
    </div>
  );
}
