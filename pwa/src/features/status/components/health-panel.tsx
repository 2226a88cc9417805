import { CORE_VERSION } from '@phasewright/physics-core';
import { Disclosure, DisclosureButton, DisclosurePanel } from '@headlessui/react';
import type { ReactNode } from 'react';
import { Badge } from '../../../components/ui/badge.js';
import { Button } from '../../../components/ui/button.js';
import { Card } from '../../../components/ui/card.js';
import { Notice } from '../../../components/ui/notice.js';
import { ApiError } from '../../../lib/api-client.js';
import { useOnlineStatus } from '../../../lib/use-online-status.js';
import { DeviceCard } from './device-card.js';
import { HEALTH_PATH, useHealth, type Health } from '../api/get-health.js';

export function formatUptime(seconds: number): string {
  const s = Math.max(0, Math.floor(seconds));
  const days = Math.floor(s / 86_400);
  const hours = Math.floor((s % 86_400) / 3600);
  const minutes = Math.floor((s % 3600) / 60);
  if (days > 0) return `${days} d ${hours} h`;
  if (hours > 0) return `${hours} h ${minutes} min`;
  if (minutes > 0) return `${minutes} min ${s % 60} s`;
  return `${s} s`;
}

export function formatLatency(ms: number | null): string {
  if (ms === null) return '—';
  return ms < 1 ? '< 1 ms' : `${Math.round(ms)} ms`;
}

function Field({ label, children }: { label: string; children: ReactNode }) {
  return (
    <div className="flex justify-between gap-4 border-t border-line py-2 first:border-t-0">
      <dt className="text-sm text-ink-600">{label}</dt>
      <dd className="text-right text-sm font-semibold text-ink-900">{children}</dd>
    </div>
  );
}

function HealthCards({ health }: { health: Health }) {
  const dbUp = health.database.status === 'up';
  const coreMatches = health.core.version === CORE_VERSION;
  return (
    <div className="grid gap-4 md:grid-cols-3">
      <Card
        title="Database"
        data={{ health: 'database', state: health.database.status }}
        aside={<Badge tone={dbUp ? 'good' : 'bad'}>{dbUp ? 'Up' : 'Down'}</Badge>}
      >
        <dl>
          <Field label="Status">{dbUp ? 'Database is up' : 'Database is down'}</Field>
          <Field label="Round trip">{formatLatency(health.database.latencyMs)}</Field>
        </dl>
        {health.database.error ? (
          <p className="mt-2 rounded-md bg-red-50 p-2 text-sm break-words text-red-900">{health.database.error}</p>
        ) : null}
      </Card>
      <Card
        title="Sync server"
        data={{ health: 'server', state: health.status }}
        aside={<Badge tone={health.status === 'ok' ? 'good' : 'warn'}>{health.status}</Badge>}
      >
        <dl>
          <Field label="Version">{health.server.version}</Field>
          <Field label="Uptime">{formatUptime(health.server.uptimeS)}</Field>
          <Field label="Node.js">{health.server.node}</Field>
        </dl>
      </Card>
      <Card
        title="Physics core"
        data={{ health: 'core', state: coreMatches ? 'match' : 'mismatch' }}
        aside={<Badge tone={coreMatches ? 'good' : 'warn'}>{coreMatches ? 'Same version' : 'Versions differ'}</Badge>}
      >
        <dl>
          <Field label="On the server">{health.core.version}</Field>
          <Field label="In this app">{CORE_VERSION}</Field>
        </dl>
        {coreMatches ? null : (
          <p className="mt-2 text-sm text-amber-900">
            Results computed here and on the server may differ; reload the app to pick up the server’s version.
          </p>
        )}
      </Card>
    </div>
  );
}

function describeFailure(error: unknown, online: boolean): { title: string; body: string } {
  if (!online || (error instanceof ApiError && error.kind === 'offline')) {
    return {
      title: 'You are offline',
      body: 'Phasewright keeps working on this device without a network. The server’s status will be checked again when the connection returns.',
    };
  }
  const detail = error instanceof Error ? error.message : String(error);
  if (error instanceof ApiError && (error.kind === 'unreachable' || error.kind === 'invalid-response')) {
    return { title: 'Sync server unreachable', body: `${detail} Work in this browser is unaffected; syncing waits until the server answers.` };
  }
  return { title: 'The health check failed', body: detail };
}

/** The status page body: asks GET /api/health and shows server, database and core. */
export function HealthPanel() {
  const online = useOnlineStatus();
  const { data, error, isPending, isFetching, fetchStatus, dataUpdatedAt, refetch } = useHealth();
  const paused = fetchStatus === 'paused';
  const failure = error || !online || paused ? describeFailure(error, online && !paused) : null;

  return (
    <div className="space-y-6">
      <div className="flex flex-wrap items-end justify-between gap-4">
        <div>
          <h1 className="text-3xl font-bold tracking-tight text-ink-900">Status</h1>
          <p className="mt-1 text-ink-700">
            What the sync server says about itself and its database (<code className="text-sm">{HEALTH_PATH}</code>).
          </p>
        </div>
        <div className="flex items-center gap-3">
          {dataUpdatedAt > 0 ? (
            <span className="text-sm text-ink-600">Checked {new Date(dataUpdatedAt).toLocaleTimeString()}</span>
          ) : null}
          <Button variant="secondary" onClick={() => void refetch()} disabled={isFetching || !online}>
            {isFetching ? 'Checking…' : 'Check again'}
          </Button>
        </div>
      </div>

      <div aria-live="polite" className="space-y-6">
        {failure ? (
          <div data-health="connection" data-state={online && !paused ? 'unreachable' : 'offline'}>
            <Notice tone={online && !paused ? 'error' : 'warn'} title={failure.title}>
              <p>{failure.body}</p>
              {data ? <p className="mt-1">The figures below are from the last successful check.</p> : null}
            </Notice>
          </div>
        ) : null}

        {isPending && !failure ? (
          <p className="text-ink-600" role="status">
            Asking the server…
          </p>
        ) : null}

        {data ? (
          <div className={failure ? 'opacity-60' : undefined}>
            <HealthCards health={data} />
          </div>
        ) : null}
      </div>

      <DeviceCard />

      {data ? (
        <Disclosure>
          <DisclosureButton className="text-sm font-semibold text-accent-700 underline underline-offset-2 data-hover:text-accent-600">
            Show the raw response
          </DisclosureButton>
          <DisclosurePanel>
            <pre className="mt-2 overflow-x-auto rounded-lg bg-ink-950 p-4 text-xs text-paper">
              {JSON.stringify(data, null, 2)}
            </pre>
          </DisclosurePanel>
        </Disclosure>
      ) : null}
    </div>
  );
}
