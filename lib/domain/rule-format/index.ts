// The rule format: how a rule, its citation and its conditions are written and stored.
export * from './define';
export * from './stored-rule';
