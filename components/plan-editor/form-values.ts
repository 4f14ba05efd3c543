// Converts between a saved plan (as the installer entered it) and the editor's string-valued form.
import type { PlanInput } from '@/lib/domain/plan';
import { runItemFields, sections, type FieldSpec, type FormValues } from '@/components/plan-editor/field-spec';

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

function toFormValue(spec: FieldSpec, v: unknown): string {
  if (spec.kind === 'presence') return v === null ? 'none' : v === undefined ? '' : 'present';
  if (spec.noneWord && (v === null || (Array.isArray(v) && v.length === 0))) return spec.noneWord;
  if (v === undefined || v === null) return '';
  if (spec.kind === 'bool') return v === true ? 'yes' : v === false ? 'no' : '';
  if (spec.kind === 'length-list') return Array.isArray(v) ? v.map(String).join(', ') : String(v);
  return String(v);
}

function fromFormValue(spec: FieldSpec, v: unknown): unknown {
  if (typeof v !== 'string') return v === '' ? undefined : v;
  const text = v.trim();
  if (text === '') return undefined;
  if (spec.noneWord && text.toLowerCase() === spec.noneWord) return spec.kind === 'length-list' ? [] : null;
  switch (spec.kind) {
    case 'bool':
      return text === 'yes' ? true : text === 'no' ? false : text;
    case 'number':
    case 'int-enum':
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

function itemToForm(fields: FieldSpec[], item: any): Record<string, string> {
  return Object.fromEntries(fields.map((f) => [f.path, toFormValue(f, getAt(item, f.path))]));
}

function itemFromForm(fields: FieldSpec[], item: any): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const f of fields) {
    const v = fromFormValue(f, item?.[f.path]);
    if (v !== undefined) setAt(out, f.path, v);
  }
  return out;
}

export function planToForm(plan: Partial<PlanInput> | null | undefined): FormValues {
  const values: FormValues = {};
  for (const section of sections) {
    for (const f of section.fields) {
      let v = f.kind === 'presence' ? getAt(plan, f.group!) : getAt(plan, f.path);
      if (f.path === 'exhaust.boosterFan.kind' && plan?.exhaust && plan.exhaust.boosterFan === null) v = 'none';
      setAt(values, f.path, toFormValue(f, v));
    }
    for (const list of section.lists ?? []) {
      const items = getAt(plan, list.path);
      setAt(values, list.path, Array.isArray(items) ? items.map((i) => itemToForm(list.fields, i)) : []);
    }
  }
  const run = plan?.exhaust?.run;
  setAt(values, 'exhaust.run', Array.isArray(run) ? run.map((i) => itemToForm(runItemFields, i)) : []);
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

/** The plan the editor's values describe; blank fields are left out (they become needs-info findings). */
export function formToPlan(values: FormValues): PlanInput {
  const plan: any = {};
  for (const section of sections) {
    for (const f of section.fields) {
      if (f.kind === 'presence') continue;
      const v = fromFormValue(f, getAt(values, f.path));
      if (v !== undefined) setAt(plan, f.path, v);
    }
    for (const list of section.lists ?? []) {
      const items = getAt(values, list.path);
      if (Array.isArray(items) && items.length > 0) setAt(plan, list.path, items.map((i) => itemFromForm(list.fields, i)));
    }
  }
  const run = getAt(values, 'exhaust.run');
  if (Array.isArray(run) && run.length > 0) setAt(plan, 'exhaust.run', run.map((i) => itemFromForm(runItemFields, i)));

  const pruned = prune(plan);
  // "Not there" (null) and "there, details to come" ({}) are different answers from "not known yet".
  for (const section of sections) {
    for (const f of section.fields) {
      if (f.kind !== 'presence') continue;
      const answer = getAt(values, f.path);
      if (answer === 'none') setAt(pruned, f.group!, null);
      else if (answer === 'present' && getAt(pruned, f.group!) == null) setAt(pruned, f.group!, {});
    }
  }
  if (pruned.exhaust?.boosterFan?.kind === 'none') pruned.exhaust.boosterFan = null;
  // An electric dryer has no gas supply; a gas dryer's gas section is kept even when blank.
  if (pruned.dryer?.fuel === 'gas') pruned.gas = pruned.gas ?? {};
  else if (pruned.dryer?.fuel === 'electric') pruned.gas = null;
  else delete pruned.gas;
  return pruned as PlanInput;
}
