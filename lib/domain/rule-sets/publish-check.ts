import type { FieldError } from '@/lib/domain/errors';
import { ruleSetParametersSchema } from '@/lib/domain/params';
import { validateRuleAgainstCatalog, type StoredRule } from '@/lib/domain/rule-format';
import { ValidationError } from '@/lib/domain/errors';
import { amendmentErrors } from '@/lib/domain/params/amendments';

/**
 * Everything a version must satisfy before it becomes immutable: valid parameters, every rule
 * valid against the fact catalog, unique keys, and at least one rule that runs. Drafts are
 * checked on each save too; this catches drafts saved before a catalog change.
 */
export function publishErrors(draft: { parameters: unknown; rules: StoredRule[] }): FieldError[] {
  const errors: FieldError[] = [];
  const params = ruleSetParametersSchema.safeParse(draft.parameters);
  if (!params.success) errors.push(...params.error.issues.map((i) => ({ path: ['parameters', ...i.path.map(String)].join('.'), message: i.message })));
  else errors.push(...amendmentErrors(params.data));
  const seen = new Set<string>();
  draft.rules.forEach((rule, i) => {
    if (seen.has(rule.key)) errors.push({ path: `rules.${i}.key`, message: `Rule key '${rule.key}' appears twice.` });
    seen.add(rule.key);
    for (const e of validateRuleAgainstCatalog(rule)) errors.push({ path: `rules.${i}.${e.path}`, message: `${rule.key}: ${e.message}` });
  });
  if (!draft.rules.some((r) => r.enabled)) errors.push({ path: 'rules', message: 'Enable at least one rule before publishing.' });
  return errors;
}

/** Throws the field errors that stop a draft from being published, under the given headline. */
export function assertPublishable(draft: { parameters: unknown; rules: StoredRule[] }, headline: string): void {
  const errors = publishErrors(draft);
  if (errors.length) throw new ValidationError(errors, headline);
}
