import { describe, expect, it } from 'vitest';
import { shareExpiry, shareLinkState } from './share-link';

const now = new Date('2026-03-01T12:00:00Z');
describe('share links', () => {
  it('expire after the given days, 14 by default, and refuse odd durations', () => {
    expect(shareExpiry(now).toISOString()).toBe('2026-03-15T12:00:00.000Z');
    expect(shareExpiry(now, 1).toISOString()).toBe('2026-03-02T12:00:00.000Z');
    for (const d of [0, -1, 1.5, 91, Number.NaN]) expect(() => shareExpiry(now, d)).toThrow(RangeError);
  });
  it.each([
    ['active before expiry', { expiresAt: new Date('2026-03-02T00:00:00Z'), revokedAt: null }, 'active'],
    ['expired at the instant', { expiresAt: now, revokedAt: null }, 'expired'],
    ['expired after', { expiresAt: new Date('2026-02-01T00:00:00Z'), revokedAt: null }, 'expired'],
    ['revoked beats active', { expiresAt: new Date('2026-04-01T00:00:00Z'), revokedAt: new Date('2026-02-28T00:00:00Z') }, 'revoked'],
    ['revoked beats expired', { expiresAt: new Date('2026-02-01T00:00:00Z'), revokedAt: new Date('2026-01-28T00:00:00Z') }, 'revoked'],
  ] as const)('%s', (_n, link, state) => {
    expect(shareLinkState(link, now)).toBe(state);
  });
});
