import { describe, expect, it } from 'vitest';
import { mapReviewState, reviewStatesByMap } from './review-state.js';

const at = (minute: number) => `2026-01-01T10:${String(minute).padStart(2, '0')}:00.000Z`;

describe('mapReviewState', () => {
  it('is "none" without reviews', () => {
    expect(mapReviewState([])).toBe('none');
  });

  it('takes the latest review by request time, not the order of the list', () => {
    const approved = { status: 'approved' as const, outdated: false, createdAt: at(5) };
    const changes = { status: 'changes-requested' as const, outdated: false, createdAt: at(1) };
    expect(mapReviewState([approved, changes])).toBe('approved');
    expect(mapReviewState([changes, approved])).toBe('approved');
  });

  it('shows an open request over an older verdict', () => {
    expect(mapReviewState([{ status: 'approved', outdated: true, createdAt: at(1) }, { status: 'requested', outdated: false, createdAt: at(2) }])).toBe('requested');
  });

  it('marks a verdict on a map that changed since as outdated, approved or not', () => {
    expect(mapReviewState([{ status: 'approved', outdated: true, createdAt: at(1) }])).toBe('outdated');
    expect(mapReviewState([{ status: 'changes-requested', outdated: true, createdAt: at(1) }])).toBe('outdated');
    expect(mapReviewState([{ status: 'changes-requested', outdated: false, createdAt: at(1) }])).toBe('changes-requested');
  });
});

describe('reviewStatesByMap', () => {
  const server = [
    { mapId: 'AAAAAAAA-0000-4000-8000-000000000001', state: 'outdated' as const, reviewerName: 'Rua Venn', updatedAt: at(3), pointCount: 5 },
    { mapId: 'aaaaaaaa-0000-4000-8000-000000000002', state: 'none' as const, reviewerName: null, updatedAt: null, pointCount: 3 },
    { mapId: 'aaaaaaaa-0000-4000-8000-000000000009', state: 'approved' as const, reviewerName: 'Rua Venn', updatedAt: at(4), pointCount: 2 },
  ];

  it('gives every local map a state: the server\'s (ids compared without case), "none" for maps the server lacks', () => {
    const local = ['aaaaaaaa-0000-4000-8000-000000000001', 'aaaaaaaa-0000-4000-8000-000000000002', 'aaaaaaaa-0000-4000-8000-000000000003'];
    const out = reviewStatesByMap(local, server);
    expect(Object.keys(out)).toEqual(local);
    expect(out[local[0]!]).toMatchObject({ state: 'outdated', text: 'verdict outdated' });
    expect(out[local[0]!]!.detail).toMatch(/^reviewer Rua Venn · updated .+ · 5 points on the server$/);
    expect(out[local[1]!]).toEqual({ state: 'none', text: 'not reviewed' });
    expect(out[local[2]!]).toEqual({ state: 'none', text: 'not reviewed' });
  });
});
