import type { CheckOutcome } from '@/lib/domain/checks/outcome';
import { citationText } from '@/lib/domain/vocabulary';
import type { EvaluationSummary, Finding, FindingStatus } from '@/lib/domain/engine';

export type FindingSide = { status: FindingStatus; measured: string | null; limit: string | null; citation: string };

/** One finding that would come out differently under the other version. */
export type FindingDelta = {
  ruleKey: string;
  title: string;
  area: string;
  from: FindingSide | null;
  to: FindingSide | null;
  statusChanged: boolean;
};

export type Outcome = CheckOutcome;


function side(f: Finding): FindingSide {
  return { status: f.status, measured: f.display.measured, limit: f.display.limit, citation: citationText(f.citation) };
}

/**
 * Findings that differ between two evaluations of the same plan: a status change, a rule that
 * appears or disappears, or the same status against a different limit or citation (which an
 * inspector would read differently on the report).
 */
export function compareFindingSets(before: Finding[], after: Finding[]): FindingDelta[] {
  const old = new Map(before.map((f) => [f.ruleKey, f]));
  const now = new Map(after.map((f) => [f.ruleKey, f]));
  const out: FindingDelta[] = [];
  for (const f of after) {
    const p = old.get(f.ruleKey);
    const to = side(f);
    if (!p) {
      out.push({ ruleKey: f.ruleKey, title: f.title, area: f.area, from: null, to, statusChanged: true });
      continue;
    }
    const from = side(p);
    const statusChanged = from.status !== to.status;
    if (statusChanged || from.limit !== to.limit || from.citation !== to.citation) {
      out.push({ ruleKey: f.ruleKey, title: f.title, area: f.area, from, to, statusChanged });
    }
  }
  for (const p of before) {
    if (!now.has(p.ruleKey)) out.push({ ruleKey: p.ruleKey, title: p.title, area: p.area, from: side(p), to: null, statusChanged: true });
  }
  // Status changes first: they are what flips a project.
  return out.sort((a, b) => Number(b.statusChanged) - Number(a.statusChanged));
}

export type SubjectComparison = {
  kind: 'demo-plan' | 'project';
  id: string;
  name: string;
  detail: string;
  before: { outcome: Outcome; summary: EvaluationSummary } | null;
  after: { outcome: Outcome; summary: EvaluationSummary } | null;
  changes: FindingDelta[];
  error: string | null;
};

export function summarizeComparisons(subjects: SubjectComparison[]) {
  return {
    subjects: subjects.length,
    changed: subjects.filter((s) => s.changes.some((c) => c.statusChanged)).length,
    detailOnly: subjects.filter((s) => s.changes.length > 0 && !s.changes.some((c) => c.statusChanged)).length,
    newlyFailing: subjects.filter((s) => s.after?.outcome === 'fail' && s.before?.outcome !== 'fail').length,
    newlyPassing: subjects.filter((s) => s.before?.outcome === 'fail' && s.after && s.after.outcome !== 'fail').length,
    errors: subjects.filter((s) => s.error).length,
  };
}
