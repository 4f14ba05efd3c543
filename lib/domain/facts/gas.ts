import { define, type FactContext, type FactDefinition } from '@/lib/domain/facts/context';

export const gasFactDefinitions: FactDefinition[] = [
  define('gas.isGasDryer', 'boolean', 'The dryer burns gas.', ['dryer.fuel']),
  define('gas.restrictedSpace', 'boolean', 'The dryer space is a bedroom, bathroom or storage closet, or opens into one.', ['space.kind', 'space.opensInto']),
  define('gas.shutoffDistanceIn', 'length', 'Distance from the gas shut-off valve to the dryer.', ['gas.shutoffDistance']),
  define('gas.shutoffSameRoom', 'boolean', 'The shut-off valve is in the same room as the dryer.', ['gas.shutoffSameRoom']),
  define('gas.connectorLengthIn', 'length', 'Length of the appliance connector.', ['gas.connectorLength']),
];

// IRC G2406.2 / IFGC 303.3: sleeping rooms, bathrooms, toilet rooms, storage closets and spaces
// opening only into them.
const RESTRICTED_SPACES = new Set(['bedroom', 'bathroom', 'storage-closet']);
const RESTRICTED_ROOMS = new Set(['bedroom', 'bathroom', 'toilet-room', 'storage-closet']);

export function computeGasFacts(ctx: FactContext): void {
  const { plan } = ctx;
  ctx.fact('gas.isGasDryer', (need) => need('dryer.fuel', plan.dryer?.fuel) === 'gas');
  ctx.fact('gas.restrictedSpace', (need) => {
    const kind = need('space.kind', plan.space?.kind);
    const opensInto = need('space.opensInto', plan.space?.opensInto);
    return RESTRICTED_SPACES.has(kind) || RESTRICTED_ROOMS.has(opensInto);
  });
  ctx.fact('gas.shutoffDistanceIn', (need) => need('gas.shutoffDistance', plan.gas?.shutoffDistance));
  ctx.fact('gas.shutoffSameRoom', (need) => need('gas.shutoffSameRoom', plan.gas?.shutoffSameRoom));
  ctx.fact('gas.connectorLengthIn', (need) => need('gas.connectorLength', plan.gas?.connectorLength));
}
