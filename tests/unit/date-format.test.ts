import { describe, expect, it } from 'vitest';
import { canonicalTimeZone, DEFAULT_TIME_ZONE, formatDate, formatDateTime, supportedTimeZones, timeZoneAbbreviation, UnknownTimeZoneError } from '@/lib/domain/dates/format';
import { timeZoneSchema } from '@/lib/domain/dates/time-zone-schema';

/*
 * Offsets and daylight-saving changes: IANA tz database (2025c as bundled with Node 20's ICU), files
 * `northamerica` and `asia`. Abbreviations: the short zone names of CLDR's en-US data as ICU renders them
 * (library behaviour): US zones get MST/MDT, zones with no English abbreviation get a GMT offset.
 */
describe('formatDateTime', () => {
  it('shows the instant on the jurisdiction’s clock with the zone’s abbreviation', () => {
    // tz database: America/Denver is UTC-6 (MDT) in summer, UTC-7 (MST) in winter.
    expect(formatDateTime('2026-07-01T18:30:00Z', 'America/Denver')).toBe('Jul 1, 2026, 12:30 PM MDT');
    expect(formatDateTime('2026-01-15T18:30:00Z', 'America/Denver')).toBe('Jan 15, 2026, 11:30 AM MST');
    expect(formatDateTime(new Date('2026-07-01T18:30:00Z'), 'UTC')).toBe('Jul 1, 2026, 6:30 PM UTC');
  });

  it('changes abbreviation on both sides of the spring and autumn changes', () => {
    // tz database `northamerica`, Rule US 2007 max: Mar Sun>=8 2:00 local (2026-03-08), Nov Sun>=1 2:00 local (2026-11-01).
    expect(formatDateTime('2026-03-08T08:59:00Z', 'America/Denver')).toBe('Mar 8, 2026, 1:59 AM MST');
    expect(formatDateTime('2026-03-08T09:00:00Z', 'America/Denver')).toBe('Mar 8, 2026, 3:00 AM MDT');
    expect(formatDateTime('2026-11-01T07:59:00Z', 'America/Denver')).toBe('Nov 1, 2026, 1:59 AM MDT');
    // The hour from 1:00 to 2:00 repeats: the abbreviation tells the two apart.
    expect(formatDateTime('2026-11-01T08:00:00Z', 'America/Denver')).toBe('Nov 1, 2026, 1:00 AM MST');
    expect(timeZoneAbbreviation('2026-03-08T08:59:00Z', 'America/Denver')).toBe('MST');
    expect(timeZoneAbbreviation('2026-03-08T09:00:00Z', 'America/Denver')).toBe('MDT');
  });

  it('keeps zones with a half-hour offset', () => {
    // tz database `asia`: Asia/Kolkata is UTC+5:30 all year; the local day is already the next one.
    expect(formatDateTime('2026-01-15T18:30:00Z', 'Asia/Kolkata')).toBe('Jan 16, 2026, 12:00 AM GMT+5:30');
    // tz database `northamerica`: America/St_Johns is UTC-3:30 in winter, UTC-2:30 in summer.
    expect(formatDateTime('2026-01-15T18:30:00Z', 'America/St_Johns')).toBe('Jan 15, 2026, 3:00 PM GMT-3:30');
    expect(formatDateTime('2026-07-01T18:30:00Z', 'America/St_Johns')).toBe('Jul 1, 2026, 4:00 PM GMT-2:30');
  });

  it('refuses a zone it does not know, and says so for an unreadable instant', () => {
    expect(() => formatDateTime('2026-07-01T18:30:00Z', 'Mars/Olympus_Mons')).toThrow(UnknownTimeZoneError);
    expect(() => formatDate('2026-07-01T18:30:00Z', 'Mars/Olympus_Mons')).toThrow(/Unknown time zone 'Mars\/Olympus_Mons'/);
    expect(formatDateTime('not a date', 'UTC')).toBe('unknown date');
  });
});

describe('formatDate', () => {
  it('gives the calendar day of the jurisdiction, not of UTC', () => {
    // 03:00 UTC on 2 July is 21:00 MDT on 1 July (tz database: America/Denver UTC-6 in summer).
    expect(formatDate('2026-07-02T03:00:00Z', 'America/Denver')).toBe('Jul 1, 2026, MDT');
    expect(formatDate('2026-07-02T03:00:00Z', 'UTC')).toBe('Jul 2, 2026, UTC');
  });
});

describe('time zones an admin may store', () => {
  it('lists UTC first and the runtime’s IANA zones', () => {
    const zones = supportedTimeZones();
    expect(zones[0]).toBe(DEFAULT_TIME_ZONE);
    expect(zones).toEqual(expect.arrayContaining(['America/Denver', 'America/St_Johns', 'Europe/Berlin']));
    expect(new Set(zones).size).toBe(zones.length);
  });

  it('accepts IANA names and aliases, refuses offsets, abbreviations and inventions', () => {
    expect(canonicalTimeZone('America/Denver')).toBe('America/Denver');
    expect(canonicalTimeZone('america/denver')).toBe('America/Denver');
    expect(canonicalTimeZone('Asia/Kolkata')).toBe('Asia/Kolkata'); // tz database `backward`: Asia/Calcutta links to it
    expect(canonicalTimeZone('Etc/UTC')).toBe('Etc/UTC');
    for (const bad of ['Mars/Olympus_Mons', '+05:30', 'EST', 'GMT+5', 'Etc/GMT+5', '', 'America/Denver; DROP']) expect(canonicalTimeZone(bad)).toBeNull();
  });

  it('parses through the shared schema with a field message', () => {
    expect(timeZoneSchema.parse(' America/St_Johns ')).toBe('America/St_Johns');
    const bad = timeZoneSchema.safeParse('Moon/Base');
    expect(bad.success).toBe(false);
    expect(bad.error!.issues[0].message).toMatch(/'Moon\/Base' is not a time zone/);
    expect(timeZoneSchema.safeParse(42).success).toBe(false);
  });
});

describe('formatDateTime with seconds', () => {
  it('adds seconds for logs, still labelled', () => {
    expect(formatDateTime('2026-07-01T18:30:05Z', 'America/Denver', { seconds: true })).toBe('Jul 1, 2026, 12:30:05 PM MDT');
  });
});
