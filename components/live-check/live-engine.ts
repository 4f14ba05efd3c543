// The live check's engine side, loaded with a dynamic import once the form is usable: the same
// lib/domain engine, sizing, fixes and drawings the server uses, run on the plan as it is being typed.
import { frontElevation, planView, type Drawing } from '@/lib/domain/drawing';
import { evaluate, withoutAdminNotes, type Evaluation, type Finding, type RuleSetForEvaluation } from '@/lib/domain/engine';
import { factsByName } from '@/lib/domain/facts';
import { labelForPath, parsePlan, registryEntries, type FieldError, type Plan, type PlanInput, type PlanSectionId } from '@/lib/domain/plan';
import { planFixes, type PlanFix } from '@/lib/domain/remedies/plan-fixes';
import { conditionFacts, type StoredCondition } from '@/lib/domain/rule-format';
import { sizeEnclosure, type EnclosureSizing } from '@/lib/domain/sizing';
import type { SectionLiveStatus } from '@/components/live-check/live-check-context';

export { proposeDoorLeaves, currentInside, areaFormText, lengthFormText, MAX_PROPOSED_LEAVES } from '@/lib/domain/sizing';
export { formatArea, formatLength, parseLength } from '@/lib/domain/units';

const ruleSets = new Map<string, Promise<RuleSetForEvaluation>>();

/** A published rule set version, fetched once per page and kept by the browser for good (the route says immutable). */
export function loadRuleSet(slug: string, version: number): Promise<RuleSetForEvaluation> {
  const key = `${slug}@${version}`;
  let pending = ruleSets.get(key);
  if (!pending) {
    pending = fetch(`/api/jurisdictions/${encodeURIComponent(slug)}/published/${version}`, { credentials: 'same-origin' }).then(async (res) => {
      if (!res.ok) throw new Error(`The rule set did not load (${res.status}).`);
      return (await res.json()) as RuleSetForEvaluation;
    });
    pending.catch(() => ruleSets.delete(key));
    ruleSets.set(key, pending);
  }
  return pending;
}

export interface WaitingField {
  path: string;
  message: string;
  findings: Array<{ ruleKey: string; title: string }>;
}

export interface LiveResult {
  evaluation: Evaluation;
  /** The plan evaluated: the form's plan, less any field that does not parse. */
  plan: Plan;
  /** Fields that do not parse, each with the findings that wait for it. */
  waiting: WaitingField[];
  bySection: Partial<Record<PlanSectionId, SectionLiveStatus>>;
}

const sectionOfTop = new Map(registryEntries.filter((e) => !e.path.includes('.')).map((e) => [e.path, e.section]));

interface RuleMeta {
  sections: PlanSectionId[];
  /** The plan field a failing finding of this rule is fixed in, first. */
  focusPaths: string[];
}
const metaCache = new WeakMap<RuleSetForEvaluation, Map<string, RuleMeta>>();

// The appliances' figures come from the maker, so a finding jumps to what the installer sets, where it can.
const MAKER_FIGURES = /^(washer|dryer)\./;

function ruleMeta(ruleSet: RuleSetForEvaluation): Map<string, RuleMeta> {
  let meta = metaCache.get(ruleSet);
  if (meta) return meta;
  meta = new Map();
  for (const rule of ruleSet.rules) {
    const facts = [...new Set([...(rule.measured ? [rule.measured] : []), ...rule.requires, ...conditionFacts(rule.conditions as StoredCondition)])];
    const paths = facts.flatMap((f) => factsByName.get(f)?.planPaths ?? []) as string[];
    const sections = [...new Set(paths.map((p) => sectionOfTop.get(p.split('.')[0])).filter((s): s is PlanSectionId => !!s))];
    const ordered = [...new Set(paths)];
    meta.set(rule.key, { sections, focusPaths: [...ordered.filter((p) => !MAKER_FIGURES.test(p)), ...ordered.filter((p) => MAKER_FIGURES.test(p))] });
  }
  metaCache.set(ruleSet, meta);
  return meta;
}

/** Plan fields a finding concerns, the one to jump to first. */
export function focusPathsFor(ruleSet: RuleSetForEvaluation, finding: Finding): string[] {
  const own = ruleMeta(ruleSet).get(finding.ruleKey)?.focusPaths ?? [];
  return finding.status === 'needs-info' && finding.missing.length > 0 ? [...finding.missing, ...own] : own;
}

function countBySection(ruleSet: RuleSetForEvaluation, findings: Finding[]): Partial<Record<PlanSectionId, SectionLiveStatus>> {
  const meta = ruleMeta(ruleSet);
  const out: Partial<Record<PlanSectionId, SectionLiveStatus>> = {};
  for (const f of findings) {
    if (f.status !== 'fail' && f.status !== 'caution' && f.status !== 'needs-info') continue;
    for (const section of meta.get(f.ruleKey)?.sections ?? []) {
      const s = (out[section] ??= { fail: 0, caution: 0, needsInfo: 0 });
      if (f.status === 'fail') s.fail += 1;
      else if (f.status === 'caution') s.caution += 1;
      else s.needsInfo += 1;
    }
  }
  return out;
}

function deleteAt(obj: unknown, path: string): boolean {
  const keys = path.split('.');
  let o = obj as Record<string, unknown> | undefined;
  for (const k of keys.slice(0, -1)) {
    o = o?.[k] as Record<string, unknown> | undefined;
    if (o == null || typeof o !== 'object') return false;
  }
  const last = keys[keys.length - 1];
  if (!o || !(last in o)) return false;
  if (Array.isArray(o)) o.splice(Number(last), 1);
  else delete o[last];
  return true;
}

const touches = (a: string, b: string) => a === b || a.startsWith(`${b}.`) || b.startsWith(`${a}.`);

/**
 * Parses and evaluates the form's plan. A field that does not parse is left out (its findings then need
 * it), so every other finding still follows the edit; the result names the findings that wait for it.
 */
export async function runLive(ruleSet: RuleSetForEvaluation, input: PlanInput): Promise<LiveResult | { errors: FieldError[] }> {
  let candidate: unknown = input;
  let parsed = parsePlan(candidate);
  const removed: FieldError[] = [];
  for (let round = 0; !parsed.ok && round < 4; round++) {
    const copy = structuredClone(candidate);
    const errors = parsed.errors;
    // An error on a list item's own field removes the field; one on the item (or a list) the item or list.
    const cut = errors.filter((e) => e.path && deleteAt(copy, e.path));
    if (cut.length === 0) return { errors };
    removed.push(...cut);
    candidate = copy;
    parsed = parsePlan(candidate);
  }
  if (!parsed.ok) return { errors: parsed.errors };
  // Installers see what to do, never the rule-set admin's notes — as POST /api/evaluations answers them.
  const evaluation = withoutAdminNotes(await evaluate(ruleSet, parsed.plan));
  const waiting = removed.map((e) => ({
    path: e.path,
    message: e.message,
    findings: evaluation.findings.filter((f) => f.status === 'needs-info' && f.missing.some((m) => touches(m, e.path))).map((f) => ({ ruleKey: f.ruleKey, title: f.title })),
  }));
  return { evaluation, plan: parsed.plan, waiting, bySection: countBySection(ruleSet, evaluation.findings) };
}

export interface LiveExtras {
  sizing: EnclosureSizing;
  fixes: PlanFix[];
  elevation: Drawing | null;
  planView: Drawing | null;
}

function drawSafely(draw: () => Drawing): Drawing | null {
  try {
    return draw();
  } catch {
    return null;
  }
}

/** What follows the findings: the sizes worked out, the fixes that can be applied, and the small drawings. */
export async function runExtras(ruleSet: RuleSetForEvaluation, live: LiveResult): Promise<LiveExtras> {
  const [sizing, fixes] = await Promise.all([sizeEnclosure(ruleSet, live.plan), planFixes(ruleSet, live.plan, live.evaluation)]);
  const options = { params: ruleSet.parameters, marks: live.evaluation.findings };
  return {
    sizing,
    fixes,
    elevation: drawSafely(() => frontElevation(live.plan, options)),
    planView: drawSafely(() => planView(live.plan, options)),
  };
}

export { labelForPath };
