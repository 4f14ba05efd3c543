import type { RuleSetParameters } from '@/lib/domain/params';
import { define, nominalSizeIn, type FactContext, type FactDefinition, type Need } from '@/lib/domain/facts/context';

export const plumbingFactDefinitions: FactDefinition[] = [
  define('plumbing.standpipeHeightIn', 'length', 'Standpipe height above the trap weir.', ['plumbing.standpipeHeight']),
  define('plumbing.trapSizeIn', 'length', 'Nominal size of the washer trap.', ['plumbing.trapSize']),
  define('plumbing.drainPanRequired', 'boolean', 'The jurisdiction requires a drain pan under the washer here.', ['space.overFinishedSpace']),
  define('plumbing.drainPanPresent', 'boolean', 'A drain pan is installed.', ['plumbing.drainPan']),
  define('plumbing.drainPanDrained', 'boolean', 'The drain pan has a drain to a receptor or floor drain.', ['plumbing.drainPan.present', 'plumbing.drainPan.drainsTo']),
  define('plumbing.valvesAccessible', 'boolean', 'The supply valves can be reached with the appliances installed.', ['plumbing.valvesAccessible']),
  define('plumbing.hammerArrestors', 'boolean', 'Water-hammer arrestors are installed.', ['plumbing.hammerArrestors']),
  define('plumbing.leakShutoffRequired', 'boolean', 'The jurisdiction requires an automatic leak shut-off here.', ['space.overFinishedSpace']),
  define('plumbing.leakShutoff', 'boolean', 'An automatic leak shut-off is installed.', ['plumbing.leakShutoff']),
  define('plumbing.condensate', 'text', 'How a ventless dryer disposes of its condensate.', ['dryer.condensate'], ['drain', 'reservoir']),
  define('plumbing.condensateDrainTo', 'text', 'Where a ventless dryer’s drain hose discharges.', ['dryer.condensateDrainTo'], ['standpipe', 'floor-drain', 'indirect-receptor', 'none']),
  define('plumbing.condensateDrainReachable', 'boolean', 'The receptor is within the drain hose’s reach per the maker’s instructions.', ['dryer.condensateDrainReachable']),
];

type Policy = RuleSetParameters['plumbing']['drainPanPolicy'];

export function computePlumbingFacts(ctx: FactContext): void {
  const { plan, params } = ctx;
  const plumbing = plan.plumbing;
  const required = (policy: Policy) => (need: Need) => {
    if (policy === 'never') return false;
    if (policy === 'always') return true;
    return need('space.overFinishedSpace', plan.space?.overFinishedSpace);
  };

  ctx.fact('plumbing.standpipeHeightIn', (need) => need('plumbing.standpipeHeight', plumbing?.standpipeHeight));
  ctx.fact('plumbing.trapSizeIn', (need) => nominalSizeIn(need('plumbing.trapSize', plumbing?.trapSize)));
  ctx.fact('plumbing.drainPanRequired', required(params.plumbing.drainPanPolicy));
  // A null pan means none is installed; a missing one means the installer has not said.
  ctx.fact('plumbing.drainPanPresent', (need) => {
    const pan = need('plumbing.drainPan', plumbing?.drainPan === null ? false : plumbing?.drainPan);
    return pan !== false && need('plumbing.drainPan.present', pan.present) === true;
  });
  ctx.fact('plumbing.drainPanDrained', (need) => {
    const pan = need('plumbing.drainPan', plumbing?.drainPan === null ? false : plumbing?.drainPan);
    if (pan === false || !need('plumbing.drainPan.present', pan.present)) return false;
    return need('plumbing.drainPan.drainsTo', pan.drainsTo) !== 'none';
  });
  ctx.fact('plumbing.valvesAccessible', (need) => need('plumbing.valvesAccessible', plumbing?.valvesAccessible));
  ctx.fact('plumbing.hammerArrestors', (need) => need('plumbing.hammerArrestors', plumbing?.hammerArrestors));
  ctx.fact('plumbing.leakShutoffRequired', required(params.plumbing.leakShutoffPolicy));
  ctx.fact('plumbing.leakShutoff', (need) => need('plumbing.leakShutoff', plumbing?.leakShutoff));
  const dryer = plan.dryer;
  ctx.fact('plumbing.condensate', (need) => need('dryer.condensate', dryer?.condensate));
  ctx.fact('plumbing.condensateDrainTo', (need) => need('dryer.condensateDrainTo', dryer?.condensateDrainTo));
  // A hose led nowhere fails on that alone; its reach is asked only where it goes to a receptor.
  ctx.fact('plumbing.condensateDrainReachable', (need) =>
    dryer?.condensateDrainTo === 'none' ? false : need('dryer.condensateDrainReachable', dryer?.condensateDrainReachable),
  );
}
