import { entryAt, labelForPath } from '@/lib/domain/plan';
import { keyWords } from '@/lib/domain/units';

export type PlanChange = { path: string; label: string; from: unknown; to: unknown };

function isObject(v: unknown): v is Record<string, unknown> {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}

// Above every plan list limit (lib/domain/plan/registry.ts), so lists of a plan saved today always compare item by item.
const MAX_COMPARED_ITEMS = 100;

function entries(v: unknown): unknown {
  return Array.isArray(v) ? `${v.length.toLocaleString('en-US')} ${v.length === 1 ? 'entry' : 'entries'}` : v;
}

function walk(prev: unknown, next: unknown, path: string, out: PlanChange[]) {
  if (isObject(prev) && isObject(next)) {
    for (const key of new Set([...Object.keys(prev), ...Object.keys(next)])) {
      walk(prev[key], next[key], path ? `${path}.${key}` : key, out);
    }
    return;
  }
  // A list longer than any plan may hold (a revision stored before the plan limits) is one change, its
  // length: compared item by item it would cost seconds and list every one of its entries.
  if ((Array.isArray(prev) && prev.length > MAX_COMPARED_ITEMS) || (Array.isArray(next) && next.length > MAX_COMPARED_ITEMS)) {
    out.push({ path, label: labelForPath(path), from: entries(prev), to: entries(next) });
    return;
  }
  // Lists such as the exhaust run compare item by item, so reordering shows as changed positions.
  if (Array.isArray(prev) && Array.isArray(next)) {
    const n = Math.max(prev.length, next.length);
    for (let i = 0; i < n; i++) walk(prev[i], next[i], `${path}.${i}`, out);
    return;
  }
  if (JSON.stringify(prev) !== JSON.stringify(next)) {
    out.push({ path, label: labelForPath(path), from: prev, to: next });
  }
}

/** What changed between two plan revisions, as the installer entered them. */
export function diffPlans(prev: unknown, next: unknown): PlanChange[] {
  const out: PlanChange[] = [];
  walk(prev ?? {}, next ?? {}, '', out);
  return out;
}

/** A value as entered, in words: a group or list item reads as its fields' labels and values, never as JSON. */
function show(v: unknown, path: string): string {
  if (v === undefined) return '—';
  if (v === null) return 'none';
  if (typeof v === 'string') return v;
  if (typeof v === 'boolean') return v ? 'yes' : 'no';
  if (Array.isArray(v)) return v.map((item, i) => show(item, `${path}.${i}`)).join(', ') || 'none';
  if (isObject(v)) {
    const parts = Object.entries(v).map(([key, value]) => {
      const label = entryAt(`${path}.${key}`)?.entry.label ?? keyWords(key);
      return `${label.charAt(0).toLowerCase()}${label.slice(1)} ${show(value, `${path}.${key}`)}`;
    });
    return parts.length > 0 ? `(${parts.join(', ')})` : '—';
  }
  return String(v);
}

/** A one-line summary for the revision list: "Enclosure width 54 → 56; 2 more changes". */
export function summarizeChanges(changes: PlanChange[], max = 3): string {
  if (changes.length === 0) return 'No changes';
  const parts = changes.slice(0, max).map((c) => `${c.label} ${show(c.from, c.path)} → ${show(c.to, c.path)}`);
  const more = changes.length - max;
  return parts.join('; ') + (more > 0 ? `; ${more} more change${more === 1 ? '' : 's'}` : '');
}
