import { render, screen, within } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { AppProvider } from '../../../app/provider.js';
import { createQueryClient } from '../../../lib/query-client.js';
import { formatLatency, formatUptime, HealthPanel } from './health-panel.js';

function respondWith(body: unknown): void {
  vi.stubGlobal(
    'fetch',
    vi.fn(async () => new Response(JSON.stringify(body), { status: 200, headers: { 'content-type': 'application/json' } })),
  );
}

function renderPanel() {
  return render(
    <AppProvider client={createQueryClient()}>
      <HealthPanel />
    </AppProvider>,
  );
}

afterEach(() => vi.unstubAllGlobals());

describe('HealthPanel', () => {
  it('shows the database up with its round-trip time and the versions', async () => {
    respondWith({
      status: 'ok',
      server: { version: '0.3.1', uptimeS: 3725, node: 'v20.20.2' },
      database: { status: 'up', latencyMs: 3.2 },
      core: { version: '9.9.9' },
    });
    const { container } = renderPanel();
    expect(await screen.findByText('Database is up')).toBeTruthy();
    const database = container.querySelector<HTMLElement>('[data-health="database"]');
    expect(database?.dataset.state).toBe('up');
    expect(within(database!).getByText('3 ms')).toBeTruthy();
    expect(screen.getByText('0.3.1')).toBeTruthy();
    expect(screen.getByText('1 h 2 min')).toBeTruthy();
    // The server's core differs from the one built into this app: the page says so.
    expect(screen.getByText('Versions differ')).toBeTruthy();
    expect(fetch).toHaveBeenCalledWith('/api/health', expect.anything());
  });

  it('shows the database down with the reason the server gives', async () => {
    respondWith({
      status: 'degraded',
      server: { version: '0.3.1', uptimeS: 5, node: 'v20.20.2' },
      database: { status: 'down', latencyMs: null, error: 'connect ECONNREFUSED 127.0.0.1:3999' },
      core: { version: '0.1.0' },
    });
    const { container } = renderPanel();
    expect(await screen.findByText('Database is down')).toBeTruthy();
    expect(container.querySelector<HTMLElement>('[data-health="database"]')?.dataset.state).toBe('down');
    expect(screen.getByText('connect ECONNREFUSED 127.0.0.1:3999')).toBeTruthy();
  });

  it('says the server is unreachable when the request fails', async () => {
    vi.stubGlobal('fetch', vi.fn(async () => Promise.reject(new TypeError('Failed to fetch'))));
    const { container } = renderPanel();
    expect(await screen.findByText('Sync server unreachable')).toBeTruthy();
    expect(container.querySelector('[data-health="database"]')).toBeNull();
  });
});

describe('formatting', () => {
  it('formats uptime and latency for people', () => {
    expect(formatUptime(59.9)).toBe('59 s');
    expect(formatUptime(61)).toBe('1 min 1 s');
    expect(formatUptime(3725)).toBe('1 h 2 min');
    expect(formatUptime(2 * 86_400 + 3 * 3600)).toBe('2 d 3 h');
    expect(formatLatency(null)).toBe('—');
    expect(formatLatency(0.4)).toBe('< 1 ms');
    expect(formatLatency(12.6)).toBe('13 ms');
  });
});
