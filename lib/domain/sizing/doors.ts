import { hingesRequired } from '@/lib/domain/facts';
import type { RuleSetParameters } from '@/lib/domain/params';
import type { UnitSystem } from '@/lib/domain/units';
import { roundDownToMeasure } from '@/lib/domain/sizing/rounding';

export interface DoorLeafInput {
  /** Clear opening the leaves cover, canonical inches. */
  openingWidthIn: number;
  leaves: number;
  /** Gap between two neighbouring leaves. */
  revealBetweenIn: number;
  /** Gap at each outer edge of the opening. */
  revealEdgeIn: number;
  /** Height of each leaf. */
  leafHeightIn: number;
  units: UnitSystem;
}

export interface ProposedLeaf {
  widthIn: number;
  heightIn: number;
  /** Hinge cup centres measured from the bottom of the leaf, in rising order. */
  hingesIn: number[];
}

export type DoorLeafProposal = { ok: true; leafWidthIn: number; leaves: ProposedLeaf[] } | { ok: false; reason: string };

export const MAX_PROPOSED_LEAVES = 8;

/**
 * Hinge positions for a leaf of this height: the count from the hinge makers' chart in the rule set, the end
 * hinges in the middle of the makers' edge window, the rest evenly between them.
 */
export function proposeHinges(heightIn: number, params: RuleSetParameters): number[] | null {
  const count = hingesRequired(heightIn, params);
  const edge = (params.doors.hingeEdgeMinIn + params.doors.hingeEdgeMaxIn) / 2;
  if (count < 2 || heightIn <= 2 * edge) return null;
  const span = heightIn - 2 * edge;
  return Array.from({ length: count }, (_, i) => edge + (span * i) / (count - 1));
}

/**
 * Equal leaves for an opening: what the reveals leave, shared out, each leaf rounded down to a size that can be
 * measured so the reveals never shrink; hinges by each leaf's height.
 */
export function proposeDoorLeaves(input: DoorLeafInput, params: RuleSetParameters): DoorLeafProposal {
  const { openingWidthIn, leaves, revealBetweenIn, revealEdgeIn, leafHeightIn, units } = input;
  if (!Number.isInteger(leaves) || leaves < 1 || leaves > MAX_PROPOSED_LEAVES) return { ok: false, reason: `Choose 1 to ${MAX_PROPOSED_LEAVES} leaves.` };
  if (!(openingWidthIn > 0)) return { ok: false, reason: 'The opening width is not known yet.' };
  if (!(leafHeightIn > 0)) return { ok: false, reason: 'The leaf height is not known yet.' };
  if (revealBetweenIn < 0 || revealEdgeIn < 0) return { ok: false, reason: 'Reveals cannot be negative.' };
  const free = openingWidthIn - 2 * revealEdgeIn - (leaves - 1) * revealBetweenIn;
  const leafWidthIn = roundDownToMeasure(free / leaves, units);
  if (!(leafWidthIn > 0)) return { ok: false, reason: 'The reveals take the whole opening.' };
  const hinges = proposeHinges(leafHeightIn, params);
  if (!hinges) return { ok: false, reason: 'The leaf is too short for hinges at the makers’ edge distances.' };
  const rounded = hinges.map((h) => Math.round(h * 1e6) / 1e6);
  return { ok: true, leafWidthIn, leaves: Array.from({ length: leaves }, () => ({ widthIn: leafWidthIn, heightIn: leafHeightIn, hingesIn: rounded })) };
}
