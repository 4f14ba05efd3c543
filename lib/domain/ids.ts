/** Row ids are UUIDs (RFC 9562 text form); anything else in a URL is answered 404 before any query runs. */
export const UUID_PATTERN = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export function isUuid(text: string): boolean {
  return UUID_PATTERN.test(text);
}
