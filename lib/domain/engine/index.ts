import { Engine, type RuleProperties, type RuleResult, type TopLevelCondition } from 'json-rules-engine';
import { citationText, type FindingStatus } from '@/lib/domain/vocabulary';
import { computeFactsWithMissing, factsSchema, type FactKind, type Facts, type FactValue } from '@/lib/domain/facts';
import { labelForPath, type Plan } from '@/lib/domain/plan';
import { readParam, ruleSetParametersSchema, type RuleSetParameters } from '@/lib/domain/params';
import { computeRemedy } from '@/lib/domain/remedies';
import { amendmentsForFinding, amendmentsForRule, changedParameters, factsMovedByAmendments, parameterLabel, parameterValueText, type ParameterAmendment } from '@/lib/domain/params/amendments';
import { formatArea, formatLength, type LengthStyle, type UnitSystem } from '@/lib/domain/units';
import { conditionFacts, splitCitationNote, variantForFacts, type Area, type Citation, type Confidence, type Limit, type StoredCondition, type StoredRule, type ValueRef } from '@/lib/domain/rule-format';

export type { FindingStatus };
export type LimitValue = number | boolean | string | { min: number; max: number } | null;

export interface Finding {
  ruleKey: string;
  title: string;
  area: Area;
  status: FindingStatus;
  measured: FactValue;
  limit: LimitValue;
  unit: FactKind;
  /** measured and limit as text in the plan's units. */
  display: { measured: string | null; limit: string | null };
  citation: Citation;
  confidence: Confidence;
  citationNote: string | null;
  message: string;
  /** Name of the condition that failed (fail/caution only). */
  failedCondition: string | null;
  /** Plan fields to fill in (needs-info only). */
  missing: string[];
  /** Smallest change that would pass (fail/caution only). */
  remedy: string | null;
  /** The locally adopted code and the AHJ govern; source confidence. */
  note: string;
  /** Local amendments that changed a model value this rule reads; `citation` stays the model section. */
  amendments?: ParameterAmendment[];
  /**
   * What an admin should fix in the rule set for this rule (a local amendment's section not entered). Shown on
   * rule-set screens only; `withoutAdminNotes` removes it before findings reach an installer or are stored.
   */
  adminNote?: string | null;
}

/** Findings as installers receive and checks store them: without the notes meant for rule-set admins. */
export function withoutAdminNotes<T extends { findings: Finding[] }>(evaluation: T): T {
  return { ...evaluation, findings: evaluation.findings.map(({ adminNote: _admin, ...finding }) => finding) };
}

export interface EvaluationSummary {
  pass: number;
  fail: number;
  caution: number;
  needsInfo: number;
  notApplicable: number;
}

export interface Evaluation {
  ruleSet: { jurisdiction: string; version: number };
  summary: EvaluationSummary;
  findings: Finding[];
  facts: Facts;
}

export interface RuleSetForEvaluation {
  /** Identity of an immutable rule set version; compiled rule JSON is cached under it. */
  id?: string;
  jurisdiction: string;
  version: number;
  parameters: RuleSetParameters;
  rules: StoredRule[];
}

interface CompiledRule {
  rule: StoredRule;
  amendments: ParameterAmendment[];
  applicability: RuleProperties | null;
  main: RuleProperties;
  applicabilityFacts: string[];
  requiredFacts: string[];
}

interface CompiledRuleSet {
  parameters: RuleSetParameters;
  /** Whether any changed model value carries a local amendment (then each run traces which facts it moved). */
  hasCitedAmendments: boolean;
  rules: CompiledRule[];
}

const APPLIES = '#applies';

function deepFreeze<T>(value: T): T {
  if (value && typeof value === 'object' && !Object.isFrozen(value)) {
    Object.freeze(value);
    for (const child of Object.values(value)) deepFreeze(child);
  }
  return value;
}

/** json-rules-engine rule JSON for a stored rule: its passing conditions and, if any, applicability. */
export function toEngineRules(rule: StoredRule): { main: RuleProperties; applicability: RuleProperties | null } {
  return {
    main: { name: rule.key, conditions: rule.conditions as TopLevelCondition, event: { type: rule.key } },
    applicability: rule.applicability
      ? { name: rule.key + APPLIES, conditions: rule.applicability as TopLevelCondition, event: { type: rule.key + APPLIES } }
      : null,
  };
}

function compile(ruleSet: RuleSetForEvaluation): CompiledRuleSet {
  const parameters = ruleSetParametersSchema.parse(ruleSet.parameters);
  const rules = ruleSet.rules
    .filter((rule) => rule.enabled)
    .map((rule) => {
      const { main, applicability } = toEngineRules(rule);
      return {
        rule,
        amendments: amendmentsForRule(rule, parameters),
        main,
        applicability,
        applicabilityFacts: conditionFacts(rule.applicability as StoredCondition | null),
        requiredFacts: [...new Set([...rule.requires, ...conditionFacts(rule.conditions as StoredCondition)])],
      };
    });
  // Frozen so no run can alter JSON shared by later evaluations.
  const hasCitedAmendments = changedParameters(parameters).some((c) => c.citation !== null);
  return deepFreeze({ parameters, rules, hasCitedAmendments });
}

const CACHE_LIMIT = 200;
const compiledCache = new Map<string, CompiledRuleSet>();

function compiledFor(ruleSet: RuleSetForEvaluation): CompiledRuleSet {
  if (ruleSet.id === undefined) return compile(ruleSet);
  const cached = compiledCache.get(ruleSet.id);
  if (cached) return cached;
  const compiled = compile(ruleSet);
  if (compiledCache.size >= CACHE_LIMIT) compiledCache.delete(compiledCache.keys().next().value as string);
  compiledCache.set(ruleSet.id, compiled);
  return compiled;
}

/** Forgets compiled rule JSON (tests; an unpublished draft reusing an id). */
export function clearCompiledRuleSets(): void {
  compiledCache.clear();
}

/** `$.a.b` paths as json-rules-engine's default resolver reads them, for the plain objects our facts are. */
export function resolveSimplePath(value: unknown, path: string): unknown {
  if (!path.startsWith('$.')) return undefined;
  let current: unknown = value;
  for (const key of path.slice(2).split('.')) {
    if (current === null || typeof current !== 'object' || !(key in (current as object))) return undefined;
    current = (current as Record<string, unknown>)[key];
  }
  return current;
}

function resolveRef(ref: ValueRef, facts: Facts, params: RuleSetParameters): FactValue {
  if (ref === null || typeof ref !== 'object') return ref;
  if (ref.fact === 'params') return (readParam(params, ref.path ?? '') ?? null) as FactValue;
  return facts[ref.fact] ?? null;
}

function limitFacts(limit: Limit | null): string[] {
  const refs = limit !== null && typeof limit === 'object' && 'min' in limit ? [limit.min, limit.max] : [limit];
  return refs.flatMap((r) => (r !== null && typeof r === 'object' && 'fact' in r && r.fact !== 'params' ? [r.fact] : []));
}

function resolveLimit(limit: Limit | null, facts: Facts, params: RuleSetParameters): LimitValue {
  if (limit === null) return null;
  if (typeof limit === 'object' && 'min' in limit) {
    const min = resolveRef(limit.min, facts, params);
    const max = resolveRef(limit.max, facts, params);
    return typeof min === 'number' && typeof max === 'number' ? { min, max } : null;
  }
  return resolveRef(limit as ValueRef, facts, params);
}

const TEXT_DISPLAY: Record<string, string> = {
  'rigid-metal': 'rigid metal',
  'semi-rigid-metal': 'semi-rigid metal',
  'flexible-foil': 'flexible foil',
  'flexible-vinyl': 'flexible vinyl',
  'listed-fans': 'any listed fan',
  'power-ventilators-only': 'only listed dryer exhaust duct power ventilators',
  'power-ventilator': 'a dryer exhaust duct power ventilator',
  booster: 'a booster fan',
  'crawl-space': 'crawl space',
  'other-indoor': 'another indoor space',
  'floor-drain': 'floor drain',
  'indirect-receptor': 'indirect-waste receptor',
  'within-sight': 'a switch or breaker within sight',
  'lockable-breaker': 'a breaker lockable in the open position',
  'location-ok': 'the location is allowed',
  'in-restricted-room': 'the space is itself a bedroom, bathroom, toilet room or storage closet',
  'walk-in-clothes-closet': 'the space is a walk-in clothes closet, which is used for storage and so is never a space used for no other purpose',
  'space-not-dedicated': 'the space is used for other purposes too',
  'door-not-solid': 'its door is not solid',
  'door-not-weather-stripped': 'its door is not weather-stripped',
  'door-not-self-closing': 'its door has no self-closing device',
  'combustion-air-not-outdoors': 'not all of its combustion air comes from outdoors',
};

function display(value: FactValue, unit: FactKind, units: UnitSystem, style: LengthStyle | undefined): string | null {
  if (value === null) return null;
  if (typeof value === 'boolean') return value ? 'yes' : 'no';
  if (typeof value === 'string') return TEXT_DISPLAY[value] ?? value;
  switch (unit) {
    case 'length':
      return formatLength(value, units, style);
    case 'area':
      return formatArea(value, units);
    case 'cfm':
      return `${value} cfm`;
    case 'amps':
      return `${value} A`;
    case 'volts':
      return `${value} V`;
    default:
      return String(value);
  }
}

function displayLimit(limit: LimitValue, unit: FactKind, units: UnitSystem, style: LengthStyle | undefined): string | null {
  if (limit !== null && typeof limit === 'object') {
    return `${display(limit.min, unit, units, style)} to ${display(limit.max, unit, units, style)}`;
  }
  return display(limit, unit, units, style);
}

type ConditionResult = { name?: string; result?: boolean; all?: ConditionResult[]; any?: ConditionResult[]; not?: ConditionResult };

/** The first clause that failed, leaf-first inside `all`; an `any` or `not` reports its own name. */
function failedClause(node: ConditionResult): string | null {
  if (node.all) {
    for (const child of node.all) {
      if (child.result === false) return failedClause(child) ?? child.name ?? node.name ?? null;
    }
    return node.name ?? null;
  }
  return node.result === false || node.result === undefined ? (node.name ?? null) : null;
}

const CONFIDENCE_NOTES: Record<Confidence, string> = {
  V: '',
  S: ' Source confirmed only by secondary sources; check the adopted text.',
  M: ' Section or value from memory, not yet verified; check the adopted text before relying on it.',
  CP: ' Common practice, not a code requirement.',
};

function noteFor(rule: Pick<StoredRule, 'citation' | 'confidence' | 'citationNote'>, jurisdiction: string, amendments: ParameterAmendment[]): string {
  const amended = amendments
    .map((a) => ` ${parameterLabel(a.parameter)}: ${parameterValueText(a.parameter, a.value)} by local amendment ${a.citation} (model value ${parameterValueText(a.parameter, a.modelValue)}).`)
    .join('');
  const base = `Checked against ${citationText(rule.citation)}${amended ? ' as locally amended' : ''} for ${jurisdiction}.${amended} The locally adopted code, its amendments and the AHJ govern; this finding is an aid, not an approval.`;
  return `${base}${CONFIDENCE_NOTES[rule.confidence]}${rule.citationNote ? ` ${rule.citationNote}` : ''}`;
}

/** `{measured}`, `{limit}` and `{shortfall}` (how far apart the two are) in a message template. */
function fill(template: string, measured: string | null, limit: string | null, shortfall: string | null = null): string {
  return template
    .replace(/\{measured\}/g, measured ?? 'not given')
    .replace(/\{limit\}/g, limit ?? 'the limit')
    .replace(/\{shortfall\}/g, shortfall ?? 'an unknown amount');
}

type FindingBase = Omit<Finding, 'status' | 'message' | 'failedCondition' | 'missing' | 'remedy' | 'adminNote'> & { adminNote: string | null };

// Written out field by field: object spread compiles to a slow helper under some transpilers and
// dominated evaluate()'s own cost.
function finish(
  base: FindingBase,
  status: FindingStatus,
  message: string,
  failedCondition: string | null,
  missing: string[],
  remedy: string | null,
): Finding {
  return {
    ruleKey: base.ruleKey,
    title: base.title,
    area: base.area,
    status,
    measured: base.measured,
    limit: base.limit,
    unit: base.unit,
    display: base.display,
    citation: base.citation,
    confidence: base.confidence,
    citationNote: base.citationNote,
    message,
    failedCondition,
    missing,
    remedy,
    note: base.note,
    amendments: base.amendments,
    adminNote: base.adminNote,
  };
}

function needsInfoFinding(base: FindingBase, missing: string[], summary: EvaluationSummary): Finding {
  summary.needsInfo += 1;
  const message =
    missing.length > 0
      ? `To check this, add to the plan: ${missing.map(labelForPath).join('; ')}.`
      : 'Needs more detail in the plan to check this.';
  return finish(base, 'needs-info', message, null, missing, null);
}

type Ternary = boolean | null;

function compareLeaf(operator: string, left: FactValue, right: unknown): Ternary {
  switch (operator) {
    case 'equal':
      return left === right;
    case 'notEqual':
      return left !== right;
    case 'in':
      return Array.isArray(right) ? right.includes(left) : null;
    case 'notIn':
      return Array.isArray(right) ? !right.includes(left) : null;
    case 'lessThan':
    case 'lessThanInclusive':
    case 'greaterThan':
    case 'greaterThanInclusive': {
      if (typeof left !== 'number' || typeof right !== 'number') return null;
      if (operator === 'lessThan') return left < right;
      if (operator === 'lessThanInclusive') return left <= right;
      if (operator === 'greaterThan') return left > right;
      return left >= right;
    }
    default:
      return null;
  }
}

/**
 * Three-valued reading of a condition over the known facts: false when the facts at hand already
 * decide it false, null when it hangs on a missing one. A rule ruled out by what is known (the
 * exhaust rules for a ventless dryer) is not-applicable, never needs-info for what it would have read.
 */
function decide(condition: StoredCondition, facts: Facts, params: RuleSetParameters): Ternary {
  if ('all' in condition) {
    let result: Ternary = true;
    for (const child of condition.all) {
      const r = decide(child, facts, params);
      if (r === false) return false;
      if (r === null) result = null;
    }
    return result;
  }
  if ('any' in condition) {
    let result: Ternary = false;
    for (const child of condition.any) {
      const r = decide(child, facts, params);
      if (r === true) return true;
      if (r === null) result = null;
    }
    return result;
  }
  if ('not' in condition) {
    const r = decide(condition.not, facts, params);
    return r === null ? null : !r;
  }
  if (!('fact' in condition)) return null;
  const left = condition.fact === 'params' ? ((readParam(params, condition.path ?? '') ?? null) as FactValue) : (facts[condition.fact] ?? null);
  if (condition.fact !== 'params' && left === null) return null;
  const value = condition.value;
  let right: unknown = value;
  if (value !== null && typeof value === 'object' && !Array.isArray(value)) {
    right = resolveRef(value as ValueRef, facts, params);
    if (right === null && value.fact !== 'params') return null;
  }
  return compareLeaf(condition.operator, left, right);
}

function missingPaths(facts: string[], values: Facts, missing: Record<string, string[]>): string[] | null {
  const nullFacts = facts.filter((fact) => values[fact] === null || values[fact] === undefined);
  if (nullFacts.length === 0) return null;
  return [...new Set(nullFacts.flatMap((fact) => missing[fact] ?? []))];
}

/**
 * Evaluates a canonical plan against one rule set version: exactly one finding per enabled rule.
 * Facts are computed and type-checked first; a rule whose facts are missing is needs-info
 * without running. A fresh json-rules-engine Engine is built for every call.
 */
export async function evaluate(ruleSet: RuleSetForEvaluation, plan: Plan): Promise<Evaluation> {
  const compiled = compiledFor(ruleSet);
  const { parameters } = compiled;
  const computed = computeFactsWithMissing(plan, parameters);
  const facts = factsSchema.parse(computed.facts) as Facts;
  const moved = compiled.hasCitedAmendments
    ? factsMovedByAmendments(parameters, facts, (at) => computeFactsWithMissing(plan, at).facts as Record<string, unknown>)
    : new Map<string, ParameterAmendment[]>();

  // Our paths are plain `$.a.b` into the parameters: a direct walk instead of a general JSONPath query
  // keeps the engine's overhead over raw json-rules-engine small (see npm run bench).
  const engine = new Engine([], { allowUndefinedFacts: false, pathResolver: resolveSimplePath });
  engine.addFact('params', parameters);
  for (const [name, value] of Object.entries(facts)) if (value !== null) engine.addFact(name, value);

  const early = new Map<string, string[]>();
  const ruledOut = new Set<string>();
  const missingRequired = new Map<string, string[]>();
  const pendingMain = new Set<string>();
  for (const entry of compiled.rules) {
    const key = entry.rule.key;
    const missingForApplicability = missingPaths(entry.applicabilityFacts, facts, computed.missing);
    if (missingForApplicability) {
      if (decide(entry.rule.applicability as StoredCondition, facts, parameters) === false) ruledOut.add(key);
      else early.set(key, missingForApplicability);
      continue;
    }
    if (entry.applicability) engine.addRule(entry.applicability);
    const missingForRule = missingPaths(entry.requiredFacts, facts, computed.missing);
    if (missingForRule) missingRequired.set(key, missingForRule);
    else {
      engine.addRule(entry.main);
      pendingMain.add(key);
    }
  }

  const results = new Map<string, RuleResult>();
  if (pendingMain.size > 0 || compiled.rules.some((r) => r.applicability && !early.has(r.rule.key) && !ruledOut.has(r.rule.key))) {
    const run = await engine.run();
    for (const result of [...run.results, ...run.failureResults]) results.set(result.name, result);
  }

  const summary: EvaluationSummary = { pass: 0, fail: 0, caution: 0, needsInfo: 0, notApplicable: 0 };
  const findings = compiled.rules.map(({ rule, amendments: direct, requiredFacts, applicabilityFacts }): Finding => {
    const amendments = amendmentsForFinding(direct, [...requiredFacts, ...applicabilityFacts, ...(rule.measured ? [rule.measured] : []), ...limitFacts(rule.limit)], moved);
    const variant = rule.citationVariants ? variantForFacts(rule, facts) : null;
    const messages = variant?.messages ? { ...rule.messages, ...variant.messages } : rule.messages;
    const measured = rule.measured ? (facts[rule.measured] ?? null) : null;
    const limit = resolveLimit(rule.limit, facts, parameters);
    const shown = {
      measured: display(measured, rule.unit, plan.units, rule.lengthStyle),
      limit: displayLimit(limit, rule.unit, plan.units, rule.lengthStyle),
    };
    const cited = variant ?? rule;
    const citationNote = splitCitationNote(cited.citationNote);
    const base: FindingBase = {
      ruleKey: rule.key,
      title: rule.title,
      area: rule.area,
      measured,
      limit,
      unit: rule.unit,
      display: shown,
      citation: cited.citation,
      confidence: cited.confidence,
      citationNote: citationNote.installer,
      note: noteFor({ ...cited, citationNote: citationNote.installer }, ruleSet.jurisdiction, amendments),
      amendments,
      adminNote: citationNote.admin,
    };
    const earlyMissing = early.get(rule.key);
    if (earlyMissing) return needsInfoFinding(base, earlyMissing, summary);
    if (ruledOut.has(rule.key) || (rule.applicability && results.get(rule.key + APPLIES)?.result !== true)) {
      summary.notApplicable += 1;
      return finish(base, 'not-applicable', messages.notApplicable, null, [], null);
    }
    const missing = missingRequired.get(rule.key);
    if (missing) return needsInfoFinding(base, missing, summary);

    const result = results.get(rule.key);
    if (result?.result === true) {
      summary.pass += 1;
      return finish(base, 'pass', fill(messages.pass, shown.measured, shown.limit), null, [], null);
    }
    const failedCondition = result ? failedClause(result.conditions as ConditionResult) : null;
    // A thin length rounded to thousandths can hide a miss (0.0158 against 0.016): then one more digit.
    if (rule.lengthStyle === 'decimal' && shown.measured !== null && shown.measured === shown.limit && typeof measured === 'number' && typeof limit === 'number' && measured !== limit) {
      shown.measured = formatLength(measured, plan.units, 'decimal-fine');
      shown.limit = formatLength(limit, plan.units, 'decimal-fine');
    }
    if (rule.severity === 'fail') summary.fail += 1;
    else summary.caution += 1;
    const remedy = computeRemedy(rule.remedy, { plan, params: parameters, facts, units: plan.units, measured, limit, failedCondition });
    const apart = typeof measured === 'number' && typeof limit === 'number' ? Math.abs(limit - measured) : null;
    const shortfall = apart === null ? null : display(apart, rule.unit, plan.units, rule.lengthStyle);
    return finish(base, rule.severity, fill(messages.fail, shown.measured, shown.limit, shortfall), failedCondition, [], remedy);
  });

  return { ruleSet: { jurisdiction: ruleSet.jurisdiction, version: ruleSet.version }, summary, findings, facts };
}
