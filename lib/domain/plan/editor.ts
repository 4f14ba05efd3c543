// The plan editor's sections and fields, read off the registry: one renderer and one converter serve them all.
import {
  conditionsAt,
  planSections,
  registryEntries,
  type GroupEntry,
  type ListEntry,
  type NoneAnswer,
  type PlanEntry,
  type PlanSectionId,
} from '@/lib/domain/plan/registry';

export type EditorFieldKind = 'length' | 'area' | 'number' | 'boolean' | 'choice' | 'text' | 'length-list' | 'presence';

export interface EditorField {
  /** Path inside the plan (or inside one list item for list fields). */
  path: string;
  label: string;
  kind: EditorFieldKind;
  choices?: readonly (string | number)[];
  choiceLabels?: Readonly<Record<string, string>>;
  hint?: string;
  unit?: string;
  /** A thin length (duct wall): echoed in thousandths of an inch or tenths of a millimetre. */
  thin?: boolean;
  /** For 'presence' fields: the optional group of the plan this says is there, absent (null) or not known. */
  group?: string;
  /** The word that answers "none" (the maker gives no maximum; a door without hinges). */
  noneWord?: string;
  /** For a choice that also answers "none" for its group: that group's path (relative, like `path`). */
  noneOfGroup?: string;
  /**
   * Shown only when the plan field at this pattern applies (`fieldApplies`, list items as `*`); set only for
   * fields with conditions of their own or on a group holding them.
   */
  appliesPath?: string;
  /** For text set by another control: kept out of sight, or shown read-only. */
  display?: 'hidden' | 'read-only';
}

export interface EditorList {
  path: string;
  label: string;
  itemLabel: string;
  fields: EditorField[];
  newItem: Readonly<Record<string, string>>;
  /** The schema's limit for the list: the editor offers no more. */
  max: number;
  noun: string;
  /** Shown by its own component rather than the generic list editor. */
  bespoke?: ListEntry['bespoke'];
  /** Shown only when the list applies (see `EditorField.appliesPath`). */
  appliesPath?: string;
}

/** A group whose presence follows another field's answer (a gas supply follows a gas dryer). */
export interface FollowingGroup {
  path: string;
  follows: NonNullable<NoneAnswer['follows']>;
}

export interface EditorSection {
  id: PlanSectionId;
  title: string;
  intro?: string;
  fields: EditorField[];
  lists: EditorList[];
  /** Shown only while the field at `path` has the value `equals`. */
  shownWhen?: { path: string; equals: string };
}

const join = (prefix: string, key: string) => (prefix ? `${prefix}.${key}` : key);

/** `{ appliesPath }` when the field at this registry pattern has conditions, else nothing. */
const appliesOf = (pattern: string) => (conditionsAt(pattern).length > 0 ? { appliesPath: pattern } : {});

function leafField(entry: Exclude<PlanEntry, GroupEntry>, path: string): EditorField[] {
  const base = { path, label: entry.label ?? path, ...(entry.hint ? { hint: entry.hint } : {}) };
  const noneWord = entry.none?.word ? { noneWord: entry.none.word } : {};
  switch (entry.kind) {
    case 'length':
      return [{ ...base, kind: entry.kind, ...noneWord, ...(entry.thin ? { thin: true } : {}) }];
    case 'area':
      return [{ ...base, kind: entry.kind, ...noneWord }];
    case 'number':
      return [{ ...base, kind: 'number', unit: entry.unit }];
    case 'boolean':
      return [{ ...base, kind: 'boolean' }];
    case 'text':
      return [{ ...base, kind: 'text', ...(entry.editor ? { display: entry.editor } : {}) }];
    case 'choice':
      return [{ ...base, kind: 'choice', choices: entry.choices, ...(entry.choiceLabels ? { choiceLabels: entry.choiceLabels } : {}) }];
    case 'list':
      // A list inside a list item is typed as one text: "3, 40, 77".
      if (entry.item.kind !== 'length') throw new Error(`The editor cannot show the list ${path} in one field.`);
      return [{ ...base, kind: 'length-list', ...noneWord }];
  }
}

/** The fields of a group, in registry order; a group's presence question comes before its own fields. */
function groupFields(group: GroupEntry, prefix: string, out: EditorField[], lists: EditorList[] | null, base = '') {
  for (const [key, entry] of Object.entries(group.fields)) {
    const path = join(prefix, key);
    const pattern = join(base, path);
    if (entry.kind === 'group') {
      const none = entry.none;
      if (none?.ask) {
        out.push({ path: `_has.${path.replace(/\./g, '_')}`, label: none.ask, kind: 'presence', group: path, ...appliesOf(pattern) });
      }
      const start = out.length;
      groupFields(entry, path, out, lists, base);
      if (none?.choiceOf) {
        const i = out.findIndex((f, index) => index >= start && f.path === join(path, none.choiceOf!));
        const field = out[i];
        out[i] = {
          ...field,
          choices: [none.word ?? 'none', ...(field.choices ?? [])],
          choiceLabels: { [none.word ?? 'none']: none.word ?? 'none', ...field.choiceLabels },
          noneOfGroup: path,
        };
      }
    } else if (entry.kind === 'list' && lists) {
      lists.push(editorList(entry, path));
    } else {
      out.push(...leafField(entry, path).map((f) => ({ ...f, ...appliesOf(pattern) })));
    }
  }
}

function editorList(entry: ListEntry, path: string): EditorList {
  const fields: EditorField[] = [];
  if (entry.item.kind === 'group') groupFields(entry.item, '', fields, null, `${path}.*`);
  else fields.push(...leafField(entry.item, '').map((f) => ({ ...f, ...appliesOf(`${path}.*`) })));
  return {
    path,
    label: entry.label ?? path,
    itemLabel: entry.itemLabel ?? 'Item',
    fields,
    newItem: entry.newItem ?? {},
    max: entry.max,
    noun: entry.noun,
    ...(entry.bespoke ? { bespoke: entry.bespoke } : {}),
    ...appliesOf(path),
  };
}

function buildSections(): EditorSection[] {
  const topLevel = registryEntries.filter((e) => !e.path.includes('.'));
  return planSections.map((section) => {
    const fields: EditorField[] = [];
    const lists: EditorList[] = [];
    let shownWhen: EditorSection['shownWhen'];
    for (const { path, entry } of topLevel.filter((e) => e.section === section.id)) {
      if (entry.kind === 'group') {
        groupFields(entry, path, fields, lists);
        const follows = entry.none?.follows;
        if (follows) shownWhen = { path: follows.path, equals: follows.present };
      } else if (entry.kind === 'list') {
        lists.push(editorList(entry, path));
      } else {
        fields.push(...leafField(entry, path).map((f) => ({ ...f, ...appliesOf(path) })));
      }
    }
    return {
      id: section.id,
      title: section.title,
      ...('intro' in section ? { intro: section.intro } : {}),
      fields,
      lists,
      ...(shownWhen ? { shownWhen } : {}),
    };
  });
}

/** The editor's sections in order, with their fields and lists. */
export const editorSections: readonly EditorSection[] = buildSections();

/** Groups whose presence follows another field's answer. */
export const followingGroups: readonly FollowingGroup[] = registryEntries.flatMap((e) =>
  e.entry.kind === 'group' && e.entry.none?.follows ? [{ path: e.path, follows: e.entry.none.follows }] : [],
);

/** The editor's description of a list, by its path (`exhaust.run`). */
export function editorListAt(path: string): EditorList {
  const list = editorSections.flatMap((s) => s.lists).find((l) => l.path === path);
  if (!list) throw new Error(`The plan has no list ${path}.`);
  return list;
}
