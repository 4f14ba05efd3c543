// The rule format: how a rule, its citation and its conditions are written and stored.
export * from '@/lib/domain/rule-format/define';
export * from '@/lib/domain/rule-format/stored-rule';
