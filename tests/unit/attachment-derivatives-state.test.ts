import { describe, expect, it } from 'vitest';
import { derivativesState } from '@/lib/domain/attachments/derivatives';

describe('the words shown in place of a thumbnail', () => {
  const d = (status: Parameters<typeof derivativesState>[0]['status'], attempts = 0) => derivativesState({ status, attempts, maxAttempts: 4, lastError: null });

  it('offers "make again" only after the last attempt failed', () => {
    expect(d('failed', 4)).toEqual({ label: 'thumbnail not made after 4 attempts', tone: 'problem', canMakeAgain: true });
    expect(d('failed', 1).label).toBe('thumbnail not made after 1 attempt');
    for (const s of ['pending', 'making', 'retrying', 'ready'] as const) expect(d(s, 1).canMakeAgain, s).toBe(false);
  });

  it('says how far the retries have come', () => {
    expect(d('retrying', 2)).toEqual({ label: 'thumbnail failed, retrying (2 of 4 attempts made)', tone: 'problem', canMakeAgain: false });
    expect(d('making', 1).label).toBe('thumbnail being made');
    expect(d('making', 3).label).toBe('thumbnail being made (attempt 3)');
    expect(d('pending')).toEqual({ label: 'thumbnail queued', tone: 'pending', canMakeAgain: false });
    expect(d('ready').tone).toBe('done');
  });
});
