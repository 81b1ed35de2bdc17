import { describe, expect, it } from 'vitest';
import { localDate, localDateTime } from '../../server/core/local-date';

// Offsets from the IANA time zone database; the EU's summer time starts at 01:00 UTC on the last
// Sunday of March (Directive 2000/84/EC), which in 2026 is 29 March.
describe('localDateTime', () => {
  it("writes a moment as the cellar's wall clock showed it", () => {
    expect(localDateTime(new Date('2026-07-01T10:20:00Z'), 'UTC')).toBe('2026-07-01 10:20');
    expect(localDateTime(new Date('2026-07-01T10:20:00Z'), 'Asia/Kolkata')).toBe('2026-07-01 15:50');
    expect(localDateTime(new Date('2026-07-01T03:05:00Z'), 'America/Chicago')).toBe('2026-06-30 22:05');
  });

  it('follows a daylight-saving change and writes midnight as 00, not 24', () => {
    expect(localDateTime(new Date('2026-03-29T00:59:00Z'), 'Europe/Berlin')).toBe('2026-03-29 01:59');
    expect(localDateTime(new Date('2026-03-29T01:00:00Z'), 'Europe/Berlin')).toBe('2026-03-29 03:00');
    expect(localDateTime(new Date('2026-12-03T23:00:00Z'), 'Europe/Berlin')).toBe('2026-12-04 00:00');
  });

  it('agrees with localDate on the day', () => {
    const at = new Date('2026-12-31T23:30:00Z');
    expect(localDateTime(at, 'Pacific/Auckland').slice(0, 10)).toBe(localDate(at, 'Pacific/Auckland'));
    expect(localDate(at, 'Pacific/Auckland')).toBe('2027-01-01');
  });
});

describe('localDate', () => {
  it("gives the calendar day by the cellar's clock, on either side of its midnight", () => {
    // Auckland is UTC+13 in summer (NZDT), Chicago UTC-6 in winter (CST): IANA time zone database.
    expect(localDate(new Date('2026-12-31T10:59:00Z'), 'Pacific/Auckland')).toBe('2026-12-31');
    expect(localDate(new Date('2026-12-31T11:00:00Z'), 'Pacific/Auckland')).toBe('2027-01-01');
    expect(localDate(new Date('2027-01-01T05:59:00Z'), 'America/Chicago')).toBe('2026-12-31');
    expect(localDate(new Date('2027-01-01T06:00:00Z'), 'America/Chicago')).toBe('2027-01-01');
    expect(localDate(new Date('2026-12-31T23:59:59Z'), 'UTC')).toBe('2026-12-31');
  });
});
