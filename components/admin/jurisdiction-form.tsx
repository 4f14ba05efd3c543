'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { useForm, type FieldErrors } from 'react-hook-form';
import type { Editions } from '@/lib/domain/editions';
import { z } from 'zod';
import { jurisdictionCreateSchema, jurisdictionUpdateSchema } from '@/lib/domain/rule-sets/jurisdiction-schema';
import { ApiError, fetchJson } from '@/lib/platform/client/fetch-json';
import { BusyButton } from '@/components/busy-button';
import { DEFAULT_TIME_ZONE } from '@/lib/domain/dates/format';

type Values = {
  slug: string;
  name: string;
  region: string;
  editions: Editions;
  inspectorEmail: string;
  amendmentNotes: string;
  timeZone: string;
  startFrom: string;
};

const editionFields: [keyof Values['editions'], string, string][] = [
  ['building', 'Building (residential) code', 'e.g. IRC 2021'],
  ['electrical', 'Electrical code', 'e.g. NEC 2023'],
  ['plumbing', 'Plumbing code', 'e.g. UPC 2021 or IPC 2018'],
  ['mechanical', 'Mechanical code', 'e.g. IMC 2021'],
  ['fuelGas', 'Fuel gas code', 'e.g. IFGC 2021'],
];

// Editing sends the same fields minus the fixed slug and the start choice; the form still holds them.
const editFormSchema = jurisdictionUpdateSchema.extend({ slug: z.string(), startFrom: z.string() });

function errorAt(errors: FieldErrors<Values>, path: string): string | undefined {
  const node = path.split('.').reduce<unknown>((acc, k) => (acc as Record<string, unknown> | undefined)?.[k], errors) as { message?: string } | undefined;
  return node?.message;
}

/** Create or edit a jurisdiction; the same zod schema validates here and in the route handler. */
export function JurisdictionForm({
  jurisdiction,
  startOptions = [],
  timeZones,
}: {
  jurisdiction?: Omit<Values, 'startFrom' | 'inspectorEmail'> & { inspectorEmail: string | null };
  startOptions?: { slug: string; name: string; version: number }[];
  /** The server's list, so the options rendered on the server and in the browser agree. */
  timeZones: string[];
}) {
  const router = useRouter();
  const editing = !!jurisdiction;
  const [formError, setFormError] = useState<string | null>(null);
  const [saved, setSaved] = useState(false);
  // After a create succeeds the page is still here until the draft page loads: the button stays busy,
  // or a second press would try the same short name again.
  const [leaving, setLeaving] = useState(false);
  const { register, handleSubmit, setError, formState: { errors, isSubmitting } } = useForm<Values>({
    resolver: zodResolver((editing ? editFormSchema : jurisdictionCreateSchema) as never),
    defaultValues: jurisdiction
      ? { ...jurisdiction, inspectorEmail: jurisdiction.inspectorEmail ?? '', startFrom: 'baseline' }
      : { slug: '', name: '', region: '', editions: { building: '', electrical: '', plumbing: '', plumbingFamily: 'IPC', mechanical: '', fuelGas: '' }, inspectorEmail: '', amendmentNotes: '', timeZone: DEFAULT_TIME_ZONE, startFrom: 'baseline' },
  });

  async function onSubmit(values: Values) {
    setFormError(null);
    setSaved(false);
    try {
      if (editing) {
        const { slug: _s, startFrom: _f, ...fields } = values;
        await fetchJson(`/api/jurisdictions/${jurisdiction!.slug}`, { method: 'PATCH', json: fields });
        setSaved(true);
        router.refresh();
      } else {
        const created = await fetchJson<{ jurisdiction: { slug: string }; draft: { version: number } }>('/api/jurisdictions', { method: 'POST', json: values });
        setLeaving(true);
        router.push(`/rules/${created.jurisdiction.slug}/versions/${created.draft.version}`);
      }
    } catch (err) {
      if (err instanceof ApiError && err.errors.length) {
        for (const e of err.errors) setError(e.path as never, { message: e.message });
        setFormError('Some fields need attention; nothing was saved.');
      } else setFormError((err as Error).message);
    }
  }

  const field = (path: string, label: string, input: React.ReactNode, hint?: string) => {
    const id = `j-${path.replace(/\./g, '-')}`;
    const message = errorAt(errors, path);
    return (
      <div>
        <label htmlFor={id} className="field-label">{label}</label>
        {hint && <p id={`${id}-hint`} className="text-xs text-ink-faint">{hint}</p>}
        {input}
        {message && <p id={`${id}-error`} className="field-error" role="alert">{message}</p>}
      </div>
    );
  };
  const aria = (path: string) => {
    const id = `j-${path.replace(/\./g, '-')}`;
    const invalid = !!errorAt(errors, path);
    return { id, 'aria-invalid': invalid || undefined, 'aria-describedby': invalid ? `${id}-error` : undefined };
  };

  return (
    <form onSubmit={handleSubmit(onSubmit)} className="card max-w-3xl space-y-5 p-6" noValidate>
      <div className="grid gap-4 sm:grid-cols-2">
        {field('name', 'Name', <input {...register('name')} {...aria('name')} className="field-input" />)}
        {field(
          'slug',
          'Short name (in addresses)',
          <input {...register('slug')} {...aria('slug')} className="field-input font-mono" disabled={editing} />,
          editing ? 'Fixed once created: projects and reports refer to it.' : 'Lower-case, e.g. north-county.',
        )}
        {field('region', 'State or region', <input {...register('region')} {...aria('region')} className="field-input" />)}
        {field(
          'timeZone',
          'Time zone',
          <select {...register('timeZone')} {...aria('timeZone')} className="field-input">
            {/* A stored alias (e.g. Asia/Kolkata) the runtime lists under another name stays choosable. */}
            {(jurisdiction && !timeZones.includes(jurisdiction.timeZone) ? [jurisdiction.timeZone, ...timeZones] : timeZones).map((z) => (
              <option key={z} value={z}>{z.replaceAll('_', ' ')}</option>
            ))}
          </select>,
          'Pages, e-mails and reports show this jurisdiction’s dates on this clock, with the zone’s abbreviation.',
        )}
        {field('inspectorEmail', 'Inspector e-mail (optional)', <input type="email" {...register('inspectorEmail')} {...aria('inspectorEmail')} className="field-input" />, 'Where installers send reports for this jurisdiction.')}
      </div>
      <fieldset className="space-y-3">
        <legend className="font-semibold">Adopted code editions</legend>
        <p className="text-xs text-ink-faint">Write the code and year as adopted, e.g. “IRC 2021”. Confirm them against the AHJ’s adoption ordinance.</p>
        <div className="grid gap-4 sm:grid-cols-2">
          {editionFields.map(([key, label, hint]) => (
            <div key={key}>{field(`editions.${key}`, label, <input {...register(`editions.${key}`)} {...aria(`editions.${key}`)} className="field-input" placeholder={hint} />)}</div>
          ))}
          {field(
            'editions.plumbingFamily',
            'Plumbing code family',
            <select {...register('editions.plumbingFamily')} {...aria('editions.plumbingFamily')} className="field-input">
              <option value="IPC">IPC</option>
              <option value="UPC">UPC</option>
              <option value="IRC">IRC (plumbing chapters)</option>
            </select>,
          )}
        </div>
      </fieldset>
      {field('amendmentNotes', 'Notes on local amendments', <textarea rows={4} {...register('amendmentNotes')} {...aria('amendmentNotes')} className="field-input" />, 'What the jurisdiction amended, with ordinance or section numbers; the rule set records the thresholds.')}
      {!editing &&
        field(
          'startFrom',
          'First draft starts from',
          <select {...register('startFrom')} {...aria('startFrom')} className="field-input">
            <option value="baseline">The model codes for these editions, no local amendments</option>
            {startOptions.map((o) => (
              <option key={o.slug} value={o.slug}>{o.name}’s published rule set (version {o.version})</option>
            ))}
          </select>,
          'The draft is a full copy you then amend; nothing applies to projects until you publish it.',
        )}
      {formError && <p role="alert" className="rounded-md bg-status-fail/10 px-3 py-2 text-sm text-status-fail">{formError}</p>}
      {saved && <p role="status" className="text-sm text-status-pass">Saved.</p>}
      <BusyButton type="submit" className="btn-primary" busy={isSubmitting || leaving} busyText={editing ? 'Saving…' : leaving ? 'Opening the first draft…' : 'Creating…'}>
        {editing ? 'Save jurisdiction' : 'Create jurisdiction and first draft'}
      </BusyButton>
    </form>
  );
}
