import type { Door } from '@/lib/domain/plan';
import { inchesToMm, mmToInches } from '@/lib/domain/units';

/*
 * The details of one enclosure door the layout needs: which edge it hinges on, whether it overlays the panel
 * edges or closes inside the opening, the gap under it and the hinge cup's boring distance. A plan that leaves
 * one blank gets the default below, and the drawings say which values were assumed and where they come from.
 */

/** Cup of a concealed hinge: 35 mm across (hinge makers' literature; TRADE.md, V). */
export const CUP_DIAMETER_MM = 35;

/** Hinge makers allow a boring distance of 3–8 mm (hinge makers' literature; TRADE.md "concealed hinges"). */
export const CUP_BORING_RANGE_MM = { min: 3, max: 8 } as const;

/**
 * What a blank detail is taken to be, each with its source. The boring distance: 5 mm, the usual middle
 * setting for a full-overlay door (common practice, no published source). Overlay, no gap and the hinge side
 * from the door's place in the opening are the layout's own assumptions, stated on the drawings.
 */
export const DOOR_DETAIL_DEFAULTS = {
  cupBoringDistanceMm: { value: 5, source: 'common practice, no published source; hinge makers allow 3–8 mm' },
  mounting: { value: 'overlay', source: 'assumed: the plan does not say' },
  gapBelowIn: { value: 0, source: 'assumed: the door comes down to the floor or the toe kick' },
} as const;

export type HingeSide = 'left' | 'right';
export type Mounting = 'overlay' | 'inset';

export interface DoorDetails {
  hingeSide: HingeSide;
  hingeSideAssumed: boolean;
  mounting: Mounting;
  mountingAssumed: boolean;
  gapBelowIn: number;
  gapBelowAssumed: boolean;
  cupBoringDistanceIn: number;
  cupBoringAssumed: boolean;
  /** Door edge to the cup centre: boring distance plus half the 35 mm cup. */
  cupCentreFromEdgeIn: number;
  /** A boring distance outside the makers' 3–8 mm. */
  boringOutsideRange: boolean;
}

/**
 * The details of a door, the plan's where it gives them. `placedHingeSide` is the side the layout would
 * assume from where the door stands in the opening (a pair hinges on its outer edges, a single door on the left).
 */
export function doorDetails(door: Door, placedHingeSide: HingeSide = 'left'): DoorDetails {
  const boringIn = door.cupBoringDistance ?? mmToInches(DOOR_DETAIL_DEFAULTS.cupBoringDistanceMm.value);
  const boringMm = inchesToMm(boringIn);
  return {
    hingeSide: door.hingeSide ?? placedHingeSide,
    hingeSideAssumed: door.hingeSide === undefined,
    mounting: door.mounting ?? DOOR_DETAIL_DEFAULTS.mounting.value,
    mountingAssumed: door.mounting === undefined,
    gapBelowIn: door.gapBelow ?? DOOR_DETAIL_DEFAULTS.gapBelowIn.value,
    gapBelowAssumed: door.gapBelow === undefined,
    cupBoringDistanceIn: boringIn,
    cupBoringAssumed: door.cupBoringDistance === undefined,
    cupCentreFromEdgeIn: boringIn + mmToInches(CUP_DIAMETER_MM / 2),
    boringOutsideRange: boringMm < CUP_BORING_RANGE_MM.min - 1e-9 || boringMm > CUP_BORING_RANGE_MM.max + 1e-9,
  };
}

/**
 * How far an inset door's back face stands inside a depth measured to the panels' front edges: its own
 * thickness (an overlay door closes in front of the panels). The thickest inset hinged or bifold door counts.
 */
export function insetDepthIn(doors: readonly Door[] | undefined, thicknessOf: (door: Door, index: number) => number): number {
  return (doors ?? []).reduce((max, door, index) => ((door.kind ?? 'hinged') !== 'sliding' && door.mounting === 'inset' ? Math.max(max, thicknessOf(door, index)) : max), 0);
}
