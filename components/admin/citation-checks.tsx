'use client';

import { useState } from 'react';
import type { CitationStatus } from '@/lib/domain/rule-sets/citation-checks';
import { ApiError, fetchJson } from '@/lib/platform/client/fetch-json';
import { formatDate } from '@/lib/domain/dates/format';

export type CitationList = { citations: CitationStatus[]; uncheckedMemory: { ruleKey: string; title: string; citation: string }[] };

const CONFIDENCE: Record<string, string> = { V: 'V verified', S: 'S secondary sources', M: 'M from memory', CP: 'CP common practice' };

function holds(c: CitationStatus): boolean {
  return !!c.mark && c.mark.checked && c.mark.citation === c.citation;
}

/** One citation: its status and, on a draft, the form that marks it checked or withdraws the mark. */
function Row({ c, url, readOnly, onChange, timeZone }: { c: CitationStatus; url: string; readOnly: boolean; onChange?: () => Promise<unknown>; timeZone: string }) {
  const [against, setAgainst] = useState(c.mark?.against ?? '');
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const id = `cc-${c.ruleKey.replace(/\./g, '-')}`;
  const checked = holds(c);

  async function send(body: { ruleKey: string; checked: boolean; against?: string }) {
    setError(null);
    setBusy(true);
    try {
      await fetchJson(url, { method: 'POST', json: body });
      await onChange?.();
    } catch (err) {
      setError(err instanceof ApiError && err.errors.length ? err.errors.map((e) => e.message).join(' ') : (err as Error).message);
    } finally {
      setBusy(false);
    }
  }

  return (
    <li className="border-t border-rule py-3" data-testid="citation-row" data-rule={c.ruleKey} data-checked={checked ? 'yes' : 'no'}>
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <div>
          <span className="font-mono font-semibold">{c.citation}</span> <span className="text-sm text-ink-soft">{c.title}{c.enabled ? '' : ' (disabled)'}</span>
        </div>
        <span className={`text-xs ${c.confidence === 'M' && !checked ? 'font-semibold text-brass' : 'text-ink-soft'}`}>{CONFIDENCE[c.confidence] ?? c.confidence}</span>
      </div>
      <p className="mt-1 text-sm" data-testid="citation-state">
        {checked
          ? `Checked by ${c.mark!.checkedBy} on ${formatDate(c.mark!.checkedAt, timeZone)} against ${c.mark!.against}${c.mark!.carriedFromVersion ? ` (in version ${c.mark!.carriedFromVersion})` : ''}.`
          : c.mark?.checked
            ? `Checked as ${c.mark.citation}; the citation changed since, so it is not checked.`
            : 'Not yet checked against the adopted text.'}
      </p>
      {!readOnly && (
        <form
          className="mt-2 flex flex-wrap items-end gap-2"
          onSubmit={(e) => {
            e.preventDefault();
            void send({ ruleKey: c.ruleKey, checked: true, against });
          }}
        >
          <div>
            <label htmlFor={id} className="block text-xs text-ink-soft">Checked against (the adopted text)</label>
            <input
              id={id}
              className="field-input w-80 max-w-full"
              value={against}
              maxLength={300}
              onChange={(e) => setAgainst(e.target.value)}
              placeholder="e.g. 2021 IRC as adopted by ordinance 12-34"
              aria-invalid={error ? true : undefined}
              aria-describedby={error ? `${id}-error` : undefined}
            />
          </div>
          <button type="submit" className="btn-secondary px-2 py-1" disabled={busy}>{checked ? 'Check again' : 'Mark checked'}</button>
          {checked && <button type="button" className="btn-secondary px-2 py-1" disabled={busy} onClick={() => void send({ ruleKey: c.ruleKey, checked: false })}>Withdraw mark</button>}
        </form>
      )}
      {error && <p id={`${id}-error`} role="alert" className="field-error">{error}</p>}
    </li>
  );
}

/**
 * The citations of a version with the jurisdiction's checks against its adopted text. Marks are
 * appended, never edited: who, when and against what stay on record, also after publishing.
 */
export function CitationChecks({ list, url, readOnly, onChange, timeZone }: { list: CitationList; url: string; readOnly: boolean; onChange?: () => Promise<unknown>; timeZone: string }) {
  const code = list.citations.filter((c) => c.checkable);
  const done = code.filter(holds).length;
  return (
    <div>
      <p className="text-sm text-ink-soft" data-testid="citation-summary">
        {done} of {code.length} code citations checked against the adopted text · {list.uncheckedMemory.length} from memory still unchecked
      </p>
      <ul className="mt-2">
        {code.map((c) => <Row key={`${c.ruleKey}-${c.mark?.checkedAt ?? ''}`} c={c} url={url} readOnly={readOnly} onChange={onChange} timeZone={timeZone} />)}
      </ul>
    </div>
  );
}
