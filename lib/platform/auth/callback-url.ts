/**
 * Where to send someone after sign-in, sign-out or a refusal: only a path on our own site.
 *
 * Browsers read `/\host` and `//host` as another host (WHATWG URL standard: a backslash counts as a slash
 * in special URLs), and drop tab and newline anywhere in a URL, so `/<TAB>/host` becomes `//host`. Anything
 * that is not plainly one of our paths falls back to `fallback`. Pure: runs on the server and in the browser.
 */
export const HOME_PATH = '/home';

const MAX_LENGTH = 2048;
// C0 controls, DEL and the C1 controls; the URL parser strips or rejects all of them somewhere.
const CONTROL = /[\u0000-\u001f\u007f-\u009f]/;
const PLACEHOLDER_ORIGIN = 'http://callback.invalid';

/**
 * The value and its percent-decoded forms, so `%09`, `%5C` or `%252F%252F` cannot hide from the checks.
 * Decoding is per byte and tolerant: everything checked for (slash, backslash, controls) is ASCII, and a
 * stray `%` (as in `?q=100%`) is left as it is instead of making a good path fail.
 */
function decodedForms(value: string): string[] {
  const forms = [value];
  let current = value;
  for (let i = 0; i < 3 && /%[0-9a-f]{2}/i.test(current); i++) {
    current = current.replace(/%([0-9a-f]{2})/gi, (_, hex: string) => String.fromCharCode(parseInt(hex, 16)));
    forms.push(current);
  }
  return forms;
}

function isPlainPath(value: string): boolean {
  return value.startsWith('/') && !value.startsWith('//') && !value.includes('\\') && !CONTROL.test(value);
}

/**
 * The same-origin path (`/projects?q=x#y`) that `raw` names, or `fallback`. An absolute URL is accepted only
 * when `origin` is given and matches it exactly (next-auth hands its redirect callback absolute URLs).
 */
export function safeCallbackPath(raw: unknown, options: { origin?: string; fallback?: string } = {}): string {
  const fallback = options.fallback ?? HOME_PATH;
  if (typeof raw !== 'string' || raw.length === 0 || raw.length > MAX_LENGTH) return fallback;

  let candidate = raw;
  if (!raw.startsWith('/')) {
    if (!options.origin || CONTROL.test(raw) || raw.includes('\\')) return fallback;
    let url: URL;
    try {
      url = new URL(raw);
    } catch {
      return fallback;
    }
    if (url.origin !== options.origin || url.username || url.password) return fallback;
    candidate = url.pathname + url.search + url.hash;
  }

  if (!decodedForms(candidate).every(isPlainPath)) return fallback;

  // Let the URL parser have the last word: whatever it makes of the path must stay on our origin.
  let resolved: URL;
  try {
    resolved = new URL(candidate, PLACEHOLDER_ORIGIN);
  } catch {
    return fallback;
  }
  if (resolved.origin !== PLACEHOLDER_ORIGIN) return fallback;
  return resolved.pathname + resolved.search + resolved.hash;
}
