import { editionsSchema, type Editions } from '@/lib/domain/editions';
import { defaultParameters, mergeParameters, ruleSetParametersSchema, type DeepPartial, type RuleSetParameters } from '@/lib/domain/params';
import { clearanceRules } from '@/rules/clearances';
import { resolveRuleCitations, type RuleDefinition, type StoredRule } from '@/lib/domain/rule-format/define';
import { doorHardwareRules } from '@/rules/door-hardware';
import { electricalRules } from '@/rules/electrical';
import { exhaustRules } from '@/rules/exhaust';
import { fitRules } from '@/rules/fit';
import { gasRules } from '@/rules/gas';
import { makeupAirRules } from '@/rules/makeup-air';
import { plumbingRules } from '@/rules/plumbing';
import { serviceRules } from '@/rules/service';


/** Every baseline rule with its per-edition citation list. */
export const baselineRules: readonly RuleDefinition[] = [
  ...exhaustRules,
  ...makeupAirRules,
  ...gasRules,
  ...electricalRules,
  ...plumbingRules,
  ...fitRules,
  ...clearanceRules,
  ...serviceRules,
  ...doorHardwareRules,
];

export interface RuleOverride {
  enabled?: boolean;
  severity?: StoredRule['severity'];
  citation?: StoredRule['citation'];
  messages?: Partial<StoredRule['messages']>;
}

export interface RuleSetOverrides {
  /** Local amendments to thresholds and policies. */
  parameters?: DeepPartial<RuleSetParameters>;
  /** Per rule key: disable, change severity, or re-cite after a local amendment. */
  rules?: Record<string, RuleOverride>;
}

export interface BuiltRuleSet {
  parameters: RuleSetParameters;
  rules: StoredRule[];
}

function toStored(definition: RuleDefinition, parameters: RuleSetParameters, override?: RuleOverride): StoredRule {
  const { citations, citationVariants, citationNoteText, ...rest } = definition;
  const resolved = resolveRuleCitations({ citations, citationVariants, citationNoteText }, parameters);
  const stored: StoredRule = structuredClone({ ...rest, enabled: true, ...resolved });
  if (override?.enabled !== undefined) stored.enabled = override.enabled;
  if (override?.severity) stored.severity = override.severity;
  if (override?.citation) {
    stored.citation = override.citation;
    stored.citationNote = null;
    delete stored.citationVariants;
  }
  if (override?.messages) stored.messages = { ...stored.messages, ...override.messages };
  return stored;
}

/**
 * The rules and parameters of one jurisdiction: model-code defaults for its editions, its local
 * amendments applied, each citation resolved to the adopted edition. This is what a rule set
 * version stores.
 */
export function buildRuleSet(editions: Editions, overrides?: RuleSetOverrides): BuiltRuleSet {
  const unknown = Object.keys(overrides?.rules ?? {}).filter((key) => !baselineRules.some((r) => r.key === key));
  if (unknown.length > 0) throw new Error(`Unknown rule keys in overrides: ${unknown.join(', ')}`);
  const parameters = ruleSetParametersSchema.parse(
    mergeParameters(defaultParameters(editionsSchema.parse(editions)), overrides?.parameters),
  );
  return {
    parameters,
    rules: baselineRules.map((rule) => toStored(rule, parameters, overrides?.rules?.[rule.key])),
  };
}
