// Which editor sections a check's failing findings concern, so a collapsed section can say how many fail in it.
import { factsByName } from '@/lib/domain/facts';
import { entryAt, type PlanSectionId } from '@/lib/domain/plan/registry';
import { conditionFacts, type StoredCondition, type StoredRule } from '@/lib/domain/rule-format';
import type { FindingStatus } from '@/lib/domain/vocabulary';

export type SectionFailCounts = Partial<Record<PlanSectionId, number>>;

/** The editor sections holding the plan fields a rule reads (its facts' plan paths). */
export function sectionsOfRule(rule: Pick<StoredRule, 'requires'> & { conditions: unknown }): PlanSectionId[] {
  const facts = new Set([...rule.requires, ...conditionFacts(rule.conditions as StoredCondition)]);
  const sections = new Set<PlanSectionId>();
  for (const fact of facts) {
    for (const path of factsByName.get(fact)?.planPaths ?? []) {
      const section = entryAt(path)?.section;
      if (section) sections.add(section);
    }
  }
  return [...sections];
}

/** Failing findings per section; a finding counts in every section whose fields its rule reads. */
export function failingBySection(
  findings: readonly { ruleKey: string; status: FindingStatus }[],
  rules: readonly (Pick<StoredRule, 'key' | 'requires'> & { conditions: unknown })[],
): SectionFailCounts {
  const byKey = new Map(rules.map((r) => [r.key, r]));
  const counts: SectionFailCounts = {};
  for (const finding of findings) {
    if (finding.status !== 'fail') continue;
    const rule = byKey.get(finding.ruleKey);
    if (!rule) continue;
    for (const section of sectionsOfRule(rule)) counts[section] = (counts[section] ?? 0) + 1;
  }
  return counts;
}
