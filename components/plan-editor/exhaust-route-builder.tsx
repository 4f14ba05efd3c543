'use client';

import { useFieldArray, useFormContext, useWatch } from 'react-hook-form';
import { useKeepFocus } from '@/components/plan-editor/keep-focus';
import { fittingEquivalentIn } from '@/lib/domain/facts/exhaust';
import type { RuleSetParameters } from '@/lib/domain/params';
import type { PlanFieldPath, RunItem } from '@/lib/domain/plan';
import type { EditorField, EditorList } from '@/lib/domain/plan/editor';
import { formatLength, parseLength, type UnitSystem } from '@/lib/domain/units';
import { PlanField } from '@/components/plan-editor/measure-field';
import { ListLimit } from '@/components/plan-editor/list-limit';

// The maker's maximum, when it applies, replaces the code maximum in the running total.
const MAKER_MAX: PlanFieldPath = 'dryer.maxDuctLength';

type FormRunItem = { straight?: string; elbow?: string; fitting?: string };

function toRunItem(item: FormRunItem, units: UnitSystem, path: string): { item: RunItem; ok: boolean } {
  if (item.elbow) {
    return { item: { elbow: Number(item.elbow) as 45 | 90, fitting: (item.fitting || undefined) as RunItem['fitting'] }, ok: true };
  }
  const text = (item.straight ?? '').trim();
  if (!text) return { item: {}, ok: false };
  const parsed = parseLength(/^\d+(\.\d+)?$/.test(text) ? Number(text) : text, units, path);
  return parsed.ok ? { item: { straight: parsed.value }, ok: true } : { item: {}, ok: false };
}

/** The ordered exhaust route: straight runs and elbows, with developed and allowed length updating live. */
export function ExhaustRouteBuilder({ list, params }: { list: EditorList; params: RuleSetParameters }) {
  const { control } = useFormContext();
  const { fields, append, remove, move } = useFieldArray({ control, name: list.path });
  const run = (useWatch({ name: list.path }) as FormRunItem[] | undefined) ?? [];
  const itemField = (key: keyof FormRunItem) => list.fields.find((f) => f.path === key) as EditorField;
  const units = ((useWatch({ name: 'units' }) as UnitSystem) || 'imperial') as UnitSystem;
  const makerMax = useWatch({ name: MAKER_MAX }) as string | undefined;

  const rows = run.map((item, i) => {
    const { item: parsed, ok } = toRunItem(item ?? {}, units, `${list.path}.${i}.straight`);
    const equivalentIn = ok ? (parsed.straight ?? 0) + fittingEquivalentIn(parsed, params) : null;
    return { isElbow: !!item?.elbow, equivalentIn };
  });
  const developedIn = rows.reduce((sum, r) => sum + (r.equivalentIn ?? 0), 0);
  const incomplete = rows.some((r) => r.equivalentIn === null);

  let allowedIn = params.exhaust.maxDevelopedLengthIn;
  let allowedSource = 'code maximum';
  if (params.exhaust.allowManufacturerLength && makerMax && String(makerMax).trim()) {
    const text = String(makerMax).trim();
    const m = parseLength(/^\d+(\.\d+)?$/.test(text) ? Number(text) : text, units, MAKER_MAX);
    if (m.ok) {
      allowedIn = m.value;
      allowedSource = 'maker’s maximum';
    }
  }
  const over = developedIn > allowedIn;
  const full = fields.length >= list.max;
  const id = `f-${list.path.replace(/\./g, '-')}`;
  const focusNext = useKeepFocus();
  const addPiece = (piece: FormRunItem) => {
    append({ straight: '', elbow: '', fitting: '', ...piece }, { shouldFocus: false });
    focusNext(`${id}-${fields.length}-${piece.elbow ? 'elbow' : 'straight'}`);
  };
  const removePiece = (i: number) => {
    remove(i);
    // The keyboard stays in the route: on the piece that took this one's place, the one before, or the add key.
    const left = fields.length - 1;
    focusNext(left === 0 ? `${id}-add` : `${id}-remove-${Math.min(i, left - 1)}`);
  };

  return (
    <fieldset id={id} className="rounded-lg border border-rule p-4" aria-describedby={`${id}-limit`}>
      <legend className="px-1 text-base font-semibold">{list.label}</legend>
      <p className="text-sm text-ink-soft">The transition duct is not counted. Each elbow counts at its equivalent length from the adopted edition’s table.</p>

      <div className="mt-3 flex flex-wrap items-center gap-4 rounded-md bg-paper-deep px-4 py-3" aria-live="polite" data-testid="route-totals">
        <div>
          <div className="text-xs uppercase tracking-wide text-ink-faint">Developed length</div>
          <div className={`font-mono text-lg font-semibold ${over ? 'text-status-fail' : 'text-ink'}`} data-testid="developed-length">
            {formatLength(developedIn, units)}
          </div>
        </div>
        <div>
          <div className="text-xs uppercase tracking-wide text-ink-faint">Allowed ({allowedSource})</div>
          <div className="font-mono text-lg font-semibold" data-testid="allowed-length">{formatLength(allowedIn, units)}</div>
        </div>
        <div className="text-sm font-semibold" data-testid="route-verdict">
          {incomplete ? (
            <span className="text-status-info">Some pieces have no length yet</span>
          ) : over ? (
            <span className="text-status-fail">{formatLength(developedIn - allowedIn, units)} too long</span>
          ) : (
            <span className="text-status-pass">{formatLength(allowedIn - developedIn, units)} to spare</span>
          )}
        </div>
      </div>

      <ol className="mt-4 space-y-3">
        {fields.map((field, i) => (
          <li key={field.id} className="rounded-md border border-rule bg-white p-3" data-testid="route-item">
            <div className="flex flex-wrap items-start gap-3">
              <span className="mt-7 w-6 text-right font-mono text-sm text-ink-faint">{i + 1}</span>
              <div className="grid flex-1 gap-3 sm:grid-cols-2">
                {rows[i]?.isElbow ? (
                  <>
                    <PlanField spec={itemField('elbow')} name={`${list.path}.${i}.elbow`} />
                    <PlanField spec={itemField('fitting')} name={`${list.path}.${i}.fitting`} />
                  </>
                ) : (
                  <PlanField spec={itemField('straight')} name={`${list.path}.${i}.straight`} />
                )}
              </div>
              <div className="mt-6 flex flex-col items-end gap-1">
                <span className="font-mono text-xs text-ink-soft" data-testid="route-item-equivalent">
                  {rows[i]?.equivalentIn == null ? '—' : `${rows[i].isElbow ? 'counts ' : ''}${formatLength(rows[i].equivalentIn!, units)}`}
                </span>
                <span className="flex gap-1">
                  <button type="button" className="btn-secondary min-w-[44px] px-2 py-1" onClick={() => move(i, i - 1)} disabled={i === 0} aria-label={`Move piece ${i + 1} up`}>↑</button>
                  <button type="button" className="btn-secondary min-w-[44px] px-2 py-1" onClick={() => move(i, i + 1)} disabled={i === fields.length - 1} aria-label={`Move piece ${i + 1} down`}>↓</button>
                  <button type="button" id={`${id}-remove-${i}`} className="btn-danger min-w-[44px] px-2 py-1" onClick={() => removePiece(i)} aria-label={`Remove piece ${i + 1}`}>✕</button>
                </span>
              </div>
            </div>
          </li>
        ))}
      </ol>
      {fields.length === 0 && <p className="mt-3 text-sm text-ink-faint">No pieces yet. Start with the straight run leaving the transition connection.</p>}

      <div className="mt-4 flex flex-wrap gap-2">
        <button type="button" id={`${id}-add`} className="btn-secondary" disabled={full} onClick={() => addPiece({})}>Add straight run</button>
        <button type="button" className="btn-secondary" disabled={full} onClick={() => addPiece({ elbow: '90', fitting: 'mitered' })}>Add 90° elbow</button>
        <button type="button" className="btn-secondary" disabled={full} onClick={() => addPiece({ elbow: '45', fitting: 'mitered' })}>Add 45° elbow</button>
      </div>
      <ListLimit name={list.path} count={fields.length} max={list.max} noun="pieces in the route" />
    </fieldset>
  );
}
