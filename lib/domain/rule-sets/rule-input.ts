import { z } from 'zod';
import { storedRuleSchema, validateRuleAgainstCatalog, type FieldError, type StoredRule } from '@/lib/domain/rule-format';

const shape = storedRuleSchema.shape;

/**
 * A field the editor sends as JSON text (conditions, applicability, limit). API clients may send
 * the parsed value instead; text that is not JSON is a field error at that field, with the
 * parser's position, instead of a failure later at run time.
 */
function jsonText<S extends z.ZodType>(inner: S, { emptyIsNull = false, plainTextIsValue = false } = {}) {
  return z.preprocess((value, ctx) => {
    if (typeof value !== 'string') return value;
    if (value.trim() === '' && emptyIsNull) return null;
    // A limit may be a literal text value (e.g. rigid-metal); only text that looks like JSON is parsed.
    if (plainTextIsValue && !looksLikeJson(value)) return value.trim();
    try {
      return JSON.parse(value);
    } catch (err) {
      ctx.addIssue({ code: 'custom', message: `Not valid JSON: ${(err as Error).message}.` });
      return z.NEVER;
    }
  }, inner);
}

function looksLikeJson(text: string): boolean {
  return /^\s*([{["]|-?\d|true\b|false\b|null\b)/.test(text);
}

/** `requires` as an array, or as the editor's text: one fact name per line or comma. */
const factList = z.preprocess(
  (value) => (typeof value === 'string' ? value.split(/[\n,]/).map((s) => s.trim()).filter(Boolean) : value),
  shape.requires,
);

const optionalText = z.preprocess((value) => (typeof value === 'string' && value.trim() === '' ? null : value), z.string().nullable());

/** The rule editor's schema: the stored rule's exact shape, with the JSON fields accepted as text. */
export const ruleInputSchema = storedRuleSchema.extend({
  citation: z
    .object({ code: z.string().trim().min(1, 'Name the code, e.g. IRC, or "local amendment".'), edition: optionalText, section: optionalText })
    .strict(),
  citationNote: optionalText,
  applicability: jsonText(shape.applicability, { emptyIsNull: true }),
  conditions: jsonText(shape.conditions),
  requires: factList,
  measured: optionalText,
  limit: jsonText(shape.limit, { emptyIsNull: true, plainTextIsValue: true }),
  remedy: optionalText,
});

export type RuleInput = z.input<typeof ruleInputSchema>;

export type RuleParseResult = { ok: true; rule: StoredRule } | { ok: false; errors: FieldError[] };

/**
 * Parses an edited rule and checks it against the fact catalog and parameter schema. Paths are
 * prefixed (e.g. `rule.conditions.all.0.fact`) so the editor can put each message by its field.
 */
export function parseRuleInput(input: unknown, prefix = 'rule'): RuleParseResult {
  const at = (path: string) => (prefix && path ? `${prefix}.${path}` : prefix || path);
  const parsed = ruleInputSchema.safeParse(input);
  if (!parsed.success) {
    return { ok: false, errors: parsed.error.issues.map((i) => ({ path: at(i.path.map(String).join('.')), message: i.message })) };
  }
  const rule = parsed.data as unknown as StoredRule;
  const errors = validateRuleAgainstCatalog(rule);
  if (errors.length) return { ok: false, errors: errors.map((e) => ({ path: at(e.path), message: e.message })) };
  return { ok: true, rule };
}

/** The editor's text form of a stored rule (JSON fields pretty-printed). */
export function ruleToInput(rule: StoredRule) {
  return {
    ...rule,
    citation: { code: rule.citation.code, edition: rule.citation.edition ?? '', section: rule.citation.section ?? '' },
    citationNote: rule.citationNote ?? '',
    applicability: rule.applicability ? JSON.stringify(rule.applicability, null, 2) : '',
    conditions: JSON.stringify(rule.conditions, null, 2),
    requires: rule.requires.join('\n'),
    measured: rule.measured ?? '',
    limit: rule.limit === null ? '' : typeof rule.limit === 'string' && !looksLikeJson(rule.limit) ? rule.limit : JSON.stringify(rule.limit),
    remedy: rule.remedy ?? '',
  };
}

export type RuleFormValues = ReturnType<typeof ruleToInput>;

/** A starting point for a new local rule; the admin replaces the conditions. */
export function blankRule(): RuleFormValues {
  return ruleToInput({
    key: 'local.new-rule',
    title: '',
    area: 'exhaust',
    enabled: true,
    severity: 'fail',
    citation: { code: 'local amendment', edition: null, section: null },
    confidence: 'V',
    citationNote: null,
    applicability: null,
    conditions: { name: 'passes', all: [] } as unknown as StoredRule['conditions'],
    requires: [],
    measured: null,
    limit: null,
    unit: 'boolean',
    messages: { pass: '', fail: '', notApplicable: 'Does not apply.' },
    remedy: null,
  });
}
