import { define, type FactContext, type FactDefinition } from '@/lib/domain/facts/context';

export const spaceFactDefinitions: FactDefinition[] = [
  define('space.isDwelling', 'boolean', 'The building is a one- or two-family dwelling or townhouse (the default when the plan does not say).', ['space.buildingType']),
];

export function computeSpaceFacts(ctx: FactContext): void {
  // A dwelling unless the plan says otherwise: most closets NookPass sees are in houses.
  ctx.fact('space.isDwelling', () => ctx.plan.space?.buildingType !== 'other');
}
