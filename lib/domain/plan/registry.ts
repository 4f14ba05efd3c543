/*
 * The plan's field registry: every field of a plan is declared here once. The zod schemas (input,
 * canonical, stored), the TypeScript types, the JSON Schema, the labels in messages and the editor's
 * sections are all derived from it (schema.ts, labels.ts, editor.ts).
 *
 * Each entry gives its kind, the editor's label, its help text (the JSON Schema description), and where it
 * applies its unit, choices, list limit and what "none" means. Messages name a field by its label (or its
 * `term`), qualified by its section where the label alone is ambiguous (labels.ts).
 */

/** Editor sections, in the order the editor shows them. */
export const planSections = [
  { id: 'space', title: 'Space', intro: 'Where the washer and dryer stand. Closets off bedrooms and storage closets restrict gas dryers.' },
  { id: 'enclosure', title: 'Enclosure' },
  { id: 'washer', title: 'Washer' },
  { id: 'dryer', title: 'Dryer' },
  {
    id: 'exhaust',
    title: 'Dryer exhaust',
    intro: 'Rigid metal duct from the transition connection to the terminal outdoors. Lint is a fire risk: keep the run short and smooth.',
  },
  { id: 'makeup-air', title: 'Make-up air', intro: 'Openings in the enclosure or its doors. Gaps around doors do not count.' },
  { id: 'electrical', title: 'Electrical', intro: 'Shock hazard: circuits and receptacles are work for a licensed electrician.' },
  { id: 'plumbing', title: 'Plumbing', intro: 'A leaking washer can damage the structure below.' },
  { id: 'gas', title: 'Gas', intro: 'Carbon monoxide and fire hazard: gas piping and connections are work for a licensed gas fitter.' },
  { id: 'doors', title: 'Doors and hinges' },
] as const;

export type PlanSectionId = (typeof planSections)[number]['id'];

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

/**
 * An explicit "none" answer. `null`: the plan stores null (the thing is not there). `empty`: a list
 * stored empty. The editor offers it as `word` typed into the field, as a presence question (`ask`),
 * as an extra choice of one of the group's fields (`choiceOf`), or follows another field (`follows`).
 */
export interface NoneAnswer {
  answer: 'null' | 'empty';
  meaning: string;
  word?: string;
  ask?: string;
  choiceOf?: string;
  follows?: { path: string; present: string; absent: string };
}

/** A value a condition compares a plan field with. */
export type AppliesValue = string | number | boolean;

/**
 * When a field (or a whole group or list) applies to a plan: a condition over other fields of the plan, as
 * entered. `equals`/`in` hold only when the field has one of the values; `notIn` also holds while the field is
 * blank (use it for a default: `{ path: 'dryer.type', notIn: ['condensing'] }` reads "vented unless told
 * otherwise"). A `*` in a path stands for the same list item as the field's own (`electrical.receptacles.*.serves`).
 */
export type Applies =
  | { path: string; equals: AppliesValue }
  | { path: string; in: readonly AppliesValue[] }
  | { path: string; notIn: readonly AppliesValue[] }
  | { all: readonly Applies[] }
  | { any: readonly Applies[] };

interface Entry {
  /** Shown in the editor only while this holds; its own and its ancestors' conditions must all hold. */
  applies?: Applies;
  /** The editor's label (short: the section names the context). */
  label?: string;
  /** Help text: the JSON Schema description and the API documentation. */
  help: string;
  /** A short hint under the field in the editor. */
  hint?: string;
  /** The field's name in messages, when its label does not read well there (messages otherwise use the label). */
  term?: string;
  none?: NoneAnswer;
  /** Top-level entries: the editor section they are shown in. */
  section?: PlanSectionId;
  required?: boolean;
}

export interface LengthField extends Entry {
  kind: 'length';
  /** Sheet-metal thin: shown in thousandths of an inch or tenths of a millimetre, never rounded to 1/16 in. */
  thin?: boolean;
}
export interface AreaField extends Entry { kind: 'area' }
export interface NumberField extends Entry {
  kind: 'number';
  unit: 'cfm' | 'A' | 'V';
  min: 'nonnegative' | 'positive';
  /** A typical value, offered in the message when something else was typed. */
  example: number;
}
export interface BooleanField extends Entry { kind: 'boolean' }
export interface TextField extends Entry {
  kind: 'text';
  maxLength: number;
  format?: 'uuid';
  /** How the editor shows it: kept out of sight, or shown without being typed into (another control sets it). */
  editor?: 'hidden' | 'read-only';
}
export interface ChoiceField extends Entry {
  kind: 'choice';
  choices: readonly (string | number)[];
  choiceLabels?: Readonly<Record<string, string>>;
}
export interface GroupEntry extends Entry {
  kind: 'group';
  fields: Readonly<Record<string, PlanEntry>>;
}
export interface ListEntry extends Entry {
  kind: 'list';
  item: PlanEntry;
  max: number;
  /** The list's items in a limit message ("at most 8 doors"). */
  noun: string;
  /** One item in the editor ("Door 2"). */
  itemLabel?: string;
  /** One item in messages, when `itemLabel` alone does not say what it is ("Exhaust piece 3", "Door 1, hinge 2"). */
  itemTerm?: string;
  /** A new item's form values in the editor. */
  newItem?: Readonly<Record<string, string>>;
  /** The editor shows this list with its own component. */
  bespoke?: 'exhaust-route-builder';
}

export type PlanEntry = LengthField | AreaField | NumberField | BooleanField | TextField | ChoiceField | GroupEntry | ListEntry;
export type PlanFieldKind = PlanEntry['kind'];

const words = (values: readonly string[]) => Object.fromEntries(values.map((v) => [v, v.replace(/-/g, ' ')]));

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
export const ductMaterials = ['rigid-metal', 'semi-rigid-metal', 'flexible-foil', 'flexible-vinyl', 'other'] as const;
export const drainDestinations = ['indirect-waste', 'floor-drain', 'standpipe', 'none'] as const;
export const doorKinds = ['hinged', 'bifold', 'sliding'] as const;
export const dryerTypes = ['vented', 'condensing', 'heat-pump'] as const;
export const condensateHandling = ['drain', 'reservoir'] as const;
export const condensateReceptors = ['standpipe', 'floor-drain', 'indirect-receptor', 'none'] as const;
export const terminationLocations = ['outdoors', 'attic', 'crawl-space', 'soffit', 'garage', 'other-indoor'] as const;
export const disconnectMeans = ['within-sight', 'lockable-breaker', 'none'] as const;
export const doorHingeSides = ['left', 'right'] as const;
export const doorMountings = ['overlay', 'inset'] as const;
const arrangements = ['side-by-side', 'stacked'] as const;
export const buildingTypes = ['dwelling', 'other'] as const;

/** Applies to a plan with a gas dryer. */
const gasDryer = { path: 'dryer.fuel', equals: 'gas' } as const;
/** Applies to a vented dryer: the default while the type is blank. */
const ventedDryer = { path: 'dryer.type', notIn: ['condensing', 'heat-pump'] } as const;
/** Applies to a listed condensing or heat-pump dryer. */
const ventlessDryer = { path: 'dryer.type', in: ['condensing', 'heat-pump'] } as const;
const condensateDrained = { all: [ventlessDryer, { path: 'dryer.condensate', equals: 'drain' }] } as const;
const ductConcealed = { path: 'exhaust.concealed', equals: true } as const;
const dryerOutlet = { path: 'electrical.receptacles.*.serves', equals: 'dryer' } as const;
/** A cord-and-plug entry: only a dryer's entry may be hard-wired. */
const notHardWired = {
  any: [
    { path: 'electrical.receptacles.*.serves', notIn: ['dryer'] },
    { path: 'electrical.receptacles.*.hardWired', notIn: [true] },
  ],
} as const;

const clearances = {
  kind: 'group',
  help: "The maker's closet-installation clearances for this unit, from its installation instructions.",
  fields: {
    side: { kind: 'length', label: 'Maker’s side clearance', help: 'Clearance the maker asks for at each side of the unit.' },
    top: { kind: 'length', label: 'Maker’s top clearance', help: 'Clearance the maker asks for above the unit.' },
    rear: {
      kind: 'length',
      label: 'Maker’s rear clearance',
      help: 'Clearance the maker asks for behind the unit (vent, hoses, cord).',
      hint: 'Vent elbow, hoses and cord live here.',
    },
    front: {
      kind: 'length',
      label: 'Maker’s front clearance',
      help: 'Clearance the maker asks for in front of the unit, to the closed enclosure doors.',
      hint: 'To the closed enclosure doors.',
    },
  },
} as const;

/**
 * The appliance-library model a unit's figures were taken from, as it was when picked: its id and its label
 * at that time. The plan keeps its own figures, so a model edited or deleted later leaves the plan as saved.
 */
const libraryModel = {
  kind: 'group',
  help: "The company's appliance-library model this unit's figures were filled from, with its label at the time.",
  none: { answer: 'null', meaning: 'Not filled from the appliance library.' },
  fields: {
    id: { kind: 'text', maxLength: 36, format: 'uuid', editor: 'hidden', label: 'Library model id', help: 'Id of the library model the figures came from.' },
    label: { kind: 'text', maxLength: 120, editor: 'read-only', label: 'Filled from library model', help: "The library model's label when it was picked." },
  },
} as const;

const applianceFields = {
  model: libraryModel,
  width: { kind: 'length', label: 'Width', help: 'Cabinet width of the unit.' },
  depth: {
    kind: 'length',
    label: 'Depth (cabinet)',
    help: 'Cabinet depth of the unit, excluding knobs and the door.',
    hint: 'Without knobs or the door.',
  },
  height: { kind: 'length', label: 'Height as installed', help: 'Height of the unit as installed (including any pedestal).' },
  frontProjection: {
    kind: 'length',
    label: 'Front projection',
    help: 'How far knobs, the door and its handle stand out in front of the cabinet.',
    hint: 'Knobs, door and handle in front of the cabinet.',
  },
  clearances,
} as const;

/** The plan, field by field. */
export const planRegistry = {
  kind: 'group',
  help: 'An installer’s plan of a washer and dryer in a closet or cabinet enclosure.',
  fields: {
    units: {
      kind: 'choice',
      section: 'space',
      required: true,
      label: 'Units for bare numbers',
      help: 'How bare numbers are read: inches and sq in (imperial) or millimetres and cm² (metric).',
      choices: ['imperial', 'metric'],
      choiceLabels: { imperial: 'imperial (inches, sq in)', metric: 'metric (mm, cm²)' },
    },
    space: {
      kind: 'group',
      section: 'space',
      help: 'Where the appliances are installed.',
      fields: {
        kind: { kind: 'choice', label: 'Kind of space', help: 'The kind of space the appliances stand in.', choices: spaceKinds, choiceLabels: words(spaceKinds) },
        opensInto: { kind: 'choice', label: 'Opens into', help: 'The room the space opens into.', choices: adjoiningRooms, choiceLabels: words(adjoiningRooms) },
        overFinishedSpace: { kind: 'boolean', label: 'Finished living space below', help: 'There is finished living space below the appliances.' },
        buildingType: {
          kind: 'choice',
          label: 'Building',
          term: 'building type',
          help: 'The kind of building: a one- or two-family dwelling or townhouse (the default), or any other building. It decides which adopted code the findings cite.',
          choices: buildingTypes,
          choiceLabels: { dwelling: 'one- or two-family dwelling or townhouse', other: 'other building' },
        },
        dedicatedToLaundry: {
          kind: 'boolean',
          label: 'Space used only for the appliances',
          help: 'The space holds the laundry appliances and is used for no other purpose (no clothes or other storage).',
          hint: 'A walk-in clothes closet is used for storage, so it never counts.',
          applies: gasDryer,
        },
        door: {
          kind: 'group',
          help: 'The door between the space and the room it opens into.',
          applies: gasDryer,
          fields: {
            solid: { kind: 'boolean', label: 'Solid door', help: 'The door is solid (no louvres or grilles).' },
            weatherStripped: { kind: 'boolean', label: 'Door weather-stripped', help: 'The door is weather-stripped all round.' },
            selfClosing: { kind: 'boolean', label: 'Door self-closing', help: 'The door has an approved self-closing device.' },
          },
        },
      },
    },
    arrangement: {
      kind: 'choice',
      section: 'space',
      label: 'Arrangement',
      help: 'Washer and dryer side by side or stacked.',
      choices: arrangements,
      choiceLabels: words(arrangements),
    },
    enclosure: {
      kind: 'group',
      section: 'enclosure',
      help: 'The closet or cabinet enclosure.',
      fields: {
        width: { kind: 'length', label: 'Width', help: 'Width of the enclosure.' },
        depth: { kind: 'length', label: 'Depth', help: 'Depth of the enclosure.' },
        height: { kind: 'length', label: 'Height', help: 'Height of the enclosure.' },
        depthMeasured: {
          kind: 'choice',
          label: 'Sizes measured',
          help: 'Whether width, depth and height are outside sizes (panels included) or inside clear sizes.',
          choices: ['outside', 'inside'],
          choiceLabels: { outside: 'outside (panels included)', inside: 'inside clear' },
        },
        panelThickness: { kind: 'length', label: 'Panel thickness', help: 'Thickness of the side, top and back panels.' },
        openingWidth: {
          kind: 'length',
          label: 'Clear opening width',
          help: 'Clear width of the front opening, if a face frame narrows it.',
          hint: 'Only if a face frame narrows the opening.',
        },
        toeKick: {
          kind: 'group',
          help: 'A toe kick or sill across the bottom of the opening.',
          none: { answer: 'null', meaning: 'No toe kick or sill across the opening.', ask: 'Toe kick or sill across the opening' },
          fields: {
            height: { kind: 'length', label: 'Toe kick height', help: 'Height of the toe kick the appliances pass over.' },
            removable: { kind: 'boolean', label: 'Toe kick removable', help: 'The toe kick comes off without tools damaging the finish.' },
          },
        },
      },
    },
    washer: { kind: 'group', section: 'washer', help: 'The clothes washer.', fields: applianceFields },
    dryer: {
      kind: 'group',
      section: 'dryer',
      help: 'The clothes dryer.',
      fields: {
        fuel: { kind: 'choice', label: 'Fuel', help: 'Fuel of the dryer.', choices: ['electric', 'gas'] },
        type: {
          kind: 'choice',
          label: 'Dryer type',
          help: 'Vented (exhausts outdoors, the default when not given), or a listed condensing or heat-pump dryer that needs no exhaust duct.',
          choices: dryerTypes,
          choiceLabels: { vented: 'vented (exhaust duct)', condensing: 'condensing (ventless)', 'heat-pump': 'heat pump (ventless)' },
        },
        condensate: {
          kind: 'choice',
          label: 'Condensate',
          help: 'How a ventless dryer gets rid of the water it condenses: a drain hose, or a reservoir emptied by hand, as its maker provides.',
          applies: ventlessDryer,
          choices: condensateHandling,
          choiceLabels: { drain: 'drain hose', reservoir: 'reservoir emptied by hand' },
        },
        condensateDrainTo: {
          kind: 'choice',
          label: 'Condensate drains to',
          help: "Where the ventless dryer's drain hose discharges.",
          applies: condensateDrained,
          choices: condensateReceptors,
          choiceLabels: words(condensateReceptors),
        },
        condensateDrainReachable: {
          kind: 'boolean',
          label: 'Receptor within the drain hose’s reach',
          help: "The standpipe or receptor is within the reach and height the dryer maker's instructions allow for the drain hose.",
          applies: { all: [condensateDrained, { path: 'dryer.condensateDrainTo', notIn: ['none'] }] },
        },
        ...applianceFields,
        exhaustCfm: { kind: 'number', unit: 'cfm', min: 'nonnegative', example: 150, label: 'Exhaust rate', help: 'Exhaust flow rate of the dryer, cubic feet per minute.', applies: ventedDryer },
        maxDuctLength: {
          kind: 'length',
          applies: ventedDryer,
          label: 'Maker’s maximum duct length',
          help: "The maker's maximum exhaust duct length for this model, when its instructions give one.",
          hint: 'From the installation instructions; type “none” if they give no maximum.',
          none: { answer: 'null', meaning: 'The maker gives no maximum duct length.', word: 'none' },
        },
        closetVent: {
          kind: 'group',
          help: "The maker's closet ventilation figures, from its installation instructions.",
          none: { answer: 'null', meaning: 'The maker asks for no closet-vent openings.', ask: 'Maker’s closet-vent figures' },
          fields: {
            top: { kind: 'area', label: 'Maker’s closet vent, top', help: 'Net free area the maker asks for in openings at the top of the closet door.' },
            bottom: { kind: 'area', label: 'Maker’s closet vent, bottom', help: 'Net free area the maker asks for in openings at the bottom of the closet door.' },
          },
        },
      },
    },
    exhaust: {
      kind: 'group',
      section: 'exhaust',
      help: 'The dryer exhaust system (a listed condensing or heat-pump dryer needs none).',
      applies: ventedDryer,
      fields: {
        material: { kind: 'choice', label: 'Duct material', help: 'Material of the exhaust duct (not the transition duct).', choices: ductMaterials, choiceLabels: words(ductMaterials) },
        diameter: { kind: 'length', label: 'Duct diameter', help: 'Nominal diameter of the exhaust duct.' },
        thickness: { kind: 'length', thin: true, label: 'Duct wall thickness', help: 'Wall thickness of the exhaust duct.', hint: 'e.g. 0.0157 in (No. 28 gage).' },
        transition: {
          kind: 'group',
          help: 'The flexible transition duct from the dryer outlet to the exhaust duct.',
          fields: {
            length: { kind: 'length', label: 'Transition duct length', help: 'Length of the transition duct between the dryer and the exhaust duct.' },
            listed: { kind: 'boolean', label: 'Transition duct listed and labeled', help: 'The transition duct is listed and labeled for dryer transition use.' },
            concealed: { kind: 'boolean', label: 'Transition duct concealed', help: 'The transition duct passes through or is hidden in a wall, floor or ceiling.' },
          },
        },
        run: {
          kind: 'list',
          label: 'Exhaust route, from the transition connection to the terminal',
          help: 'The exhaust route from the transition connection to the terminal.',
          max: MAX_EXHAUST_RUN_PIECES,
          noun: 'pieces in the exhaust route',
          itemLabel: 'Piece',
          itemTerm: 'exhaust piece',
          term: 'exhaust route',
          bespoke: 'exhaust-route-builder',
          item: {
            kind: 'group',
            help: 'One piece of the exhaust route, in order from the dryer: a straight section or an elbow.',
            fields: {
              straight: { kind: 'length', label: 'Straight length', help: 'Length of a straight section of rigid duct.' },
              elbow: { kind: 'choice', label: 'Elbow angle', help: 'Elbow angle in degrees.', choices: [45, 90] },
              fitting: {
                kind: 'choice',
                label: 'Elbow kind',
                help: 'Elbow kind: mitered (4-in radius), smooth with a 6, 8 or 10-in radius, or other (counted as mitered).',
                choices: fittingKinds,
                choiceLabels: {
                  mitered: 'mitered, 4-in radius',
                  'smooth-6in': 'smooth, 6-in radius',
                  'smooth-8in': 'smooth, 8-in radius',
                  'smooth-10in': 'smooth, 10-in radius',
                  other: 'other (counted as mitered)',
                },
              },
            },
          },
        },
        concealed: { kind: 'boolean', label: 'Duct concealed in a cavity', help: 'Part of the exhaust duct is concealed in a wall or ceiling cavity.' },
        cavityDepth: {
          kind: 'length',
          applies: ductConcealed,
          label: 'Cavity depth',
          help: 'Depth of the wall or ceiling cavity the duct runs in (e.g. 5-1/2 in for 2x6 studs).',
          hint: '2×4 wall 3-1/2 in, 2×6 5-1/2 in.',
        },
        supportSpacing: {
          kind: 'length',
          label: 'Support spacing',
          help: 'Greatest distance between supports of the exhaust duct.',
        },
        framingFaceClearance: {
          kind: 'length',
          applies: ductConcealed,
          label: 'Duct to framing face',
          help: 'Least distance from the concealed duct to the face of the framing members it passes through (where drywall nails or screws go in).',
          hint: 'Under 1-1/4 in needs steel shield plates.',
        },
        shieldPlates: {
          kind: 'boolean',
          applies: ductConcealed,
          label: 'Shield plates installed',
          help: 'Steel shield plates protect the duct where it is close to the framing face.',
        },
        lengthLabel: { kind: 'boolean', label: 'Length label installed', help: 'A permanent label giving the concealed duct length is within 6 ft of the connection.' },
        fastenersIntoAirstream: { kind: 'boolean', label: 'Fasteners into the airstream', help: 'Screws or other fasteners pass through the duct wall into the airstream.' },
        fastenerProtrusion: {
          kind: 'length',
          label: 'Fastener protrusion',
          help: 'How far the longest fastener stands into the duct.',
          applies: { path: 'exhaust.fastenersIntoAirstream', equals: true },
        },
        termination: {
          kind: 'group',
          help: 'The end of the exhaust duct: its terminal.',
          fields: {
            location: {
              kind: 'choice',
              label: 'Duct ends',
              help: 'Where the exhaust duct ends: outdoors, or inside the building (attic, crawl space, soffit, garage or another indoor space).',
              choices: terminationLocations,
              choiceLabels: words(terminationLocations),
            },
            openingArea: { kind: 'area', label: 'Terminal opening area', help: 'Free area of the terminal’s opening.' },
            clearanceToOpenings: { kind: 'length', label: 'Terminal to nearest opening', help: 'Distance from the terminal to the nearest door, window or other opening.' },
            backdraftDamper: { kind: 'boolean', label: 'Backdraft damper', help: 'The terminal has a backdraft damper.' },
            screen: { kind: 'boolean', label: 'Screen on the terminal', help: 'The terminal has a screen over its opening.' },
          },
        },
        boosterFan: {
          kind: 'group',
          help: 'A fan added to the exhaust duct, if any.',
          none: { answer: 'null', meaning: 'No fan in the duct.', choiceOf: 'kind', word: 'none' },
          fields: {
            kind: {
              kind: 'choice',
              label: 'Fan in the duct',
              help: 'A dryer exhaust duct power ventilator, or a general booster fan.',
              choices: ['power-ventilator', 'booster'],
              choiceLabels: { 'power-ventilator': 'listed dryer power ventilator', booster: 'general booster fan' },
            },
            listed: { kind: 'boolean', label: 'Fan listed for dryer exhaust', help: 'The fan is listed for dryer exhaust use.' },
            maxDuctLength: { kind: 'length', label: 'Fan maker’s maximum length', help: 'Maximum duct length the fan maker allows.' },
          },
        },
      },
    },
    makeupAir: {
      kind: 'group',
      section: 'makeup-air',
      help: 'Make-up air for the dryer.',
      fields: {
        openings: {
          kind: 'list',
          label: 'Openings',
          itemLabel: 'Opening',
          help: 'Openings that let air into the closet; gaps around doors do not count.',
          max: MAX_MAKEUP_AIR_OPENINGS,
          noun: 'make-up air openings',
          newItem: { position: 'top', netFreeArea: '' },
          item: {
            kind: 'group',
            help: 'An opening in the closet enclosure or its doors.',
            fields: {
              position: { kind: 'choice', label: 'Position', help: 'Where the opening is.', choices: ['top', 'bottom', 'side', 'other'] },
              netFreeArea: { kind: 'area', label: 'Net free area', help: 'Net free area of the opening (louvres and grilles deducted).' },
            },
          },
        },
        providedCfm: {
          kind: 'number',
          unit: 'cfm',
          min: 'nonnegative',
          example: 150,
          label: 'Make-up air by other means',
          help: 'Make-up air supplied by other means, cubic feet per minute.',
          applies: ventedDryer,
        },
      },
    },
    electrical: {
      kind: 'group',
      section: 'electrical',
      help: 'Electrical supply.',
      fields: {
        laundryCircuit: {
          kind: 'group',
          help: 'The laundry branch circuit.',
          fields: {
            amps: { kind: 'number', unit: 'A', min: 'positive', example: 20, label: 'Laundry circuit rating', help: 'Rating of the laundry branch circuit, amperes.' },
            dedicated: { kind: 'boolean', label: 'Laundry circuit serves only laundry outlets', help: 'The laundry circuit has no outlets outside the laundry area.' },
          },
        },
        receptacles: {
          kind: 'list',
          label: 'Receptacles',
          itemLabel: 'Receptacle',
          help: 'Receptacle outlets serving the appliances.',
          max: MAX_RECEPTACLES,
          noun: 'receptacles',
          newItem: { serves: 'washer', volts: '120', amps: '20' },
          item: {
            kind: 'group',
            help: 'A receptacle outlet for the laundry appliances.',
            fields: {
              serves: { kind: 'choice', label: 'Serves', help: 'The appliance(s) this receptacle serves.', choices: ['washer', 'dryer', 'both'] },
              volts: { kind: 'number', unit: 'V', min: 'positive', example: 240, label: 'Voltage', help: 'Nominal voltage of the receptacle.' },
              amps: { kind: 'number', unit: 'A', min: 'positive', example: 30, label: 'Rating', help: 'Rating of the receptacle and its circuit, amperes.' },
              wires: { kind: 'choice', label: 'Wires (dryer)', help: 'Conductors to a dryer receptacle, 3 or 4 wire.', choices: [3, 4] },
              gfci: { kind: 'boolean', label: 'GFCI protected', help: 'Ground-fault circuit-interrupter protection is provided.' },
              afci: { kind: 'boolean', label: 'AFCI protected', help: 'Arc-fault circuit-interrupter protection is provided.' },
              distanceToAppliance: {
                kind: 'length',
                label: 'Distance to appliance',
                help: "Distance from the receptacle to the appliance's intended location.",
                applies: notHardWired,
              },
              reachableInstalled: {
                kind: 'boolean',
                label: 'Plug reachable with appliance in place',
                help: 'The plug can be reached without moving the appliance.',
                applies: notHardWired,
              },
              hardWired: {
                kind: 'boolean',
                label: 'Hard-wired (no plug)',
                help: 'The appliance is permanently connected to this outlet, with no cord and plug.',
                applies: dryerOutlet,
              },
              disconnect: {
                kind: 'choice',
                label: 'Disconnecting means',
                help: 'For a hard-wired appliance: a switch or breaker within sight, a breaker that locks open, or none.',
                applies: { all: [dryerOutlet, { path: 'electrical.receptacles.*.hardWired', equals: true }] },
                choices: disconnectMeans,
                choiceLabels: { 'within-sight': 'switch or breaker within sight', 'lockable-breaker': 'breaker lockable in the open position', none: 'none' },
              },
              existingCircuit: { kind: 'boolean', label: 'Existing circuit', help: 'The receptacle is on an existing circuit, not new work.' },
            },
          },
        },
      },
    },
    plumbing: {
      kind: 'group',
      section: 'plumbing',
      help: 'Water supply and drain.',
      fields: {
        standpipeHeight: { kind: 'length', label: 'Standpipe height above trap weir', help: 'Height of the standpipe above its trap weir.' },
        trapSize: { kind: 'length', label: 'Trap size', help: 'Nominal size of the washer trap.' },
        drainPan: {
          kind: 'group',
          help: 'A pan under the washer.',
          none: { answer: 'null', meaning: 'No drain pan under the washer.', ask: 'Drain pan details' },
          fields: {
            present: { kind: 'boolean', label: 'Drain pan under the washer', help: 'A drain pan is installed under the washer.' },
            drainsTo: { kind: 'choice', label: 'Pan drains to', help: 'Where the pan drain discharges.', choices: drainDestinations, choiceLabels: words(drainDestinations) },
          },
        },
        valvesAccessible: { kind: 'boolean', label: 'Supply valves accessible', help: 'The supply valves can be reached with the appliances installed.' },
        hammerArrestors: { kind: 'boolean', label: 'Water-hammer arrestors', help: 'Water-hammer arrestors are installed at the washer supply.' },
        leakShutoff: { kind: 'boolean', label: 'Leak detector with shut-off', help: 'An automatic leak detector with shut-off valve is installed.' },
      },
    },
    gas: {
      kind: 'group',
      section: 'gas',
      help: 'Gas supply to a gas dryer.',
      none: { answer: 'null', meaning: 'No gas supply: the dryer is electric.', follows: { path: 'dryer.fuel', present: 'gas', absent: 'electric' } },
      fields: {
        shutoffDistance: { kind: 'length', label: 'Shut-off valve to dryer', help: 'Distance from the gas shut-off valve to the dryer.' },
        shutoffSameRoom: { kind: 'boolean', label: 'Shut-off in the same room', help: 'The shut-off valve is in the same room as the dryer.' },
        connectorLength: { kind: 'length', label: 'Appliance connector length', help: 'Length of the appliance connector to the dryer.' },
        combustionAirFromOutdoors: {
          kind: 'boolean',
          label: 'All combustion air from outdoors',
          help: 'All combustion air for the dryer is taken from outdoors.',
        },
      },
    },
    doors: {
      kind: 'list',
      section: 'doors',
      label: 'Enclosure doors',
      term: 'doors',
      itemLabel: 'Door',
      help: 'The enclosure doors.',
      max: MAX_DOORS,
      noun: 'doors',
      newItem: { kind: 'hinged', width: '', height: '', thickness: '3/4', hinges: '' },
      item: {
        kind: 'group',
        help: 'An enclosure door.',
        fields: {
          kind: { kind: 'choice', label: 'Opens', help: 'How the door opens.', choices: doorKinds },
          width: { kind: 'length', label: 'Width', help: 'Width of the door leaf.' },
          height: { kind: 'length', label: 'Height', help: 'Height of the door leaf.' },
          thickness: { kind: 'length', label: 'Thickness', help: 'Thickness of the door leaf.' },
          hingeSide: {
            kind: 'choice',
            label: 'Hinge side',
            help: 'The edge the hinges are on, seen from the room facing the closet.',
            hint: 'Seen from the room. Blank: a pair hinges on its outer edges, a single door on the left.',
            choices: doorHingeSides,
          },
          mounting: {
            kind: 'choice',
            label: 'Door fits',
            help: 'Overlay: the closed door covers the front edges of the panels. Inset: it closes inside the opening, flush with them.',
            hint: 'Blank: overlay.',
            choices: doorMountings,
            choiceLabels: { overlay: 'overlay (covers the panel edges)', inset: 'inset (inside the opening)' },
          },
          gapBelow: {
            kind: 'length',
            label: 'Gap under the door',
            help: 'Gap between the bottom edge of the door and the floor, or the top of the toe kick where there is one.',
            hint: 'Blank: none (the door comes down to the floor or the toe kick).',
          },
          cupBoringDistance: {
            kind: 'length',
            label: 'Hinge cup boring distance',
            help: 'Distance from the door’s hinge edge to the rim of the 35 mm hinge cup hole, from the hinge maker’s chart.',
            hint: 'Blank: 5 mm (common practice, no published source); hinge makers allow 3–8 mm.',
          },
          hinges: {
            kind: 'list',
            label: 'Hinge positions from the bottom edge',
            help: 'Hinge positions, each measured from the bottom edge of the door.',
            hint: `Comma-separated, e.g. 3, 40, 77 (at most ${MAX_HINGES_PER_DOOR}); “none” for a door without hinges.`,
            max: MAX_HINGES_PER_DOOR,
            noun: 'hinge positions on a door',
            term: 'hinge positions',
            itemTerm: 'hinge',
            none: { answer: 'empty', meaning: 'A door without hinges.', word: 'none' },
            item: { kind: 'length', help: 'Distance of a hinge cup centre from the bottom edge of the door.' },
          },
        },
      },
    },
  },
} as const satisfies GroupEntry;

export type PlanRegistry = typeof planRegistry;

type Join<P extends string, K extends string> = P extends '' ? K : `${P}.${K}`;

/** Every path of an entry's subtree; list items appear as `Index` (`*` in patterns, a number in a concrete path). */
type SubPaths<N, P extends string, Index extends string> = N extends { kind: 'group'; fields: infer F }
  ? { [K in keyof F & string]: Join<P, K> | SubPaths<F[K], Join<P, K>, Index> }[keyof F & string]
  : N extends { kind: 'list'; item: infer I }
    ? Join<P, Index> | SubPaths<I, Join<P, Index>, Index>
    : never;

type ListSubPaths<N, P extends string> = N extends { kind: 'group'; fields: infer F }
  ? { [K in keyof F & string]: (F[K] extends { kind: 'list' } ? Join<P, K> : never) | ListSubPaths<F[K], Join<P, K>> }[keyof F & string]
  : N extends { kind: 'list'; item: infer I }
    ? ListSubPaths<I, Join<P, '*'>>
    : never;

/** A field's path in the registry, list items as `*` (`doors.*.hinges`). */
export type PlanFieldPattern = SubPaths<PlanRegistry, '', '*'>;
/** A field's path in one plan (`doors.0.hinges`), as missing-field lists and error paths name it. */
export type PlanFieldPath = SubPaths<PlanRegistry, '', `${number}`>;
/** The bounded lists of a plan. */
export type PlanListPath = ListSubPaths<PlanRegistry, ''>;

/** Each entry with its pattern path, depth first in registry order (a group before what it holds). */
export interface RegistryEntry {
  path: string;
  key: string;
  entry: PlanEntry;
  /** The top-level entry's section. */
  section: PlanSectionId | undefined;
}

function walk(entry: PlanEntry, path: string, key: string, section: PlanSectionId | undefined, out: RegistryEntry[]) {
  if (path) out.push({ path, key, entry, section });
  if (entry.kind === 'group') {
    for (const [k, child] of Object.entries(entry.fields)) {
      walk(child, path ? `${path}.${k}` : k, k, section ?? child.section, out);
    }
  } else if (entry.kind === 'list') {
    walk(entry.item, `${path}.*`, '*', section, out);
  }
}

export const registryEntries: readonly RegistryEntry[] = (() => {
  const out: RegistryEntry[] = [];
  walk(planRegistry, '', '', undefined, out);
  return out;
})();

const byPattern: ReadonlyMap<string, RegistryEntry> = new Map(registryEntries.map((e) => [e.path, e]));

/** `doors.0.hinges.2` → `doors.*.hinges.*`. */
export function patternOf(path: string): string {
  return path
    .split('.')
    .map((part) => (/^\d+$/.test(part) ? '*' : part))
    .join('.');
}

/** The registry entry for a path of a plan (indices or `*`), or undefined when the plan has no such field. */
export function entryAt(path: string): RegistryEntry | undefined {
  return byPattern.get(patternOf(path));
}

const lists = registryEntries.filter((e) => e.entry.kind === 'list');
const nested = lists.filter((e) => e.path.includes('*') || lists.some((inner) => inner.path.startsWith(`${e.path}.`)));

/**
 * The bounded lists of a plan: lists that hold lists come first, each before the lists inside its items (so
 * a list cut to its limit is never walked past it), then the others, in registry order.
 */
export const PLAN_LIST_LIMITS: ReadonlyArray<{ path: PlanListPath; max: number; noun: string }> = [
  ...nested,
  ...lists.filter((e) => !nested.includes(e)),
].map((e) => {
  const entry = e.entry as ListEntry;
  return { path: e.path as PlanListPath, max: entry.max, noun: entry.noun };
});

function valueAt(plan: unknown, path: string): unknown {
  return path.split('.').reduce<unknown>((o, k) => (o == null || typeof o !== 'object' ? undefined : (o as Record<string, unknown>)[k]), plan);
}

/** Binds each `*` of a condition's path to the list index at the same place in the field's concrete path. */
function bindPath(conditionPath: string, concretePath: string): string {
  const indices = concretePath.split('.').filter((part) => /^\d+$/.test(part));
  let i = 0;
  return conditionPath
    .split('.')
    .map((part) => (part === '*' ? (indices[i++] ?? '*') : part))
    .join('.');
}

/** Whether a condition holds for a plan (as entered or canonical), seen from the field at `concretePath`. */
export function conditionHolds(applies: Applies, plan: unknown, concretePath = ''): boolean {
  if ('all' in applies) return applies.all.every((c) => conditionHolds(c, plan, concretePath));
  if ('any' in applies) return applies.any.some((c) => conditionHolds(c, plan, concretePath));
  const value = valueAt(plan, bindPath(applies.path, concretePath));
  if ('equals' in applies) return value === applies.equals;
  if ('in' in applies) return applies.in.includes(value as AppliesValue);
  return value === undefined || value === null || value === '' || !applies.notIn.includes(value as AppliesValue);
}

/** The conditions on a field: its own and its ancestors', outermost first. */
export function conditionsAt(path: string): Applies[] {
  const parts = patternOf(path).split('.');
  const out: Applies[] = [];
  for (let i = 1; i <= parts.length; i++) {
    const applies = byPattern.get(parts.slice(0, i).join('.'))?.entry.applies;
    if (applies) out.push(applies);
  }
  return out;
}

/**
 * Whether the field at a concrete path (`doors.0.width`, `gas.combustionAirFromOutdoors`) applies to a plan:
 * every condition on it and on the groups and lists holding it holds. A field without conditions always applies.
 */
export function fieldApplies(plan: unknown, path: string): boolean {
  return conditionsAt(path).every((c) => conditionHolds(c, plan, path));
}

function conditionPaths(applies: Applies): string[] {
  if ('all' in applies) return applies.all.flatMap(conditionPaths);
  if ('any' in applies) return applies.any.flatMap(conditionPaths);
  return [applies.path];
}

// A condition naming a field the plan does not have would silently hide its field for ever: refuse it at load.
for (const { path, entry } of registryEntries) {
  for (const target of entry.applies ? conditionPaths(entry.applies) : []) {
    if (!byPattern.has(target)) throw new Error(`The plan field ${path} applies on ${target}, which the plan does not have.`);
  }
}
