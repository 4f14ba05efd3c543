'use client';

import { useState } from 'react';
import { useFormContext } from 'react-hook-form';
import useSWR from 'swr';
import { applianceKindLabels } from '@/lib/domain/appliances/kinds';
import type { ApplianceModel } from '@/lib/domain/appliances/model';
import { filledValues, type ReceptacleSlot } from '@/lib/domain/appliances/fill';
import type { UnitSystem } from '@/lib/domain/units';
import { swrFetcher } from '@/lib/platform/client/fetch-json';

/** Fills the washer's or dryer's fields from a model of the company's appliance library; every value stays editable. */
export function LibraryModelPicker({ slot }: { slot: 'washer' | 'dryer' }) {
  const { setValue, getValues } = useFormContext();
  const { data, error } = useSWR<{ items: ApplianceModel[] }>(`/api/appliances?slot=${slot}`, swrFetcher);
  const [chosen, setChosen] = useState('');
  const [done, setDone] = useState<string | null>(null);
  const id = `library-${slot}`;
  const models = data?.items ?? [];

  function fill() {
    const model = models.find((m) => m.id === chosen);
    if (!model) return;
    const units = (getValues('units') as UnitSystem) || 'imperial';
    const receptacles = (getValues('electrical.receptacles') as ReceptacleSlot[] | undefined) ?? [];
    for (const { path, value } of filledValues(model, slot, units, receptacles)) setValue(path, value, { shouldDirty: true, shouldValidate: false });
    setDone(`Filled from ${model.label}. Check the figures against the maker's installation instructions.`);
  }

  return (
    <div className="mt-3 rounded-md border border-rule bg-paper-deep/40 p-3" data-testid={`library-picker-${slot}`}>
      <label htmlFor={id} className="field-label">Fill from the appliance library</label>
      <div className="mt-1 flex flex-wrap items-center gap-2">
        <select id={id} className="field-input mt-0 max-w-md" value={chosen} onChange={(e) => { setChosen(e.target.value); setDone(null); }} disabled={!data}>
          <option value="">{error ? 'The library could not be loaded' : data ? (models.length ? '— choose a model' : 'No models in the library yet') : 'Loading the library…'}</option>
          {models.map((m) => (
            <option key={m.id} value={m.id}>{m.label} ({applianceKindLabels[m.kind]})</option>
          ))}
        </select>
        <button type="button" className="btn-secondary" onClick={fill} disabled={!chosen}>Fill {slot} fields</button>
        <a className="text-sm underline" href="/appliances">Manage the library</a>
      </div>
      {done && <p role="status" className="mt-2 text-sm text-ink-soft">{done}</p>}
    </div>
  );
}
