/** A rule set version's life: a draft is edited, published once (then immutable), retired when a successor is published. */
export type RuleSetStatus = 'draft' | 'published' | 'retired';

export const ruleSetStatusLabels: Record<RuleSetStatus, string> = { draft: 'Draft', published: 'Published', retired: 'Retired' };
