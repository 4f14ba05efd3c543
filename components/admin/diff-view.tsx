import type { RuleSetDiff, ValueChange } from '@/lib/domain/rule-sets/diff';
import type { StoredRule } from '@/lib/domain/rule-format';
import type { ParameterChange } from '@/lib/domain/params/describe';
import { citationText } from '@/lib/domain/vocabulary';

// A rule's fields in words; conditions and message templates stay as written, since that is what the admin edits.
const RULE_FIELD_LABELS: Record<string, string> = {
  title: 'Title', area: 'Area', enabled: 'Enabled', severity: 'Severity', 'citation.code': 'Cited code', 'citation.edition': 'Cited edition',
  'citation.section': 'Cited section', 'citation.source': 'Citation source', citation: 'Citation', confidence: 'Source confidence',
  citationNote: 'Citation note', applicability: 'Applies when', conditions: 'Conditions', requires: 'Facts it needs', measured: 'Measured value',
  limit: 'Limit', unit: 'Unit', lengthStyle: 'Length shown as', 'messages.pass': 'Message when it passes', 'messages.fail': 'Message when it fails',
  'messages.needsInfo': 'Message when information is missing', 'messages.notApplicable': 'Message when it does not apply', messages: 'Messages',
  remedy: 'Remedy', citationVariants: 'Citations that depend on the plan',
};

function show(value: unknown): string {
  if (value === null || value === undefined || value === '') return 'not set';
  if (typeof value === 'boolean') return value ? 'yes' : 'no';
  if (typeof value === 'string') return value;
  return JSON.stringify(value, null, 2);
}

function ChangeRows({ changes }: { changes: ValueChange[] }) {
  return (
    <>
      {changes.map((c) => (
        <tr key={c.path} data-diff-path={c.path}>
          <th scope="row" className="py-1 pr-3 text-left align-top text-xs font-normal">{RULE_FIELD_LABELS[c.path] ?? c.path}</th>
          <td className="bg-status-fail/5 px-2 py-1 align-top"><pre className="whitespace-pre-wrap break-all font-mono text-xs" data-side="from">{show(c.from)}</pre></td>
          <td className="bg-status-pass/5 px-2 py-1 align-top"><pre className="whitespace-pre-wrap break-all font-mono text-xs" data-side="to">{show(c.to)}</pre></td>
        </tr>
      ))}
    </>
  );
}

function ParameterRows({ changes }: { changes: ParameterChange[] }) {
  return (
    <>
      {changes.map((c) => (
        <tr key={c.path} data-diff-path={c.path} data-testid="parameter-change">
          <th scope="row" className="py-1 pr-3 text-left align-top font-normal">{c.label}</th>
          <td className="bg-status-fail/5 px-2 py-1 align-top" data-side="from">{c.from}</td>
          <td className="bg-status-pass/5 px-2 py-1 align-top" data-side="to">{c.to}</td>
        </tr>
      ))}
    </>
  );
}

function RuleLine({ rule }: { rule: StoredRule }) {
  return (
    <span>
      <span className="font-mono text-xs">{rule.key}</span> — {rule.title} ({citationText(rule.citation)}){!rule.enabled && ' · disabled'}
    </span>
  );
}

/** Side by side: parameters, then rules added, removed and changed (field by field). */
export function DiffView({ diff, parameterChanges, fromLabel, toLabel }: { diff: RuleSetDiff; parameterChanges: ParameterChange[]; fromLabel: string; toLabel: string }) {
  const head = (
    <thead className="text-left text-xs uppercase tracking-wide text-ink-faint">
      <tr><th scope="col" className="py-1 pr-3">Field</th><th scope="col" className="px-2">{fromLabel}</th><th scope="col" className="px-2">{toLabel}</th></tr>
    </thead>
  );
  return (
    <div className="space-y-6" data-testid="diff">
      <section className="card p-5" aria-labelledby="dp-h">
        <h2 id="dp-h" className="font-bold">Parameters ({parameterChanges.length} changed)</h2>
        {parameterChanges.length === 0 ? <p className="mt-2 text-sm text-ink-soft">The same.</p> : <table className="mt-2 w-full table-fixed text-sm">{head}<tbody className="divide-y divide-rule"><ParameterRows changes={parameterChanges} /></tbody></table>}
      </section>
      <section className="card p-5" aria-labelledby="dr-h">
        <h2 id="dr-h" className="font-bold">Rules: {diff.rules.added.length} added, {diff.rules.removed.length} removed, {diff.rules.changed.length} changed, {diff.rules.unchanged} the same</h2>
        {diff.rules.added.length > 0 && (
          <div className="mt-3"><h3 className="text-sm font-semibold text-status-pass">Added in {toLabel}</h3><ul className="text-sm">{diff.rules.added.map((r) => <li key={r.key} data-added={r.key}><RuleLine rule={r} /></li>)}</ul></div>
        )}
        {diff.rules.removed.length > 0 && (
          <div className="mt-3"><h3 className="text-sm font-semibold text-status-fail">Removed since {fromLabel}</h3><ul className="text-sm">{diff.rules.removed.map((r) => <li key={r.key} data-removed={r.key}><RuleLine rule={r} /></li>)}</ul></div>
        )}
        {diff.rules.changed.map((c) => (
          <div key={c.key} className="mt-4" data-changed-rule={c.key}>
            <h3 className="text-sm font-semibold"><span className="font-mono text-xs">{c.key}</span> — {c.title}</h3>
            <table className="mt-1 w-full table-fixed text-sm">{head}<tbody className="divide-y divide-rule"><ChangeRows changes={c.fields} /></tbody></table>
          </div>
        ))}
      </section>
    </div>
  );
}
