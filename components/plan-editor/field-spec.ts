// The plan editor's fields, as data: one renderer and one converter serve them all.
import {
  adjoiningRooms,
  doorKinds,
  drainDestinations,
  ductMaterials,
  fittingKinds,
  MAX_DOORS,
  MAX_HINGES_PER_DOOR,
  MAX_MAKEUP_AIR_OPENINGS,
  MAX_RECEPTACLES,
  spaceKinds,
} from '@/lib/domain/plan';

export type FieldKind = 'length' | 'area' | 'number' | 'bool' | 'enum' | 'int-enum' | 'length-list' | 'presence';

export type FieldSpec = {
  /** Path inside the plan (or inside one list item for list fields). */
  path: string;
  label: string;
  kind: FieldKind;
  options?: readonly (string | number)[];
  optionLabels?: Record<string, string>;
  hint?: string;
  unit?: string;
  /** For 'presence' fields: the optional group of the plan this says is there, absent (null) or not known. */
  group?: string;
  /** For length fields that may be null: the word that means "none" (e.g. the maker gives no maximum). */
  noneWord?: string;
};

const presence = (group: string, label: string, hint?: string): FieldSpec => ({
  path: `_has.${group.replace(/\./g, '_')}`,
  label,
  kind: 'presence',
  group,
  hint,
});

export type ListSpec = {
  path: string;
  label: string;
  itemLabel: string;
  fields: FieldSpec[];
  newItem: Record<string, string>;
  /** The schema's limit for the list: the editor offers no more. */
  max: number;
};

export type SectionSpec = {
  id: string;
  title: string;
  intro?: string;
  fields: FieldSpec[];
  lists?: ListSpec[];
  showWhen?: (values: FormValues) => boolean;
};

export type FormValues = Record<string, any>;

const human = (s: string) => s.replace(/-/g, ' ');
const labels = (values: readonly string[]) => Object.fromEntries(values.map((v) => [v, human(v)]));

const clearanceFields = (who: 'washer' | 'dryer'): FieldSpec[] => [
  { path: `${who}.clearances.side`, label: 'Maker’s side clearance', kind: 'length' },
  { path: `${who}.clearances.top`, label: 'Maker’s top clearance', kind: 'length' },
  { path: `${who}.clearances.rear`, label: 'Maker’s rear clearance', kind: 'length', hint: 'Vent elbow, hoses and cord live here.' },
  { path: `${who}.clearances.front`, label: 'Maker’s front clearance', kind: 'length', hint: 'To the closed enclosure doors.' },
];

const applianceFields = (who: 'washer' | 'dryer'): FieldSpec[] => [
  { path: `${who}.width`, label: 'Width', kind: 'length' },
  { path: `${who}.depth`, label: 'Depth (cabinet)', kind: 'length', hint: 'Without knobs or the door.' },
  { path: `${who}.height`, label: 'Height as installed', kind: 'length' },
  { path: `${who}.frontProjection`, label: 'Front projection', kind: 'length', hint: 'Knobs, door and handle in front of the cabinet.' },
  ...clearanceFields(who),
];

export const runItemFields: FieldSpec[] = [
  { path: 'straight', label: 'Straight length', kind: 'length' },
  { path: 'elbow', label: 'Elbow angle', kind: 'int-enum', options: [45, 90] },
  {
    path: 'fitting',
    label: 'Elbow kind',
    kind: 'enum',
    options: fittingKinds,
    optionLabels: {
      mitered: 'mitered, 4-in radius',
      'smooth-6in': 'smooth, 6-in radius',
      'smooth-8in': 'smooth, 8-in radius',
      'smooth-10in': 'smooth, 10-in radius',
      other: 'other (counted as mitered)',
    },
  },
];

export const sections: SectionSpec[] = [
  {
    id: 'space',
    title: 'Space',
    intro: 'Where the washer and dryer stand. Closets off bedrooms and storage closets restrict gas dryers.',
    fields: [
      { path: 'units', label: 'Units for bare numbers', kind: 'enum', options: ['imperial', 'metric'], optionLabels: { imperial: 'imperial (inches, sq in)', metric: 'metric (mm, cm²)' } },
      { path: 'space.kind', label: 'Kind of space', kind: 'enum', options: spaceKinds, optionLabels: labels(spaceKinds) },
      { path: 'space.opensInto', label: 'Opens into', kind: 'enum', options: adjoiningRooms, optionLabels: labels(adjoiningRooms) },
      { path: 'space.overFinishedSpace', label: 'Finished living space below', kind: 'bool' },
      { path: 'arrangement', label: 'Arrangement', kind: 'enum', options: ['side-by-side', 'stacked'], optionLabels: labels(['side-by-side', 'stacked']) },
    ],
  },
  {
    id: 'enclosure',
    title: 'Enclosure',
    fields: [
      { path: 'enclosure.width', label: 'Width', kind: 'length' },
      { path: 'enclosure.depth', label: 'Depth', kind: 'length' },
      { path: 'enclosure.height', label: 'Height', kind: 'length' },
      { path: 'enclosure.depthMeasured', label: 'Sizes measured', kind: 'enum', options: ['outside', 'inside'], optionLabels: { outside: 'outside (panels included)', inside: 'inside clear' } },
      { path: 'enclosure.panelThickness', label: 'Panel thickness', kind: 'length' },
      { path: 'enclosure.openingWidth', label: 'Clear opening width', kind: 'length', hint: 'Only if a face frame narrows the opening.' },
      presence('enclosure.toeKick', 'Toe kick or sill across the opening'),
      { path: 'enclosure.toeKick.height', label: 'Toe kick height', kind: 'length' },
      { path: 'enclosure.toeKick.removable', label: 'Toe kick removable', kind: 'bool' },
    ],
  },
  { id: 'washer', title: 'Washer', fields: applianceFields('washer') },
  {
    id: 'dryer',
    title: 'Dryer',
    fields: [
      { path: 'dryer.fuel', label: 'Fuel', kind: 'enum', options: ['electric', 'gas'] },
      ...applianceFields('dryer'),
      { path: 'dryer.exhaustCfm', label: 'Exhaust rate', kind: 'number', unit: 'cfm' },
      { path: 'dryer.maxDuctLength', label: 'Maker’s maximum duct length', kind: 'length', noneWord: 'none', hint: 'From the installation instructions; type “none” if they give no maximum.' },
      presence('dryer.closetVent', 'Maker’s closet-vent figures'),
      { path: 'dryer.closetVent.top', label: 'Maker’s closet vent, top', kind: 'area' },
      { path: 'dryer.closetVent.bottom', label: 'Maker’s closet vent, bottom', kind: 'area' },
    ],
  },
  {
    id: 'exhaust',
    title: 'Dryer exhaust',
    intro: 'Rigid metal duct from the transition connection to the terminal outdoors. Lint is a fire risk: keep the run short and smooth.',
    fields: [
      { path: 'exhaust.material', label: 'Duct material', kind: 'enum', options: ductMaterials, optionLabels: labels(ductMaterials) },
      { path: 'exhaust.diameter', label: 'Duct diameter', kind: 'length' },
      { path: 'exhaust.thickness', label: 'Duct wall thickness', kind: 'length', hint: 'e.g. 0.0157 in (No. 28 gage).' },
      { path: 'exhaust.transition.length', label: 'Transition duct length', kind: 'length' },
      { path: 'exhaust.transition.listed', label: 'Transition duct listed and labeled', kind: 'bool' },
      { path: 'exhaust.transition.concealed', label: 'Transition duct concealed', kind: 'bool' },
      { path: 'exhaust.concealed', label: 'Duct concealed in a cavity', kind: 'bool' },
      { path: 'exhaust.cavityDepth', label: 'Cavity depth', kind: 'length', hint: '2×4 wall 3-1/2 in, 2×6 5-1/2 in.' },
      { path: 'exhaust.lengthLabel', label: 'Length label installed', kind: 'bool' },
      { path: 'exhaust.fastenersIntoAirstream', label: 'Fasteners into the airstream', kind: 'bool' },
      { path: 'exhaust.fastenerProtrusion', label: 'Fastener protrusion', kind: 'length' },
      { path: 'exhaust.termination.clearanceToOpenings', label: 'Terminal to nearest opening', kind: 'length' },
      { path: 'exhaust.termination.backdraftDamper', label: 'Backdraft damper', kind: 'bool' },
      { path: 'exhaust.termination.screen', label: 'Screen on the terminal', kind: 'bool' },
      { path: 'exhaust.boosterFan.kind', label: 'Fan in the duct', kind: 'enum', options: ['none', 'power-ventilator', 'booster'], optionLabels: { none: 'none', 'power-ventilator': 'listed dryer power ventilator', booster: 'general booster fan' } },
      { path: 'exhaust.boosterFan.listed', label: 'Fan listed for dryer exhaust', kind: 'bool' },
      { path: 'exhaust.boosterFan.maxDuctLength', label: 'Fan maker’s maximum length', kind: 'length' },
    ],
  },
  {
    id: 'makeup-air',
    title: 'Make-up air',
    intro: 'Openings in the enclosure or its doors. Gaps around doors do not count.',
    fields: [{ path: 'makeupAir.providedCfm', label: 'Make-up air by other means', kind: 'number', unit: 'cfm' }],
    lists: [
      {
        path: 'makeupAir.openings',
        label: 'Openings',
        itemLabel: 'Opening',
        fields: [
          { path: 'position', label: 'Position', kind: 'enum', options: ['top', 'bottom', 'side', 'other'] },
          { path: 'netFreeArea', label: 'Net free area', kind: 'area' },
        ],
        newItem: { position: 'top', netFreeArea: '' },
        max: MAX_MAKEUP_AIR_OPENINGS,
      },
    ],
  },
  {
    id: 'electrical',
    title: 'Electrical',
    intro: 'Shock hazard: circuits and receptacles are work for a licensed electrician.',
    fields: [
      { path: 'electrical.laundryCircuit.amps', label: 'Laundry circuit rating', kind: 'number', unit: 'A' },
      { path: 'electrical.laundryCircuit.dedicated', label: 'Laundry circuit serves only laundry outlets', kind: 'bool' },
    ],
    lists: [
      {
        path: 'electrical.receptacles',
        label: 'Receptacles',
        itemLabel: 'Receptacle',
        fields: [
          { path: 'serves', label: 'Serves', kind: 'enum', options: ['washer', 'dryer', 'both'] },
          { path: 'volts', label: 'Voltage', kind: 'number', unit: 'V' },
          { path: 'amps', label: 'Rating', kind: 'number', unit: 'A' },
          { path: 'wires', label: 'Wires (dryer)', kind: 'int-enum', options: [3, 4] },
          { path: 'gfci', label: 'GFCI protected', kind: 'bool' },
          { path: 'afci', label: 'AFCI protected', kind: 'bool' },
          { path: 'distanceToAppliance', label: 'Distance to appliance', kind: 'length' },
          { path: 'reachableInstalled', label: 'Plug reachable with appliance in place', kind: 'bool' },
          { path: 'existingCircuit', label: 'Existing circuit', kind: 'bool' },
        ],
        newItem: { serves: 'washer', volts: '120', amps: '20' },
        max: MAX_RECEPTACLES,
      },
    ],
  },
  {
    id: 'plumbing',
    title: 'Plumbing',
    intro: 'A leaking washer can damage the structure below.',
    fields: [
      { path: 'plumbing.standpipeHeight', label: 'Standpipe height above trap weir', kind: 'length' },
      { path: 'plumbing.trapSize', label: 'Trap size', kind: 'length' },
      presence('plumbing.drainPan', 'Drain pan details'),
      { path: 'plumbing.drainPan.present', label: 'Drain pan under the washer', kind: 'bool' },
      { path: 'plumbing.drainPan.drainsTo', label: 'Pan drains to', kind: 'enum', options: drainDestinations, optionLabels: labels(drainDestinations) },
      { path: 'plumbing.valvesAccessible', label: 'Supply valves accessible', kind: 'bool' },
      { path: 'plumbing.hammerArrestors', label: 'Water-hammer arrestors', kind: 'bool' },
      { path: 'plumbing.leakShutoff', label: 'Leak detector with shut-off', kind: 'bool' },
    ],
  },
  {
    id: 'gas',
    title: 'Gas',
    intro: 'Carbon monoxide and fire hazard: gas piping and connections are work for a licensed gas fitter.',
    showWhen: (v) => v.dryer?.fuel === 'gas',
    fields: [
      { path: 'gas.shutoffDistance', label: 'Shut-off valve to dryer', kind: 'length' },
      { path: 'gas.shutoffSameRoom', label: 'Shut-off in the same room', kind: 'bool' },
      { path: 'gas.connectorLength', label: 'Appliance connector length', kind: 'length' },
    ],
  },
  {
    id: 'doors',
    title: 'Doors and hinges',
    fields: [],
    lists: [
      {
        path: 'doors',
        label: 'Enclosure doors',
        itemLabel: 'Door',
        fields: [
          { path: 'kind', label: 'Opens', kind: 'enum', options: doorKinds },
          { path: 'width', label: 'Width', kind: 'length' },
          { path: 'height', label: 'Height', kind: 'length' },
          { path: 'thickness', label: 'Thickness', kind: 'length' },
          { path: 'hinges', label: 'Hinge positions from the bottom edge', kind: 'length-list', noneWord: 'none', hint: `Comma-separated, e.g. 3, 40, 77 (at most ${MAX_HINGES_PER_DOOR}); “none” for a door without hinges.` },
        ],
        newItem: { kind: 'hinged', width: '', height: '', thickness: '3/4', hinges: '' },
        max: MAX_DOORS,
      },
    ],
  },
];
