import { z } from 'zod';
import { labelForPath, parseArea, parseLength, type UnitSystem } from '@/lib/domain/units';

export const unitSystemSchema = z
  .enum(['imperial', 'metric'])
  .describe('How bare numbers are read: inches and sq in (imperial) or millimetres and cm² (metric).');

export const spaceKinds = [
  'laundry-room',
  'reach-in-closet',
  'walk-in-closet',
  'hall-closet',
  'storage-closet',
  'cabinet',
  'alcove',
  'kitchen',
  'bathroom',
  'bedroom',
  'garage',
  'basement',
  'utility-room',
] as const;
export const adjoiningRooms = [
  'hallway',
  'bedroom',
  'bathroom',
  'toilet-room',
  'storage-closet',
  'kitchen',
  'living-area',
  'laundry-room',
  'garage',
  'basement',
  'outdoors',
  'other',
] as const;
export const fittingKinds = ['mitered', 'smooth-6in', 'smooth-8in', 'smooth-10in', 'other'] as const;
export type FittingKind = (typeof fittingKinds)[number];
export const ductMaterials = ['rigid-metal', 'semi-rigid-metal', 'flexible-foil', 'flexible-vinyl', 'other'] as const;
export const drainDestinations = ['indirect-waste', 'floor-drain', 'standpipe', 'none'] as const;
export const doorKinds = ['hinged', 'bifold', 'sliding'] as const;

type FieldFactory = (description: string) => z.ZodType;

/*
 * Size limits of a plan. A laundry closet has a handful of each; the limits are generous for any real
 * enclosure and keep one request from costing the server more than it can afford to check, draw and
 * render (common practice, no published source). Forms, tests and the JSON Schema use these same numbers.
 */
/** Enclosure doors (a pair of bifolds is four leaves). */
export const MAX_DOORS = 8;
/** Hinge positions on one door; hinge makers' charts ask for 2 to 5 on a full-height door. */
export const MAX_HINGES_PER_DOOR = 12;
/** Straight sections and elbows in the exhaust route. */
export const MAX_EXHAUST_RUN_PIECES = 60;
/** Make-up air openings in the enclosure or its doors. */
export const MAX_MAKEUP_AIR_OPENINGS = 12;
/** Receptacle outlets serving the appliances. */
export const MAX_RECEPTACLES = 8;
/** Characters in a length or an area written as text ("2 ft 6-1/2 in" is 13). */
export const MAX_MEASURE_TEXT_LENGTH = 40;

/** The bounded lists of a plan; `*` stands for any index. One table for the schema, stored-plan checks and the editor. */
export const PLAN_LIST_LIMITS = [
  { path: 'doors', max: MAX_DOORS, noun: 'doors' },
  { path: 'doors.*.hinges', max: MAX_HINGES_PER_DOOR, noun: 'hinge positions on a door' },
  { path: 'exhaust.run', max: MAX_EXHAUST_RUN_PIECES, noun: 'pieces in the exhaust route' },
  { path: 'makeupAir.openings', max: MAX_MAKEUP_AIR_OPENINGS, noun: 'make-up air openings' },
  { path: 'electrical.receptacles', max: MAX_RECEPTACLES, noun: 'receptacles' },
] as const;

export type PlanListPath = (typeof PLAN_LIST_LIMITS)[number]['path'];

/** The message for a list over its limit, without the field label (the parser adds it). */
export function listLimitMessage(path: PlanListPath, count: number): string {
  const limit = PLAN_LIST_LIMITS.find((l) => l.path === path)!;
  return `at most ${limit.max} ${limit.noun}; this plan has ${count.toLocaleString('en-US')}.`;
}

export function textLimitMessage(length: number): string {
  return `at most ${MAX_MEASURE_TEXT_LENGTH} characters; this has ${length.toLocaleString('en-US')}.`;
}

/** A measure written as text, capped so a huge string never reaches the unit parser. */
function measureText(bounded: boolean) {
  return bounded
    ? z.string().max(MAX_MEASURE_TEXT_LENGTH, { error: (issue) => textLimitMessage((issue.input as string).length) })
    : z.string();
}

/**
 * One builder yields both the raw input schema (lengths as number | string, no transforms, so
 * `z.toJSONSchema` and zodResolver can use it) and the converting schemas that turn every length
 * and area into canonical inches / square inches for a given unit system.
 */
function buildPlanSchema(length: FieldFactory, area: FieldFactory, bounded: boolean) {
  const bool = (d: string) => z.boolean().describe(d);
  // Stored plans are read without the limits (bounded = false), so a revision saved before them still opens.
  const list = <T extends z.ZodType>(item: T, path: PlanListPath) => {
    const plain = z.array(item);
    if (!bounded) return plain;
    const max = PLAN_LIST_LIMITS.find((l) => l.path === path)!.max;
    return plain.max(max, { error: (issue) => listLimitMessage(path, (issue.input as unknown[]).length) });
  };
  const opt = <T extends z.ZodType>(schema: T) => schema.optional();
  const nullish = <T extends z.ZodType>(schema: T) => schema.nullish().describe(schema.description ?? '');

  const clearances = z
    .object({
      side: opt(length('Clearance the maker asks for at each side of the unit.')),
      top: opt(length('Clearance the maker asks for above the unit.')),
      rear: opt(length('Clearance the maker asks for behind the unit (vent, hoses, cord).')),
      front: opt(length('Clearance the maker asks for in front of the unit, to the closed enclosure doors.')),
    })
    .strict()
    .describe("The maker's closet-installation clearances for this unit, from its installation instructions.");

  const applianceFields = {
    width: opt(length('Cabinet width of the unit.')),
    depth: opt(length('Cabinet depth of the unit, excluding knobs and the door.')),
    height: opt(length('Height of the unit as installed (including any pedestal).')),
    frontProjection: opt(length('How far knobs, the door and its handle stand out in front of the cabinet.')),
    clearances: opt(clearances),
  };

  const washer = z.object(applianceFields).strict().describe('The clothes washer.');

  const dryer = z
    .object({
      ...applianceFields,
      fuel: opt(z.enum(['electric', 'gas']).describe('Fuel of the dryer.')),
      exhaustCfm: opt(z.number().nonnegative().describe('Exhaust flow rate of the dryer, cubic feet per minute.')),
      maxDuctLength: nullish(
        length("The maker's maximum exhaust duct length for this model, when its instructions give one."),
      ),
      closetVent: nullish(
        z
          .object({
            top: opt(area('Net free area the maker asks for in openings at the top of the closet door.')),
            bottom: opt(area('Net free area the maker asks for in openings at the bottom of the closet door.')),
          })
          .strict()
          .describe("The maker's closet ventilation figures, from its installation instructions."),
      ),
    })
    .strict()
    .describe('The clothes dryer.');

  const runItem = z
    .object({
      straight: opt(length('Length of a straight section of rigid duct.')),
      elbow: opt(z.union([z.literal(45), z.literal(90)]).describe('Elbow angle in degrees.')),
      fitting: opt(
        z
          .enum(fittingKinds)
          .describe(
            'Elbow kind: mitered (4-in radius), smooth with a 6, 8 or 10-in radius, or other (counted as mitered).',
          ),
      ),
    })
    .strict()
    .describe('One piece of the exhaust route, in order from the dryer: a straight section or an elbow.');

  const exhaust = z
    .object({
      material: opt(z.enum(ductMaterials).describe('Material of the exhaust duct (not the transition duct).')),
      diameter: opt(length('Nominal diameter of the exhaust duct.')),
      thickness: opt(length('Wall thickness of the exhaust duct.')),
      transition: opt(
        z
          .object({
            length: opt(length('Length of the transition duct between the dryer and the exhaust duct.')),
            listed: opt(bool('The transition duct is listed and labeled for dryer transition use.')),
            concealed: opt(bool('The transition duct passes through or is hidden in a wall, floor or ceiling.')),
          })
          .strict()
          .describe('The flexible transition duct from the dryer outlet to the exhaust duct.'),
      ),
      run: opt(list(runItem, 'exhaust.run').describe('The exhaust route from the transition connection to the terminal.')),
      concealed: opt(bool('Part of the exhaust duct is concealed in a wall or ceiling cavity.')),
      cavityDepth: opt(length('Depth of the wall or ceiling cavity the duct runs in (e.g. 5-1/2 in for 2x6 studs).')),
      lengthLabel: opt(bool('A permanent label giving the concealed duct length is within 6 ft of the connection.')),
      fastenersIntoAirstream: opt(bool('Screws or other fasteners pass through the duct wall into the airstream.')),
      fastenerProtrusion: opt(length('How far the longest fastener stands into the duct.')),
      termination: opt(
        z
          .object({
            clearanceToOpenings: opt(length('Distance from the terminal to the nearest door, window or other opening.')),
            backdraftDamper: opt(bool('The terminal has a backdraft damper.')),
            screen: opt(bool('The terminal has a screen over its opening.')),
          })
          .strict()
          .describe('The exhaust terminal outdoors.'),
      ),
      boosterFan: nullish(
        z
          .object({
            kind: opt(
              z
                .enum(['power-ventilator', 'booster'])
                .describe('A dryer exhaust duct power ventilator, or a general booster fan.'),
            ),
            listed: opt(bool('The fan is listed for dryer exhaust use.')),
            maxDuctLength: opt(length('Maximum duct length the fan maker allows.')),
          })
          .strict()
          .describe('A fan added to the exhaust duct, if any.'),
      ),
    })
    .strict()
    .describe('The dryer exhaust system.');

  const makeupAir = z
    .object({
      openings: opt(
        list(
          z
            .object({
              position: opt(z.enum(['top', 'bottom', 'side', 'other']).describe('Where the opening is.')),
              netFreeArea: opt(area('Net free area of the opening (louvres and grilles deducted).')),
            })
            .strict()
            .describe('An opening in the closet enclosure or its doors.'),
          'makeupAir.openings',
        ).describe('Openings that let air into the closet; gaps around doors do not count.'),
      ),
      providedCfm: opt(z.number().nonnegative().describe('Make-up air supplied by other means, cubic feet per minute.')),
    })
    .strict()
    .describe('Make-up air for the dryer.');

  const receptacle = z
    .object({
      serves: opt(z.enum(['washer', 'dryer', 'both']).describe('The appliance(s) this receptacle serves.')),
      volts: opt(z.number().positive().describe('Nominal voltage of the receptacle.')),
      amps: opt(z.number().positive().describe('Rating of the receptacle and its circuit, amperes.')),
      wires: opt(z.union([z.literal(3), z.literal(4)]).describe('Conductors to a dryer receptacle, 3 or 4 wire.')),
      gfci: opt(bool('Ground-fault circuit-interrupter protection is provided.')),
      afci: opt(bool('Arc-fault circuit-interrupter protection is provided.')),
      distanceToAppliance: opt(length("Distance from the receptacle to the appliance's intended location.")),
      reachableInstalled: opt(bool('The plug can be reached without moving the appliance.')),
      existingCircuit: opt(bool('The receptacle is on an existing circuit, not new work.')),
    })
    .strict()
    .describe('A receptacle outlet for the laundry appliances.');

  const electrical = z
    .object({
      laundryCircuit: opt(
        z
          .object({
            amps: opt(z.number().positive().describe('Rating of the laundry branch circuit, amperes.')),
            dedicated: opt(bool('The laundry circuit has no outlets outside the laundry area.')),
          })
          .strict()
          .describe('The laundry branch circuit.'),
      ),
      receptacles: opt(list(receptacle, 'electrical.receptacles').describe('Receptacle outlets serving the appliances.')),
    })
    .strict()
    .describe('Electrical supply.');

  const plumbing = z
    .object({
      standpipeHeight: opt(length('Height of the standpipe above its trap weir.')),
      trapSize: opt(length('Nominal size of the washer trap.')),
      drainPan: nullish(
        z
          .object({
            present: opt(bool('A drain pan is installed under the washer.')),
            drainsTo: opt(z.enum(drainDestinations).describe('Where the pan drain discharges.')),
          })
          .strict()
          .describe('A pan under the washer.'),
      ),
      valvesAccessible: opt(bool('The supply valves can be reached with the appliances installed.')),
      hammerArrestors: opt(bool('Water-hammer arrestors are installed at the washer supply.')),
      leakShutoff: opt(bool('An automatic leak detector with shut-off valve is installed.')),
    })
    .strict()
    .describe('Water supply and drain.');

  const gas = z
    .object({
      shutoffDistance: opt(length('Distance from the gas shut-off valve to the dryer.')),
      shutoffSameRoom: opt(bool('The shut-off valve is in the same room as the dryer.')),
      connectorLength: opt(length('Length of the appliance connector to the dryer.')),
    })
    .strict()
    .describe('Gas supply to a gas dryer.');

  const door = z
    .object({
      kind: opt(z.enum(doorKinds).describe('How the door opens.')),
      width: opt(length('Width of the door leaf.')),
      height: opt(length('Height of the door leaf.')),
      thickness: opt(length('Thickness of the door leaf.')),
      hinges: opt(
        list(length('Distance of a hinge cup centre from the bottom edge of the door.'), 'doors.*.hinges').describe('Hinge positions, each measured from the bottom edge of the door.'),
      ),
    })
    .strict()
    .describe('An enclosure door.');

  return z
    .object({
      units: unitSystemSchema,
      space: opt(
        z
          .object({
            kind: opt(z.enum(spaceKinds).describe('The kind of space the appliances stand in.')),
            opensInto: opt(z.enum(adjoiningRooms).describe('The room the space opens into.')),
            overFinishedSpace: opt(bool('There is finished living space below the appliances.')),
          })
          .strict()
          .describe('Where the appliances are installed.'),
      ),
      arrangement: opt(z.enum(['side-by-side', 'stacked']).describe('Washer and dryer side by side or stacked.')),
      enclosure: opt(
        z
          .object({
            width: opt(length('Width of the enclosure.')),
            depth: opt(length('Depth of the enclosure.')),
            height: opt(length('Height of the enclosure.')),
            depthMeasured: opt(
              z
                .enum(['outside', 'inside'])
                .describe('Whether width, depth and height are outside sizes (panels included) or inside clear sizes.'),
            ),
            panelThickness: opt(length('Thickness of the side, top and back panels.')),
            openingWidth: opt(length('Clear width of the front opening, if a face frame narrows it.')),
            toeKick: nullish(
              z
                .object({
                  height: opt(length('Height of the toe kick the appliances pass over.')),
                  removable: opt(bool('The toe kick comes off without tools damaging the finish.')),
                })
                .strict()
                .describe('A toe kick or sill across the bottom of the opening.'),
            ),
          })
          .strict()
          .describe('The closet or cabinet enclosure.'),
      ),
      washer: opt(washer),
      dryer: opt(dryer),
      exhaust: opt(exhaust),
      makeupAir: opt(makeupAir),
      electrical: opt(electrical),
      plumbing: opt(plumbing),
      gas: nullish(gas),
      doors: opt(list(door, 'doors').describe('The enclosure doors.')),
    })
    .strict()
    .describe('An installer’s plan of a washer and dryer in a closet or cabinet enclosure.');
}

const rawLength: FieldFactory = (description) =>
  z
    .union([z.number(), measureText(true)])
    .describe(`${description} A number in the plan's units, or text with units such as 30 in, 2' 6", 762 mm.`);
const rawArea: FieldFactory = (description) =>
  z
    .union([z.number(), measureText(true)])
    .describe(`${description} A number in the plan's units, or text with units such as 60 sq in, 387 cm².`);

/** The raw input schema: the API body, the form (zodResolver) and `GET /api/schema/plan`. */
export const planInputSchema = buildPlanSchema(rawLength, rawArea, true);
export type PlanInput = z.input<typeof planInputSchema>;

/** Marks issues raised while converting units, so messages can name the field. */
export const UNIT_ISSUE = 'nookpass-unit';

function convertingLength(units: UnitSystem, bounded: boolean): FieldFactory {
  return (description) =>
    z
      .union([z.number(), measureText(bounded)])
      .transform((value, ctx) => {
        const parsed = parseLength(value, units, '');
        if (parsed.ok) return parsed.value;
        ctx.issues.push({ code: 'custom', message: parsed.error.message, input: value, params: { [UNIT_ISSUE]: 'length' } });
        return z.NEVER;
      })
      .describe(description);
}

function convertingArea(units: UnitSystem, bounded: boolean): FieldFactory {
  return (description) =>
    z
      .union([z.number(), measureText(bounded)])
      .transform((value, ctx) => {
        const parsed = parseArea(value, units, '');
        if (parsed.ok) return parsed.value;
        ctx.issues.push({ code: 'custom', message: parsed.error.message, input: value, params: { [UNIT_ISSUE]: 'area' } });
        return z.NEVER;
      })
      .describe(description);
}

function canonicalSchema(units: UnitSystem, bounded: boolean) {
  return buildPlanSchema(convertingLength(units, bounded), convertingArea(units, bounded), bounded).superRefine((plan, ctx) => {
    const p = plan as unknown as Plan;
    // A list already refused for its size is not checked item by item: one error, not thousands.
    const over = (items: unknown[] | undefined, max: number) => bounded && (items?.length ?? 0) > max;
    if (over(p.doors, MAX_DOORS)) return;
    p.doors?.forEach((door, doorIndex) => {
      if (over(door.hinges, MAX_HINGES_PER_DOOR)) return;
      door.hinges?.forEach((position, hingeIndex) => {
        if (door.height !== undefined && (position <= 0 || position >= door.height)) {
          ctx.addIssue({
            code: 'custom',
            path: ['doors', doorIndex, 'hinges', hingeIndex],
            message: `Door ${doorIndex + 1} hinge ${hingeIndex + 1}: the position must lie within the door height (measured from the bottom edge).`,
          });
        }
      });
    });
    if (over(p.exhaust?.run, MAX_EXHAUST_RUN_PIECES)) return;
    p.exhaust?.run?.forEach((item, index) => {
      const isStraight = item.straight !== undefined;
      const isElbow = item.elbow !== undefined || item.fitting !== undefined;
      if (isStraight === isElbow) {
        ctx.addIssue({
          code: 'custom',
          path: ['exhaust', 'run', index],
          message: `Exhaust run item ${index + 1}: give either a straight length or an elbow (45 or 90) with its fitting kind, not both or neither.`,
        });
      } else if (isElbow && item.elbow === undefined) {
        ctx.addIssue({
          code: 'custom',
          path: ['exhaust', 'run', index, 'elbow'],
          message: `Exhaust run item ${index + 1}: give the elbow angle, 45 or 90.`,
        });
      }
    });
  });
}

type Enum<T extends readonly string[]> = T[number];

/** Canonical plan types: every length is a number of inches, every area square inches. */
export interface ApplianceClearances {
  side?: number;
  top?: number;
  rear?: number;
  front?: number;
}

export interface Appliance {
  width?: number;
  depth?: number;
  height?: number;
  frontProjection?: number;
  clearances?: ApplianceClearances;
}

export interface Dryer extends Appliance {
  fuel?: 'electric' | 'gas';
  exhaustCfm?: number;
  maxDuctLength?: number | null;
  closetVent?: { top?: number; bottom?: number } | null;
}

export interface RunItem {
  straight?: number;
  elbow?: 45 | 90;
  fitting?: FittingKind;
}

export interface Exhaust {
  material?: Enum<typeof ductMaterials>;
  diameter?: number;
  thickness?: number;
  transition?: { length?: number; listed?: boolean; concealed?: boolean };
  run?: RunItem[];
  concealed?: boolean;
  cavityDepth?: number;
  lengthLabel?: boolean;
  fastenersIntoAirstream?: boolean;
  fastenerProtrusion?: number;
  termination?: { clearanceToOpenings?: number; backdraftDamper?: boolean; screen?: boolean };
  boosterFan?: { kind?: 'power-ventilator' | 'booster'; listed?: boolean; maxDuctLength?: number } | null;
}

export interface Receptacle {
  serves?: 'washer' | 'dryer' | 'both';
  volts?: number;
  amps?: number;
  wires?: 3 | 4;
  gfci?: boolean;
  afci?: boolean;
  distanceToAppliance?: number;
  reachableInstalled?: boolean;
  existingCircuit?: boolean;
}

export interface Door {
  kind?: Enum<typeof doorKinds>;
  width?: number;
  height?: number;
  thickness?: number;
  hinges?: number[];
}

export interface Plan {
  units: UnitSystem;
  space?: { kind?: Enum<typeof spaceKinds>; opensInto?: Enum<typeof adjoiningRooms>; overFinishedSpace?: boolean };
  arrangement?: 'side-by-side' | 'stacked';
  enclosure?: {
    width?: number;
    depth?: number;
    height?: number;
    depthMeasured?: 'outside' | 'inside';
    panelThickness?: number;
    openingWidth?: number;
    toeKick?: { height?: number; removable?: boolean } | null;
  };
  washer?: Appliance;
  dryer?: Dryer;
  exhaust?: Exhaust;
  makeupAir?: {
    openings?: Array<{ position?: 'top' | 'bottom' | 'side' | 'other'; netFreeArea?: number }>;
    providedCfm?: number;
  };
  electrical?: { laundryCircuit?: { amps?: number; dedicated?: boolean }; receptacles?: Receptacle[] };
  plumbing?: {
    standpipeHeight?: number;
    trapSize?: number;
    drainPan?: { present?: boolean; drainsTo?: Enum<typeof drainDestinations> } | null;
    valvesAccessible?: boolean;
    hammerArrestors?: boolean;
    leakShutoff?: boolean;
  };
  gas?: { shutoffDistance?: number; shutoffSameRoom?: boolean; connectorLength?: number } | null;
  doors?: Door[];
}


const canonicalSchemas: Record<UnitSystem, ReturnType<typeof canonicalSchema>> = {
  imperial: canonicalSchema('imperial', true),
  metric: canonicalSchema('metric', true),
};
const storedSchemas: Record<UnitSystem, ReturnType<typeof canonicalSchema>> = {
  imperial: canonicalSchema('imperial', false),
  metric: canonicalSchema('metric', false),
};

/** The converting schema for new input, with every size limit. */
export function canonicalPlanSchema(units: UnitSystem) {
  return canonicalSchemas[units];
}

/** The converting schema for plans already stored: the same fields and checks, without the size limits. */
export function storedPlanSchema(units: UnitSystem) {
  return storedSchemas[units];
}

export { labelForPath };
