import { useState } from 'react';
import { Link } from 'react-router-dom';
import { Button } from '../../../components/ui/button.js';
import { dismissServiceWorkerNotice, reloadWithUpdate, useServiceWorkerState } from '../../../lib/service-worker.js';
import { syncNow } from '../../../lib/sync-engine.js';
import { useSyncStatus } from '../hooks/use-sync-status.js';
import { reloadAfterSync, updatePrompt } from '../lib/update-prompt.js';

/**
 * "A new version is ready — Reload", aware of the sync: while a sync runs or changes wait to be
 * pushed, it offers to reload once they are sent (the outbox is in IndexedDB either way).
 */
export function UpdatePrompt() {
  const { needRefresh } = useServiceWorkerState();
  const sync = useSyncStatus();
  const [reloadPending, setReloadPending] = useState(false);
  const prompt = updatePrompt({ needRefresh, sync, reloadPending });
  if (prompt.kind === 'hidden') return null;
  const reloadNow = () => void reloadWithUpdate();
  const reloadWhenSynced = () => {
    setReloadPending(true);
    reloadAfterSync({ sync: syncNow, reload: reloadWithUpdate }).catch(() => setReloadPending(false));
  };
  return (
    <div
      role="status"
      className="fixed right-4 bottom-4 z-10 max-w-sm rounded-lg border border-line bg-surface p-4 shadow-lg"
      data-testid="update-prompt"
      data-kind={prompt.kind}
      data-waiting={prompt.waiting}
    >
      <p className="text-sm font-semibold text-ink-900">{prompt.title}</p>
      <p className="mt-1 text-sm text-ink-800">{prompt.body}</p>
      {prompt.kind === 'held' ? (
        <p className="mt-1 text-sm">
          <Link className="font-semibold text-accent-700 underline underline-offset-2" to="/sync">
            See what waits
          </Link>
        </p>
      ) : null}
      <div className="mt-3 flex flex-wrap gap-2">
        {prompt.kind === 'busy' ? (
          <>
            <Button onClick={reloadWhenSynced}>Reload when synced</Button>
            <Button variant="secondary" onClick={reloadNow}>
              Reload now
            </Button>
          </>
        ) : prompt.kind === 'pending' ? (
          <Button variant="secondary" onClick={reloadNow}>
            Reload now
          </Button>
        ) : (
          <Button onClick={reloadNow}>Reload</Button>
        )}
        {prompt.kind !== 'pending' ? (
          <Button variant="ghost" onClick={dismissServiceWorkerNotice}>
            Later
          </Button>
        ) : null}
      </div>
    </div>
  );
}
