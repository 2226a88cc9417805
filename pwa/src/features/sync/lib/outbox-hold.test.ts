import { describe, expect, it } from 'vitest';
import { outboxHold, type OutboxContext } from './outbox-hold.js';

const P = 'project-1';
const base: OutboxContext = {
  conflictIds: new Set(),
  roles: new Map([[P, 'editor']]),
  signedIn: true,
  canReach: true,
  online: true,
  engineRunning: false,
  lastError: null,
};
const entry = { projectId: P, entityId: 'model-1' };

describe('outboxHold', () => {
  it('an entry of an editor, online and signed in, simply waits for the next round', () => {
    expect(outboxHold(entry, base)).toEqual({ state: 'waiting', held: false, reason: 'goes out with the next sync round' });
  });

  it('a refused entry says what the server said', () => {
    const h = outboxHold({ ...entry, error: 'sweep.spec: must be an object' }, base);
    expect(h).toMatchObject({ state: 'refused', held: true });
    expect(h.reason).toContain('must be an object');
  });

  it('an entity with an open conflict is held for the user’s choice, even when everything else is fine', () => {
    expect(outboxHold(entry, { ...base, conflictIds: new Set(['model-1']) })).toMatchObject({ state: 'waiting', held: true, reason: expect.stringContaining('conflict') });
  });

  it('waits for sign-in when nobody is signed in or the sign-in has ended', () => {
    expect(outboxHold(entry, { ...base, signedIn: false, canReach: false }).reason).toContain('nobody is signed in');
    expect(outboxHold(entry, { ...base, canReach: false }).reason).toContain('has ended');
  });

  it('is held when the account cannot push to the project (role or membership)', () => {
    expect(outboxHold(entry, { ...base, roles: new Map([[P, 'reviewer']]) }).reason).toContain('(reviewer) cannot push');
    expect(outboxHold(entry, { ...base, roles: new Map([[P, 'viewer']]) }).held).toBe(true);
    expect(outboxHold(entry, { ...base, roles: new Map() }).reason).toContain('not a member');
    expect(outboxHold(entry, { ...base, roles: new Map([[P, 'owner']]) }).held).toBe(false);
  });

  it('waits for the network when offline (sign-in problems are named first)', () => {
    expect(outboxHold(entry, { ...base, online: false }).reason).toContain('for the network');
    expect(outboxHold(entry, { ...base, online: false, canReach: false }).reason).toContain('sign-in');
  });

  it('an entry with a batch id is being sent, or will be replayed under the same id', () => {
    expect(outboxHold({ ...entry, batchId: 'b1' }, { ...base, engineRunning: true })).toMatchObject({ state: 'sending', reason: 'sending now' });
    expect(outboxHold({ ...entry, batchId: 'b1' }, base).reason).toContain('same batch id');
  });

  it('after a failed round it says so and that it retries', () => {
    expect(outboxHold(entry, { ...base, lastError: 'The server did not answer' })).toMatchObject({ held: false, reason: expect.stringContaining('retried automatically') });
  });
});
