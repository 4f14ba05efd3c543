import { mmToInches } from '@/lib/domain/units';

import { CUP_DIAMETER_MM, DOOR_DETAIL_DEFAULTS } from '@/lib/domain/facts/door-details';

export { CUP_BORING_RANGE_MM, CUP_DIAMETER_MM, DOOR_DETAIL_DEFAULTS } from '@/lib/domain/facts/door-details';

/**
 * Boring distance, door edge to the rim of the cup hole, where a door does not give its own. Makers allow
 * 3–8 mm (TRADE.md, hinge makers' literature); 5 mm is the usual middle setting for a full-overlay door.
 * Common practice, no published source for the choice.
 */
export const CUP_BORING_DISTANCE_MM = DOOR_DETAIL_DEFAULTS.cupBoringDistanceMm.value;

/**
 * Mounting-plate centre line, set back from the front edge of the side panel. Common practice,
 * no published source: 37 mm is where the cabinet trade puts the front row of plate holes for
 * 35 mm cup hinges on full-overlay doors of 16–22 mm, boring distance 3–6 mm, with a 0 mm plate;
 * the overlay is then set by the plate height and the hinge's own adjustment, not by moving this
 * line. Thicker doors, inset doors or other boring distances need the hinge maker's chart.
 */
export const PLATE_SETBACK_MM = 37;

/** Two-hole mounting plates: screw holes 32 mm apart, centred on the hinge line. Common practice, no published source. */
export const PLATE_HOLE_SPACING_MM = 32;

/** Thickest door the setback above is meant for (22 mm, about 7/8 in). Common practice, no published source. */
export const PLATE_SETBACK_MAX_DOOR_MM = 22;

/** Length of the printed scale check bar. */
export const SCALE_CHECK_MM = 100;

/**
 * The full-size template sheet: 7 in × 9-1/2 in (177.8 × 241.3 mm) fits both US Letter and
 * ISO A4 with half-inch margins (ISO 216: A4 is 210 × 297 mm).
 */
export const TEMPLATE_SHEET_IN = { width: 7, height: 9.5 } as const;

export const cupRadiusIn = mmToInches(CUP_DIAMETER_MM / 2);
export const plateSetbackIn = mmToInches(PLATE_SETBACK_MM);
export const plateHoleSpacingIn = mmToInches(PLATE_HOLE_SPACING_MM);
