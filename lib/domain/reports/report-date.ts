/**
 * The one place the report turns an instant into words. A jurisdiction's time zone is not stored
 * yet, so every report time is UTC and says so; storing the zone later changes only this file.
 */
export const REPORT_TIME_ZONE = 'UTC';

const parts = new Intl.DateTimeFormat('en-CA', {
  timeZone: REPORT_TIME_ZONE,
  year: 'numeric',
  month: '2-digit',
  day: '2-digit',
  hour: '2-digit',
  minute: '2-digit',
  hourCycle: 'h23',
});

/** `2026-12-01 09:05 UTC`: year first so no locale reads the day and month the other way round. */
export function formatReportDateTime(at: Date | string): string {
  const date = at instanceof Date ? at : new Date(at);
  if (Number.isNaN(date.getTime())) return 'unknown date';
  const p = Object.fromEntries(parts.formatToParts(date).map((x) => [x.type, x.value]));
  return `${p.year}-${p.month}-${p.day} ${p.hour}:${p.minute} ${REPORT_TIME_ZONE}`;
}
