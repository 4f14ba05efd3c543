// The library's choice lists, apart from the model's schema: the plan editor's picker needs the labels,
// not zod, in its first load.

export const applianceKinds = ['washer', 'dryer', 'washer-dryer'] as const;
export type ApplianceKind = (typeof applianceKinds)[number];
export const applianceKindLabels: Record<ApplianceKind, string> = {
  washer: 'washer',
  dryer: 'dryer',
  'washer-dryer': 'washer-dryer combination',
};
export const fuels = ['electric', 'gas'] as const;
/** The same values as a plan's `dryer.type`. */
export const dryerTypes = ['vented', 'condensing', 'heat-pump'] as const;
