import type { Finding } from '@/lib/domain/engine';

export type FindingChange = { ruleKey: string; title: string; from: Finding['status'] | null; to: Finding['status'] | null };

/** Findings whose status differs between two checks (rules added or removed count too). */
export function compareFindings(previous: Finding[], current: Finding[]): FindingChange[] {
  const before = new Map(previous.map((f) => [f.ruleKey, f]));
  const after = new Map(current.map((f) => [f.ruleKey, f]));
  const out: FindingChange[] = [];
  for (const f of current) {
    const p = before.get(f.ruleKey);
    if (!p || p.status !== f.status) out.push({ ruleKey: f.ruleKey, title: f.title, from: p?.status ?? null, to: f.status });
  }
  for (const p of previous) {
    if (!after.has(p.ruleKey)) out.push({ ruleKey: p.ruleKey, title: p.title, from: p.status, to: null });
  }
  return out;
}
