import type { Receptacle } from '@/lib/domain/plan';
import type { RuleSetParameters } from '@/lib/domain/params';
import { define, type FactContext, type FactDefinition, type Need } from '@/lib/domain/facts/context';

export const electricalFactDefinitions: FactDefinition[] = [
  define('electrical.laundryCircuitAmps', 'amps', 'Rating of the laundry branch circuit.', ['electrical.laundryCircuit.amps']),
  define('electrical.laundryCircuitDedicated', 'boolean', 'The laundry circuit serves only the laundry area.', ['electrical.laundryCircuit.dedicated']),
  define('electrical.washerReceptacleDistanceIn', 'length', 'Distance from the washer’s receptacle to the washer.', ['electrical.receptacles']),
  define('electrical.dryerReceptacleDistanceIn', 'length', 'Distance from the dryer’s receptacle to the dryer.', ['electrical.receptacles']),
  define('electrical.receptaclesReachable', 'boolean', 'Every cord-and-plug connection can be reached with the appliances in place.', ['electrical.receptacles']),
  define('electrical.hasPlugConnections', 'boolean', 'At least one appliance is connected by cord and plug (not hard-wired).', ['electrical.receptacles']),
  define('electrical.dryerHardWired', 'boolean', 'The dryer is permanently connected, with no cord and plug.', ['electrical.receptacles']),
  define('electrical.dryerDisconnect', 'text', 'The disconnecting means of a hard-wired dryer.', ['electrical.receptacles'], ['within-sight', 'lockable-breaker', 'none']),
  define('electrical.washerGfciRequired', 'boolean', 'The adopted NEC edition requires GFCI protection of the washer receptacle.', ['electrical.receptacles']),
  define('electrical.washerGfci', 'boolean', 'The washer receptacle has GFCI protection.', ['electrical.receptacles']),
  define('electrical.dryerGfciRequired', 'boolean', 'The adopted NEC edition requires GFCI protection of the dryer receptacle.', ['electrical.receptacles', 'dryer.fuel']),
  define('electrical.dryerGfci', 'boolean', 'The dryer receptacle has GFCI protection.', ['electrical.receptacles']),
  define('electrical.afciRequired', 'boolean', 'A 120-V 15/20-A laundry receptacle needs AFCI protection under the adopted NEC edition.', ['electrical.receptacles']),
  define('electrical.afciProvided', 'boolean', 'Every laundry receptacle needing AFCI protection has it.', ['electrical.receptacles']),
  define('electrical.isElectricDryer', 'boolean', 'The dryer is electric.', ['dryer.fuel']),
  define('electrical.dryerWires', 'count', 'Conductors to the dryer receptacle.', ['electrical.receptacles']),
  define('electrical.dryerCircuitExisting', 'boolean', 'The dryer receptacle is on an existing circuit (not new work).', ['electrical.receptacles']),
  define('electrical.dryerReceptacleAmps', 'amps', 'Rating of the dryer receptacle and circuit.', ['electrical.receptacles']),
];


function findReceptacle(receptacles: Receptacle[] | undefined, appliance: 'washer' | 'dryer'): { receptacle?: Receptacle; index: number } {
  const index = receptacles?.findIndex((r) => r.serves === appliance || r.serves === 'both') ?? -1;
  return { receptacle: index >= 0 ? receptacles?.[index] : undefined, index };
}

function gfciRequiredFor(volts: number, params: RuleSetParameters, hardWired = false): boolean {
  // Before NEC 2023 the laundry GFCI rule, 210.8(A), covers receptacles only; 210.8(D) adds hard-wired dryer outlets.
  if (hardWired && params.electrical.gfciScope !== 'laundry-and-dryer-outlets') return false;
  switch (params.electrical.gfciScope) {
    case 'none':
      return false;
    case 'laundry-125v':
      return volts <= 125; // NEC 2014/2017 210.8(A)(10): 125-V single-phase 15/20-A receptacles
    default:
      return volts <= 250; // NEC 2020: 125-250 V receptacles; NEC 2023 adds hard-wired dryer outlets
  }
}

export function computeElectricalFacts(ctx: FactContext): void {
  const { plan, params } = ctx;
  const receptacles = plan.electrical?.receptacles;
  const circuit = plan.electrical?.laundryCircuit;

  ctx.fact('electrical.laundryCircuitAmps', (need) => need('electrical.laundryCircuit.amps', circuit?.amps));
  ctx.fact('electrical.laundryCircuitDedicated', (need) => need('electrical.laundryCircuit.dedicated', circuit?.dedicated));

  const field = <K extends keyof Receptacle & string>(appliance: 'washer' | 'dryer', key: K) => (need: Need) => {
    const { receptacle, index } = findReceptacle(receptacles, appliance);
    const found = need("electrical.receptacles", receptacle);
    return need(`electrical.receptacles.${index}.${key}`, found[key]) as never;
  };

  ctx.fact('electrical.washerReceptacleDistanceIn', field('washer', 'distanceToAppliance'));
  ctx.fact('electrical.dryerReceptacleDistanceIn', field('dryer', 'distanceToAppliance'));
  // NEC 422.33 is about a plug used as the disconnect: a hard-wired appliance has none to reach.
  ctx.fact('electrical.receptaclesReachable', (need) =>
    need('electrical.receptacles', receptacles && receptacles.length > 0 ? receptacles : undefined).every(
      (r, index) => r.hardWired === true || need(`electrical.receptacles.${index}.reachableInstalled`, r.reachableInstalled) === true,
    ),
  );
  ctx.fact('electrical.hasPlugConnections', (need) =>
    need('electrical.receptacles', receptacles && receptacles.length > 0 ? receptacles : undefined).some((r) => r.hardWired !== true),
  );
  ctx.fact('electrical.dryerHardWired', (need) => need('electrical.receptacles', findReceptacle(receptacles, 'dryer').receptacle).hardWired === true);
  ctx.fact('electrical.dryerDisconnect', field('dryer', 'disconnect'));
  ctx.fact('electrical.washerGfciRequired', (need) => gfciRequiredFor(field('washer', 'volts')(need) as number, params));
  ctx.fact('electrical.washerGfci', field('washer', 'gfci'));
  ctx.fact('electrical.dryerGfciRequired', (need) => {
    const volts = field('dryer', 'volts')(need) as number;
    return gfciRequiredFor(volts, params, findReceptacle(receptacles, 'dryer').receptacle?.hardWired === true);
  });
  ctx.fact('electrical.dryerGfci', field('dryer', 'gfci'));

  const needsAfci = (r: Receptacle) => (r.volts ?? 120) <= 125 && (r.amps ?? 20) <= 20;
  ctx.fact('electrical.afciRequired', (need) => {
    const list = need('electrical.receptacles', receptacles && receptacles.length > 0 ? receptacles : undefined);
    return params.electrical.afciLaundry && list.some(needsAfci);
  });
  ctx.fact('electrical.afciProvided', (need) =>
    need('electrical.receptacles', receptacles && receptacles.length > 0 ? receptacles : undefined).every(
      (r, index) => !needsAfci(r) || need(`electrical.receptacles.${index}.afci`, r.afci) === true,
    ),
  );

  ctx.fact('electrical.isElectricDryer', (need) => need('dryer.fuel', plan.dryer?.fuel) === 'electric');
  ctx.fact('electrical.dryerWires', field('dryer', 'wires'));
  ctx.fact('electrical.dryerCircuitExisting', (need) => {
    const { receptacle } = findReceptacle(receptacles, 'dryer');
    // New work unless the plan says the circuit already exists.
    return need("electrical.receptacles", receptacle).existingCircuit === true;
  });
  ctx.fact('electrical.dryerReceptacleAmps', field('dryer', 'amps'));
}
