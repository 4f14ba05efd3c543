// Converts between a saved plan (as the installer entered it) and the editor's string-valued form.
import { editorSections, followingGroups, type EditorField } from '@/lib/domain/plan/editor';
import { conditionsAt, fieldApplies } from '@/lib/domain/plan/registry';
import type { PlanInput } from '@/lib/domain/plan';

// The form holds one string per field, and arrays of those for lists, under the plan's own paths.
export type FormValues = Record<string, any>;

function getAt(obj: any, path: string): any {
  return path.split('.').reduce((o, k) => (o == null ? undefined : o[k]), obj);
}

function setAt(obj: any, path: string, value: unknown) {
  const keys = path.split('.');
  let o = obj;
  for (const k of keys.slice(0, -1)) {
    if (o[k] == null || typeof o[k] !== 'object') o[k] = {};
    o = o[k];
  }
  o[keys[keys.length - 1]] = value;
}

function deleteAt(obj: any, path: string) {
  const keys = path.split('.');
  const parent = keys.length === 1 ? obj : getAt(obj, keys.slice(0, -1).join('.'));
  if (parent && typeof parent === 'object') delete parent[keys[keys.length - 1]];
}

function toFormValue(spec: EditorField, v: unknown): string {
  if (spec.kind === 'presence') return v === null ? 'none' : v === undefined ? '' : 'present';
  if (spec.noneWord && (v === null || (Array.isArray(v) && v.length === 0))) return spec.noneWord;
  if (v === undefined || v === null) return '';
  if (spec.kind === 'boolean') return v === true ? 'yes' : v === false ? 'no' : '';
  if (spec.kind === 'length-list') return Array.isArray(v) ? v.map(String).join(', ') : String(v);
  return String(v);
}

function fromFormValue(spec: EditorField, v: unknown): unknown {
  if (typeof v !== 'string') return v === '' ? undefined : v;
  const text = v.trim();
  if (text === '') return undefined;
  if (spec.noneWord && text.toLowerCase() === spec.noneWord) return spec.kind === 'length-list' ? [] : null;
  switch (spec.kind) {
    case 'boolean':
      return text === 'yes' ? true : text === 'no' ? false : text;
    case 'choice':
      // Numeric choices (an elbow's 45 or 90) are numbers in the plan.
      if (!spec.choices?.some((c) => typeof c === 'number')) return text;
    // falls through
    case 'number':
      // Left as text when it is not a number, so the schema names the field in its error.
      return Number.isFinite(Number(text)) ? Number(text) : text;
    case 'length':
    case 'area':
      // A bare number follows the plan's units; text keeps its own units ("2' 6\"", "762 mm").
      return /^\d+(\.\d+)?$/.test(text) ? Number(text) : text;
    case 'length-list':
      return text
        .split(/[,;]+/)
        .map((s) => s.trim())
        .filter(Boolean)
        .map((s) => (/^\d+(\.\d+)?$/.test(s) ? Number(s) : s));
    default:
      return text;
  }
}

function itemToForm(fields: EditorField[], item: any): Record<string, string> {
  return Object.fromEntries(fields.map((f) => [f.path, toFormValue(f, getAt(item, f.path))]));
}

function itemFromForm(fields: EditorField[], item: any): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const f of fields) {
    const v = fromFormValue(f, item?.[f.path]);
    if (v !== undefined) setAt(out, f.path, v);
  }
  return out;
}

export function planToForm(plan: Partial<PlanInput> | null | undefined): FormValues {
  const values: FormValues = {};
  for (const section of editorSections) {
    for (const f of section.fields) {
      let v = f.kind === 'presence' ? getAt(plan, f.group!) : getAt(plan, f.path);
      if (f.noneOfGroup && getAt(plan, f.noneOfGroup) === null) v = f.choices![0];
      setAt(values, f.path, toFormValue(f, v));
    }
    for (const list of section.lists) {
      const items = getAt(plan, list.path);
      setAt(values, list.path, Array.isArray(items) ? items.map((i) => itemToForm(list.fields, i)) : []);
    }
  }
  if (!values.units) values.units = 'imperial';
  return values;
}

function prune(obj: any): any {
  if (Array.isArray(obj)) return obj.map(prune);
  if (obj && typeof obj === 'object') {
    const out: Record<string, unknown> = {};
    for (const [k, v] of Object.entries(obj)) {
      const p = prune(v);
      if (p === undefined) continue;
      if (p && typeof p === 'object' && !Array.isArray(p) && Object.keys(p).length === 0) continue;
      out[k] = p;
    }
    return out;
  }
  return obj;
}

/** Whether the editor shows a field (or list) at `concretePath` for this plan: it applies, or has no conditions. */
export function isShown(spec: { appliesPath?: string }, plan: unknown, concretePath: string): boolean {
  return !spec.appliesPath || fieldApplies(plan, concretePath);
}

/** Removes, depth first, every value whose field does not apply to the plan (the editor hides those fields). */
function dropInapplicable(plan: any): boolean {
  let changed = false;
  const visit = (node: any, path: string) => {
    if (!node || typeof node !== 'object') return;
    for (const key of Object.keys(node)) {
      const childPath = path ? `${path}.${key}` : key;
      if (conditionsAt(childPath).length > 0 && !fieldApplies(plan, childPath)) {
        if (Array.isArray(node)) continue;
        delete node[key];
        changed = true;
      } else {
        visit(node[key], childPath);
      }
    }
  };
  visit(plan, '');
  return changed;
}

/**
 * The plan the editor's values describe; blank fields are left out (they become needs-info findings), and so
 * are fields hidden because they do not apply (an earlier answer changed): the editor never saves what it hides.
 */
export function formToPlan(values: FormValues): PlanInput {
  const plan = formToPlanAsShown(values);
  // A field hidden by another hidden field's value: repeat until nothing changes (conditions are shallow).
  for (let i = 0; i < 5 && dropInapplicable(plan); i++);
  return plan;
}

function formToPlanAsShown(values: FormValues): PlanInput {
  const plan: any = {};
  for (const section of editorSections) {
    for (const f of section.fields) {
      if (f.kind === 'presence') continue;
      const v = fromFormValue(f, getAt(values, f.path));
      if (v !== undefined) setAt(plan, f.path, v);
    }
    for (const list of section.lists) {
      const items = getAt(values, list.path);
      if (Array.isArray(items) && items.length > 0) setAt(plan, list.path, items.map((i) => itemFromForm(list.fields, i)));
    }
  }

  const pruned = prune(plan);
  // "Not there" (null) and "there, details to come" ({}) are different answers from "not known yet".
  for (const section of editorSections) {
    for (const f of section.fields) {
      if (f.kind === 'presence') {
        const answer = getAt(values, f.path);
        if (answer === 'none') setAt(pruned, f.group!, null);
        else if (answer === 'present' && getAt(pruned, f.group!) == null) setAt(pruned, f.group!, {});
      } else if (f.noneOfGroup && getAt(pruned, f.path) === f.choices![0]) {
        setAt(pruned, f.noneOfGroup, null);
      }
    }
  }
  // A group that follows another answer (a gas supply follows a gas dryer) is kept even when blank, set to
  // null when the answer rules it out, and left out while that answer is not known.
  for (const { path, follows } of followingGroups) {
    const answer = getAt(pruned, follows.path);
    if (answer === follows.present) setAt(pruned, path, getAt(pruned, path) ?? {});
    else if (answer === follows.absent) setAt(pruned, path, null);
    else deleteAt(pruned, path);
  }
  return pruned as PlanInput;
}
