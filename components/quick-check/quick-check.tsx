'use client';

import { useRouter } from 'next/navigation';
import { useRef, useState } from 'react';
import { FindingsList } from '@/components/checks/findings-list';
import { SummaryCounts } from '@/components/checks/summary-counts';
import { PlanEditor } from '@/components/plan-editor/plan-editor';
import type { Evaluation } from '@/lib/domain/engine';
import type { FieldError } from '@/lib/domain/errors';
import type { RuleSetParameters } from '@/lib/domain/params';
import type { PlanInput } from '@/lib/domain/plan';
import { ApiError, fetchJson } from '@/lib/platform/client/fetch-json';

type Option = { slug: string; name: string; published: boolean; parameters: RuleSetParameters };
type Result = Omit<Evaluation, 'facts'> & { plan: PlanInput; jurisdiction: string };

/** A plan checked against a jurisdiction's published rules with nothing stored, kept as a project only on request. */
export function QuickCheck({ jurisdictions }: { jurisdictions: Option[] }) {
  const router = useRouter();
  const [slug, setSlug] = useState(jurisdictions.find((j) => j.published)?.slug ?? jurisdictions[0]?.slug ?? '');
  const [result, setResult] = useState<Result | null>(null);
  const [project, setProject] = useState({ name: '', siteAddress: '' });
  const [errors, setErrors] = useState<FieldError[]>([]);
  const [saveMessage, setSaveMessage] = useState<string | null>(null);
  const chosen = jurisdictions.find((j) => j.slug === slug);
  const planOnScreenRef = useRef<(() => Promise<PlanInput | null>) | null>(null);

  async function evaluate(plan: PlanInput): Promise<string> {
    const res = await fetchJson<Omit<Evaluation, 'facts'>>('/api/evaluations', { method: 'POST', json: { jurisdiction: slug, plan } });
    setResult({ ...res, plan, jurisdiction: slug });
    setSaveMessage(null);
    return `Checked against ${chosen?.name ?? slug}, rules version ${res.ruleSet.version}: ${res.summary.fail} fail, ${res.summary.caution} caution, ${res.summary.needsInfo} need info.`;
  }

  async function save(e: React.FormEvent) {
    e.preventDefault();
    if (!result) return;
    setErrors([]);
    setSaveMessage(null);
    // The project keeps the plan as the form shows it now, edits made after the last check included.
    const plan = planOnScreenRef.current ? await planOnScreenRef.current() : result.plan;
    if (!plan) {
      setSaveMessage('Not saved: fix the plan fields marked above first.');
      return;
    }
    try {
      const created = await fetchJson<{ id: string }>('/api/quick-checks', {
        method: 'POST',
        json: { ...project, jurisdiction: result.jurisdiction, plan },
      });
      router.push(`/projects/${created.id}`);
    } catch (err) {
      if (err instanceof ApiError) setErrors(err.errors);
      setSaveMessage(`Not saved: ${(err as Error).message}`);
    }
  }

  const err = (path: string) => errors.find((x) => x.path === path)?.message;

  return (
    <div className="space-y-6">
      <div className="card p-5">
        <label htmlFor="qc-jurisdiction" className="field-label">Jurisdiction (AHJ)</label>
        <select id="qc-jurisdiction" className="field-input max-w-md" value={slug} onChange={(e) => { setSlug(e.target.value); setResult(null); }}>
          {jurisdictions.map((j) => (
            <option key={j.slug} value={j.slug} disabled={!j.published}>{j.name}{j.published ? '' : ' (no published rules yet)'}</option>
          ))}
        </select>
      </div>

      <PlanEditor projectId={null} initialPlan={null} baseRevision={null} params={chosen?.parameters ?? jurisdictions[0].parameters} submit={{ label: 'Check plan', run: evaluate }} planOnScreenRef={planOnScreenRef} />

      {result && (
        <section className="card p-5" aria-labelledby="qc-findings" data-testid="quick-check-result">
          <h2 id="qc-findings" className="text-lg font-bold">Findings</h2>
          <p className="mt-1 text-sm text-ink-soft">The plan as last checked. Edit it above and check again; nothing is stored.</p>
          <div className="mt-3"><SummaryCounts summary={result.summary} /></div>
          <div className="mt-4"><FindingsList findings={result.findings} /></div>
        </section>
      )}

      {result && (
        <form onSubmit={save} noValidate className="card p-5" aria-labelledby="qc-save">
          <h2 id="qc-save" className="text-lg font-bold">Save as a project</h2>
          <p className="mt-1 text-sm text-ink-soft">Keeps the plan as it is above, edits since the last check included, as the new project’s first revision.</p>
          <div className="mt-3 grid gap-4 sm:grid-cols-2">
            {(['name', 'siteAddress'] as const).map((key) => (
              <div key={key}>
                <label htmlFor={`qc-${key}`} className="field-label">{key === 'name' ? 'Project name' : 'Site address'}</label>
                <input id={`qc-${key}`} className="field-input" value={project[key]} onChange={(e) => setProject({ ...project, [key]: e.target.value })}
                  aria-invalid={err(key) ? true : undefined} aria-describedby={err(key) ? `qc-${key}-error` : undefined} />
                {err(key) && <p id={`qc-${key}-error`} className="field-error" role="alert">{err(key)}</p>}
              </div>
            ))}
          </div>
          <button type="submit" className="btn-primary mt-4">Save as project</button>
          {saveMessage && <p role="alert" className="mt-2 text-sm text-status-fail">{saveMessage}</p>}
        </form>
      )}
    </div>
  );
}
