import { describe, expect, it } from 'vitest';
import { reviewActionForKey } from '@/features/desk/lib/review-keys';

describe('reviewActionForKey', () => {
  it('D, F and S rule dip, flat and systematic, whatever the letter case', () => {
    expect(reviewActionForKey({ key: 'd' })).toEqual({ type: 'rule', ruling: 'dip' });
    expect(reviewActionForKey({ key: 'F' })).toEqual({ type: 'rule', ruling: 'flat' });
    expect(reviewActionForKey({ key: 's' })).toEqual({ type: 'rule', ruling: 'systematic' });
  });

  it('N goes to the note; J and → go on, K and ← go back', () => {
    expect(reviewActionForKey({ key: 'n' })).toEqual({ type: 'focus-note' });
    expect(reviewActionForKey({ key: 'j' })).toEqual({ type: 'next' });
    expect(reviewActionForKey({ key: 'ArrowRight' })).toEqual({ type: 'next' });
    expect(reviewActionForKey({ key: 'k' })).toEqual({ type: 'previous' });
    expect(reviewActionForKey({ key: 'ArrowLeft' })).toEqual({ type: 'previous' });
  });

  it('while typing in a field, only Esc is ours (to leave the note)', () => {
    for (const key of ['d', 'f', 's', 'n', 'j', 'k', 'ArrowLeft', 'ArrowRight']) {
      expect(reviewActionForKey({ key, inTextField: true })).toBeNull();
    }
    expect(reviewActionForKey({ key: 'Escape', inTextField: true })).toEqual({ type: 'leave-note' });
  });

  it('leaves browser shortcuts and shifted keys alone', () => {
    expect(reviewActionForKey({ key: 'd', ctrlKey: true })).toBeNull();
    expect(reviewActionForKey({ key: 'f', metaKey: true })).toBeNull();
    expect(reviewActionForKey({ key: 's', altKey: true })).toBeNull();
    expect(reviewActionForKey({ key: 'ArrowRight', shiftKey: true })).toBeNull();
  });
});
