/**
 * The one place an instant becomes words for a person: pages, e-mails and reports. Every date is shown in
 * a named IANA time zone (a project's jurisdiction's, or UTC where nothing ties the page to a place) with
 * the zone's abbreviation, so a reader never has to guess whose clock it is. Machine answers (JSON, CSV)
 * keep ISO 8601 in UTC and do not come here.
 *
 * The locale is fixed so the server and the browser write the same text (no hydration mismatch) and so
 * e-mails and reports read the same whoever renders them. Imports nothing, so client components may use it.
 */

/** The zone for places that belong to no jurisdiction (account pages, people, the admin's audit log). */
export const DEFAULT_TIME_ZONE = 'UTC';

const LOCALE = 'en-US';
const UNKNOWN = 'unknown date';

const dateTimeFormats = new Map<string, Intl.DateTimeFormat>();
const secondsFormats = new Map<string, Intl.DateTimeFormat>();
const dateFormats = new Map<string, Intl.DateTimeFormat>();

export class UnknownTimeZoneError extends RangeError {
  constructor(readonly timeZone: string) {
    super(`Unknown time zone '${timeZone}': use an IANA name such as America/Denver or UTC.`);
    this.name = 'UnknownTimeZoneError';
  }
}

function formatter(cache: Map<string, Intl.DateTimeFormat>, timeZone: string, options: Intl.DateTimeFormatOptions): Intl.DateTimeFormat {
  let f = cache.get(timeZone);
  if (!f) {
    try {
      f = new Intl.DateTimeFormat(LOCALE, { ...options, timeZone, timeZoneName: 'short' });
    } catch {
      throw new UnknownTimeZoneError(timeZone);
    }
    cache.set(timeZone, f);
  }
  return f;
}

const dateTimeOptions: Intl.DateTimeFormatOptions = { year: 'numeric', month: 'short', day: 'numeric', hour: 'numeric', minute: '2-digit' };
const secondsOptions: Intl.DateTimeFormatOptions = { ...dateTimeOptions, second: '2-digit' };
const dateOptions: Intl.DateTimeFormatOptions = { year: 'numeric', month: 'short', day: 'numeric' };

function toDate(at: Date | string | number): Date | null {
  const date = at instanceof Date ? at : new Date(at);
  return Number.isNaN(date.getTime()) ? null : date;
}

/**
 * `Jul 1, 2026, 12:30 PM MDT`: the month is a word, so no reader takes the day for the month. Throws
 * `UnknownTimeZoneError` for a zone the runtime does not know; an unreadable instant reads "unknown date".
 */
export function formatDateTime(at: Date | string | number, timeZone: string, opts: { seconds?: boolean } = {}): string {
  // Seconds only where order within a minute matters (audit logs).
  const f = opts.seconds ? formatter(secondsFormats, timeZone, secondsOptions) : formatter(dateTimeFormats, timeZone, dateTimeOptions);
  const date = toDate(at);
  return date ? f.format(date) : UNKNOWN;
}

/** `Jul 1, 2026, MDT`: a calendar day as the zone sees it (the UTC day may differ), with the zone named. */
export function formatDate(at: Date | string | number, timeZone: string): string {
  const f = formatter(dateFormats, timeZone, dateOptions);
  const date = toDate(at);
  return date ? f.format(date) : UNKNOWN;
}

/** The zone's abbreviation at that instant (`MST` in January, `MDT` in July; `GMT+5:30` where none is in use). */
export function timeZoneAbbreviation(at: Date | string | number, timeZone: string): string {
  const date = toDate(at) ?? new Date(0);
  return formatter(dateTimeFormats, timeZone, dateTimeOptions).formatToParts(date).find((p) => p.type === 'timeZoneName')?.value ?? timeZone;
}

/**
 * The IANA zones this runtime knows, as an admin picks them. Node's ICU lists canonical names only (no
 * `UTC`, and some zones under older names), so UTC is added; a zone entered by another valid name is
 * still accepted by `canonicalTimeZone`.
 */
export function supportedTimeZones(): string[] {
  return [DEFAULT_TIME_ZONE, ...Intl.supportedValuesOf('timeZone').filter((z) => z !== DEFAULT_TIME_ZONE)];
}

let supportedSet: Set<string> | null = null;

/**
 * The zone as it is stored, or null when the runtime does not know it. A name the runtime lists (or UTC)
 * is kept as written with its canonical capitals; another name is accepted when it is an alias of a listed
 * zone (`Asia/Kolkata` for `Asia/Calcutta`, `Etc/UTC`), so an admin may use the current IANA spelling.
 * Offsets and bare abbreviations (`+05:30`, `EST`) are refused: they carry no daylight-saving rules.
 */
export function canonicalTimeZone(value: string): string | null {
  supportedSet ??= new Set(supportedTimeZones());
  if (supportedSet.has(value)) return value;
  let resolved: string;
  try {
    resolved = new Intl.DateTimeFormat(LOCALE, { timeZone: value }).resolvedOptions().timeZone;
  } catch {
    return null;
  }
  if (!supportedSet.has(resolved) || !/^[A-Za-z]+(?:[/_-][A-Za-z0-9_+-]+)+$|^UTC$/.test(value)) return null;
  // Same zone in other capitals: store the listed spelling; an alias is stored as the admin wrote it.
  return resolved.toLowerCase() === value.toLowerCase() ? resolved : value;
}
