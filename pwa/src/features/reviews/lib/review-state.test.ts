import { describe, expect, it } from 'vitest';
import { mapReviewState } from './review-state.js';

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
