import { QueryClient, QueryClientProvider, useQuery } from '@tanstack/react-query';
import { act, renderHook, waitFor } from '@testing-library/react';
import type { ReactNode } from 'react';
import { describe, expect, it, vi } from 'vitest';
import type { EngineState } from '../../../lib/sync-engine.js';
import { useRefetchAfterSync } from './use-refetch-after-sync.js';

// The sync engine's state as the hook sees it, driven by the test.
const engine = vi.hoisted(() => {
  let state: EngineState = { running: false, lastError: null, lastSyncAt: null, needsSignIn: false };
  const listeners = new Set<() => void>();
  return {
    engineState: () => state,
    subscribeEngine: (l: () => void) => (listeners.add(l), () => listeners.delete(l)),
    finishRound(at: number) {
      state = { ...state, lastSyncAt: at };
      for (const l of listeners) l();
    },
  };
});
vi.mock('../../../lib/sync-engine.js', () => ({ engineState: engine.engineState, subscribeEngine: engine.subscribeEngine }));

function setup(queryFn: () => Promise<number>) {
  // The app's own stale time (lib/query-client.ts): cached data is not read again on mount for 30 s.
  const client = new QueryClient({ defaultOptions: { queries: { staleTime: 30_000, retry: false } } });
  const wrapper = ({ children }: { children: ReactNode }) => <QueryClientProvider client={client}>{children}</QueryClientProvider>;
  const useIt = () => {
    const query = useQuery({ queryKey: ['reviews'], queryFn });
    useRefetchAfterSync(query, true);
    return query;
  };
  return { mount: () => renderHook(useIt, { wrapper }) };
}

describe('useRefetchAfterSync', () => {
  it('reads again after a round that finishes while the page is shown', async () => {
    let n = 0;
    const { mount } = setup(async () => ++n);
    const { result } = mount();
    await waitFor(() => expect(result.current.data).toBe(1));
    act(() => engine.finishRound(Date.now() + 1));
    await waitFor(() => expect(result.current.data).toBe(2));
  });

  it('reads again on mount when a round finished while the page was not shown, within the stale time', async () => {
    let n = 0;
    const { mount } = setup(async () => ++n);
    const first = mount();
    await waitFor(() => expect(first.result.current.data).toBe(1));
    first.unmount();
    // The round that pushed new points from another page.
    engine.finishRound(Date.now() + 1);
    const second = mount();
    expect(second.result.current.data).toBe(1); // the cached answer first …
    await waitFor(() => expect(second.result.current.data).toBe(2)); // … then the fresh one
    // No round since: a further mount keeps the cache.
    second.unmount();
    const third = mount();
    await new Promise((r) => setTimeout(r, 50));
    expect(third.result.current.data).toBe(2);
    expect(n).toBe(2);
  });

  it('does not retry in a loop when the server cannot be reached', async () => {
    let calls = 0;
    const { mount } = setup(async () => {
      calls++;
      throw new Error('offline');
    });
    const { result } = mount();
    await waitFor(() => expect(result.current.isError).toBe(true));
    act(() => engine.finishRound(Date.now() + 1));
    await waitFor(() => expect(calls).toBe(2));
    await new Promise((r) => setTimeout(r, 100));
    expect(calls).toBe(2);
  });
});
