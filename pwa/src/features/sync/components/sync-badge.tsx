import { Link } from 'react-router-dom';
import { Badge, type BadgeTone } from '../../../components/ui/badge.js';
import { syncStatusText, useSyncStatus, type SyncPhase } from '../hooks/use-sync-status.js';

const TONE: Record<SyncPhase, BadgeTone> = {
  local: 'neutral',
  'sign-in': 'warn',
  offline: 'warn',
  syncing: 'neutral',
  conflict: 'bad',
  refused: 'bad',
  error: 'warn',
  waiting: 'neutral',
  'up-to-date': 'good',
};

/** The header's sync state; a link to the sync page. */
export function SyncBadge() {
  const status = useSyncStatus();
  if (!status) return null;
  return (
    <Link to="/sync" aria-label={`Sync: ${syncStatusText(status)}`} data-testid="sync-badge" data-phase={status.phase} data-waiting={status.waiting} className="rounded-full">
      <Badge tone={TONE[status.phase]}>{syncStatusText(status)}</Badge>
    </Link>
  );
}
