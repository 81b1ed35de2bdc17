import { describe, expect, it } from 'vitest';
import { sanitisedUntil, vesselState, type VesselStateInput } from '../../../shared/domain/vessel-state';

// A day is 24 × 60 × 60 × 1000 = 86,400,000 ms (SI day of 86,400 s), written out here, not
// taken from the code under test.
const DAY_MS = 86_400_000;
const NOW = new Date('2026-03-14T12:00:00.000Z');
const before = (ms: number) => new Date(NOW.getTime() - ms);

const empty = (seed: Partial<VesselStateInput> = {}): VesselStateInput => ({
  batchId: null,
  retiredAt: null,
  cleaningState: 'dirty',
  sanitisedAt: null,
  ...seed,
});

describe('vesselState', () => {
  it('reads dirty and clean from the cleaning state of an empty vessel', () => {
    expect(vesselState(empty({ cleaningState: 'dirty' }), 6, NOW)).toBe('dirty');
    expect(vesselState(empty({ cleaningState: 'clean' }), 6, NOW)).toBe('clean');
  });

  it("is sanitised while the sanitising is younger than the cellar's days", () => {
    expect(vesselState(empty({ cleaningState: 'sanitised', sanitisedAt: before(DAY_MS) }), 6, NOW)).toBe('sanitised');
  });

  it('is still sanitised at exactly the set days, and merely clean one millisecond later', () => {
    expect(vesselState(empty({ cleaningState: 'sanitised', sanitisedAt: before(6 * DAY_MS) }), 6, NOW)).toBe('sanitised');
    expect(vesselState(empty({ cleaningState: 'sanitised', sanitisedAt: before(6 * DAY_MS + 1) }), 6, NOW)).toBe('clean');
  });

  it("scales the lapse with the cellar's setting", () => {
    const sanitisedAt = before(3 * DAY_MS + 1);
    expect(vesselState(empty({ cleaningState: 'sanitised', sanitisedAt }), 3, NOW)).toBe('clean');
    expect(vesselState(empty({ cleaningState: 'sanitised', sanitisedAt }), 4, NOW)).toBe('sanitised');
  });

  it('with a setting of 0 days keeps the sanitising only for the moment itself', () => {
    expect(vesselState(empty({ cleaningState: 'sanitised', sanitisedAt: NOW }), 0, NOW)).toBe('sanitised');
    expect(vesselState(empty({ cleaningState: 'sanitised', sanitisedAt: before(1) }), 0, NOW)).toBe('clean');
  });

  it('accepts the timestamp as an ISO string', () => {
    expect(vesselState(empty({ cleaningState: 'sanitised', sanitisedAt: '2026-03-08T12:00:00.000Z' }), 6, NOW)).toBe('sanitised');
    expect(vesselState(empty({ cleaningState: 'sanitised', sanitisedAt: '2026-03-08T11:59:59.999Z' }), 6, NOW)).toBe('clean');
  });

  it('calls a vessel marked sanitised without a time merely clean, however long sanitising lasts', () => {
    expect(vesselState(empty({ cleaningState: 'sanitised', sanitisedAt: null }), 6, NOW)).toBe('clean');
    // Longer than the time since 1970, so a missing time read as the epoch would still count.
    expect(vesselState(empty({ cleaningState: 'sanitised', sanitisedAt: null }), 100_000, NOW)).toBe('clean');
  });

  it('judges at the present moment when no moment is given', () => {
    expect(vesselState(empty({ cleaningState: 'sanitised', sanitisedAt: new Date() }), 6)).toBe('sanitised');
    expect(vesselState(empty({ cleaningState: 'sanitised', sanitisedAt: new Date(Date.now() - 7 * DAY_MS) }), 6)).toBe('clean');
  });

  it('is holding whenever a batch is in it, whatever its cleaning state', () => {
    expect(vesselState(empty({ batchId: 'b-1', cleaningState: 'dirty' }), 6, NOW)).toBe('holding');
    expect(vesselState(empty({ batchId: 'b-1', cleaningState: 'sanitised', sanitisedAt: NOW }), 6, NOW)).toBe('holding');
  });

  it('is retired once retired: that wins over holding, sanitised, clean and dirty', () => {
    const retiredAt = before(DAY_MS);
    expect(vesselState(empty({ retiredAt, batchId: 'b-1' }), 6, NOW)).toBe('retired');
    expect(vesselState(empty({ retiredAt, cleaningState: 'sanitised', sanitisedAt: NOW }), 6, NOW)).toBe('retired');
    expect(vesselState(empty({ retiredAt, cleaningState: 'clean' }), 6, NOW)).toBe('retired');
    expect(vesselState(empty({ retiredAt: '2026-01-01T00:00:00.000Z', cleaningState: 'dirty' }), 6, NOW)).toBe('retired');
  });
});

describe('sanitisedUntil', () => {
  it('is the sanitising time plus the set days', () => {
    expect(sanitisedUntil(new Date('2026-03-01T10:00:00.000Z'), 6).toISOString()).toBe('2026-03-07T10:00:00.000Z');
    expect(sanitisedUntil('2026-02-27T23:30:00.000Z', 2).toISOString()).toBe('2026-03-01T23:30:00.000Z');
    expect(sanitisedUntil('2026-03-01T10:00:00.000Z', 0).toISOString()).toBe('2026-03-01T10:00:00.000Z');
  });

  it('is the last moment vesselState still says sanitised', () => {
    const sanitisedAt = new Date('2026-03-01T10:00:00.000Z');
    const until = sanitisedUntil(sanitisedAt, 6);
    const vessel = empty({ cleaningState: 'sanitised', sanitisedAt });
    expect(vesselState(vessel, 6, until)).toBe('sanitised');
    expect(vesselState(vessel, 6, new Date(until.getTime() + 1))).toBe('clean');
  });
});
