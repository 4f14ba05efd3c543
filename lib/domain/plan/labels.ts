import { keyWords } from '@/lib/domain/units';
import { entryAt, patternOf, planSections, registryEntries, type PlanEntry, type PlanFieldPattern } from '@/lib/domain/plan/registry';

const sectionTitles: ReadonlyMap<string, string> = new Map(planSections.map((s) => [s.id, s.title]));

function nameOf(entry: PlanEntry, key: string): string {
  return entry.term ?? entry.label ?? keyWords(key);
}

// A label used by more than one field ("Width": the enclosure's, each unit's, each door's) is qualified in
// messages by what holds it, so "Width: required" never leaves the reader guessing which.
const nameCounts: ReadonlyMap<string, number> = (() => {
  const counts = new Map<string, number>();
  for (const { entry, key } of registryEntries) {
    if (key === '*') continue;
    const name = nameOf(entry, key).toLowerCase();
    counts.set(name, (counts.get(name) ?? 0) + 1);
  }
  return counts;
})();

const capitalize = (text: string) => text.charAt(0).toUpperCase() + text.slice(1);
// "Width" → "width" inside a phrase, but "GFCI protected" keeps its capitals.
const lowerFirst = (text: string) => (/^[A-Z][a-z’'\s]/.test(text) ? text.charAt(0).toLowerCase() + text.slice(1) : text);

function topName(key: string): string {
  const top = entryAt(key);
  if (!top) return keyWords(key);
  return top.entry.term ?? (top.section && top.entry.kind === 'group' ? sectionTitles.get(top.section) : undefined) ?? top.entry.label ?? keyWords(key);
}

/**
 * A plan field's name in messages, from the registry: its label, qualified where the label alone is ambiguous
 * (`enclosure.width` → "Enclosure width"), and list items by their item names (`doors.0.hinges.1` → "Door 1,
 * hinge 2", `exhaust.run.2` → "Exhaust piece 3"). A key the plan does not have (an unknown field named in an
 * error) reads as its words.
 */
export function labelForPath(path: string): string {
  if (!path) return 'Value';
  const parts = path.split('.');
  // Phrases joined by ", ": list items found so far, then the field inside the last one.
  const phrases: string[] = [];
  let insideItem = false;
  let i = 0;
  for (; i < parts.length; i++) {
    const part = parts[i];
    if (!/^\d+$/.test(part)) continue;
    const list = entryAt(parts.slice(0, i).join('.'));
    if (!list || list.entry.kind !== 'list') break;
    const itemName = list.entry.itemTerm ?? list.entry.itemLabel ?? `${nameOf(list.entry, list.key)} item`;
    phrases.push(`${phrases.length === 0 ? capitalize(itemName) : lowerFirst(itemName)} ${Number(part) + 1}`);
    insideItem = true;
  }
  const lastIndex = parts.findLastIndex((part) => /^\d+$/.test(part));
  const rest = parts.slice(lastIndex + 1);
  if (rest.length === 0) return phrases.join(', ');
  const found = i === parts.length ? entryAt(path) : undefined;
  let name: string;
  if (!found) {
    name = rest.map(keyWords).join(' ');
    if (!insideItem && rest.length > 1 && entryAt(rest[0])) name = [topName(rest[0]), ...rest.slice(1).map(keyWords)].join(' ');
  } else {
    name = rest.length === 1 && found.entry.kind === 'group' ? topName(rest[0]) : nameOf(found.entry, found.key);
    // Shared, one-word ("Depth", "Fuel") or made from the key: say what holds it.
    const ambiguous =
      (nameCounts.get(name.toLowerCase()) ?? 0) > 1 || !/\s/.test(name) || (found.entry.label === undefined && found.entry.term === undefined);
    if (!insideItem && rest.length > 1 && ambiguous) name = `${topName(rest[0])} ${lowerFirst(name)}`;
  }
  phrases.push(phrases.length === 0 ? capitalize(name) : lowerFirst(name));
  return phrases.join(', ');
}

/** Whether the field at a path holds an area (sq in / cm²) rather than a length. */
export function isAreaPath(path: string): boolean {
  return entryAt(path)?.entry.kind === 'area';
}

/** Whether a plan path is one of `fields` or lies inside one of them (`doors.0.width` inside `doors`). */
export function isPathWithin(path: string, fields: readonly PlanFieldPattern[]): boolean {
  const pattern = patternOf(path);
  return fields.some((field) => pattern === field || pattern.startsWith(`${field}.`));
}
