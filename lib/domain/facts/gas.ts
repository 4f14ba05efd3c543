import { define, type FactContext, type FactDefinition } from '@/lib/domain/facts/context';

/** The values of `gas.locationShortfall`, the first problem found (`location-ok` when none). */
export const GAS_LOCATION_SHORTFALLS = [
  'location-ok',
  'in-restricted-room',
  'walk-in-clothes-closet',
  'space-not-dedicated',
  'door-not-solid',
  'door-not-weather-stripped',
  'door-not-self-closing',
  'combustion-air-not-outdoors',
] as const;

export const gasFactDefinitions: FactDefinition[] = [
  define('gas.isGasDryer', 'boolean', 'The dryer burns gas.', ['dryer.fuel']),
  define('gas.restrictedSpace', 'boolean', 'The dryer space is a bedroom, bathroom or storage closet, or opens into one.', ['space.kind', 'space.opensInto']),
  define(
    'gas.locationShortfall',
    'text',
    'Why the gas dryer may not stand where it is, or location-ok: a restricted room itself, or a space opening into one that does not meet the exception for a dedicated space.',
    ['space.kind', 'space.opensInto', 'space.dedicatedToLaundry', 'space.door.solid', 'space.door.weatherStripped', 'space.door.selfClosing', 'gas.combustionAirFromOutdoors'],
    GAS_LOCATION_SHORTFALLS,
  ),
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
  // IRC G2406.2 exception / IFGC 303.3: a space opening only into a restricted room may hold the appliance
  // when it is used for nothing else, has a solid, weather-stripped, self-closing door and takes all its
  // combustion air from outdoors. A walk-in clothes closet is used for storage, so it never qualifies.
  ctx.fact('gas.locationShortfall', (need) => {
    const kind = need('space.kind', plan.space?.kind);
    const opensInto = need('space.opensInto', plan.space?.opensInto);
    if (kind === undefined || opensInto === undefined) return null;
    if (RESTRICTED_SPACES.has(kind)) return 'in-restricted-room';
    if (!RESTRICTED_ROOMS.has(opensInto)) return 'location-ok';
    if (kind === 'walk-in-closet') return 'walk-in-clothes-closet';
    const door = plan.space?.door;
    const exception = [
      ['space-not-dedicated', 'space.dedicatedToLaundry', plan.space?.dedicatedToLaundry],
      ['door-not-solid', 'space.door.solid', door?.solid],
      ['door-not-weather-stripped', 'space.door.weatherStripped', door?.weatherStripped],
      ['door-not-self-closing', 'space.door.selfClosing', door?.selfClosing],
      ['combustion-air-not-outdoors', 'gas.combustionAirFromOutdoors', plan.gas?.combustionAirFromOutdoors],
    ] as const;
    // One answer "no" settles it; otherwise every part must be known.
    const unmet = exception.find(([, , value]) => value === false);
    if (unmet) return unmet[0];
    for (const [, path, value] of exception) need(path, value);
    return 'location-ok';
  });
  ctx.fact('gas.shutoffDistanceIn', (need) => need('gas.shutoffDistance', plan.gas?.shutoffDistance));
  ctx.fact('gas.shutoffSameRoom', (need) => need('gas.shutoffSameRoom', plan.gas?.shutoffSameRoom));
  ctx.fact('gas.connectorLengthIn', (need) => need('gas.connectorLength', plan.gas?.connectorLength));
}
