import { describe, expect, it } from 'vitest';
import { reloadAfterSync, updatePrompt } from './update-prompt.js';

describe('updatePrompt', () => {
  it('says nothing without a waiting service worker, whatever the sync does', () => {
    expect(updatePrompt({ needRefresh: false, sync: { phase: 'syncing', waiting: 3 }, reloadPending: false }).kind).toBe('hidden');
  });

  it('offers a plain reload when nothing waits and no sync runs', () => {
    const p = updatePrompt({ needRefresh: true, sync: { phase: 'up-to-date', waiting: 0 }, reloadPending: false });
    expect(p.kind).toBe('ready');
    expect(p.title).toMatch(/new version/);
  });

  it('asks to wait while a sync runs, and says the outbox survives a reload', () => {
    const p = updatePrompt({ needRefresh: true, sync: { phase: 'syncing', waiting: 2 }, reloadPending: false });
    expect(p.kind).toBe('busy');
    expect(p.body).toContain('A sync is running (2 changes to push)');
    expect(p.body).toContain('Nothing is lost by reloading');
  });

  it('asks to wait while changes wait and can be sent now', () => {
    const p = updatePrompt({ needRefresh: true, sync: { phase: 'waiting', waiting: 1 }, reloadPending: false });
    expect(p.kind).toBe('busy');
    expect(p.body).toContain('1 change waits to be pushed');
  });

  it.each([
    ['offline', 'this device is offline'],
    ['sign-in', 'a sign-in is needed'],
    ['conflict', 'conflicts wait for you'],
    ['refused', 'did not go through'],
    ['error', 'did not go through'],
  ] as const)('does not hold the reload for changes that cannot go out (%s)', (phase, why) => {
    const p = updatePrompt({ needRefresh: true, sync: { phase, waiting: 4 }, reloadPending: false });
    expect(p.kind).toBe('held');
    expect(p.body).toContain('4 changes cannot be pushed now');
    expect(p.body).toContain(why);
  });

  it('shows the pending reload once the user chose to wait for the sync', () => {
    const p = updatePrompt({ needRefresh: true, sync: { phase: 'syncing', waiting: 5 }, reloadPending: true });
    expect(p.kind).toBe('pending');
    expect(p.body).toContain('as soon as the sync has finished (5 changes to push)');
  });

  it('treats an unknown sync state (still loading) as nothing waiting', () => {
    expect(updatePrompt({ needRefresh: true, sync: undefined, reloadPending: false }).kind).toBe('ready');
  });
});

describe('reloadAfterSync', () => {
  it('reloads only after the sync round has finished', async () => {
    const order: string[] = [];
    let finishSync: () => void = () => {};
    const sync = () =>
      new Promise<void>((resolve) => {
        order.push('sync started');
        finishSync = () => {
          order.push('sync finished');
          resolve();
        };
      });
    const done = reloadAfterSync({ sync, reload: async () => void order.push('reload') });
    await Promise.resolve();
    expect(order).toEqual(['sync started']);
    finishSync();
    await done;
    expect(order).toEqual(['sync started', 'sync finished', 'reload']);
  });

  it('still reloads when the sync round fails (the outbox stays in IndexedDB)', async () => {
    let reloaded = false;
    await expect(
      reloadAfterSync({
        sync: () => Promise.reject(new Error('server not reached')),
        reload: async () => {
          reloaded = true;
        },
      }),
    ).rejects.toThrow('server not reached');
    expect(reloaded).toBe(true);
  });
});
