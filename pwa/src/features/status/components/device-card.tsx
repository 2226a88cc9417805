import { CORE_VERSION } from '@phasewright/physics-core';
import { Badge } from '../../../components/ui/badge.js';
import { Card } from '../../../components/ui/card.js';
import { useServiceWorkerControlled, useServiceWorkerState } from '../../../lib/service-worker.js';
import { useOnlineStatus } from '../../../lib/use-online-status.js';

/** What this browser knows without asking the server. */
export function DeviceCard() {
  const online = useOnlineStatus();
  const controlled = useServiceWorkerControlled();
  const { offlineReady, error } = useServiceWorkerState();
  const cached = controlled || offlineReady;
  return (
    <Card
      title="This device"
      data={{ health: 'device', state: online ? 'online' : 'offline' }}
      aside={<Badge tone={online ? 'good' : 'warn'}>{online ? 'Online' : 'Offline'}</Badge>}
    >
      <dl className="grid gap-x-8 sm:grid-cols-2">
        <div className="py-1">
          <dt className="text-sm text-ink-600">Offline copy</dt>
          <dd className="text-sm font-semibold text-ink-900">
            {error ? `Not available: ${error}` : cached ? 'Cached — opens without a network' : 'Not cached yet'}
          </dd>
        </div>
        <div className="py-1">
          <dt className="text-sm text-ink-600">Physics core in this app</dt>
          <dd className="text-sm font-semibold text-ink-900">v{CORE_VERSION}</dd>
        </div>
      </dl>
    </Card>
  );
}
