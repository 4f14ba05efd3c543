import { all, commonPractice, cond, type CitationEntry, type CitationVariantDefinition, type RuleDefinition } from '@/lib/domain/rule-format/define';

const MAKER =
  "Appliances are installed as their listing and the maker's instructions require, so a clearance below the maker's figure is a code violation, not advice; a dryer boxed in too tightly runs hot.";

/*
 * Installing against the listing and the maker's instructions breaks the code itself: IRC M1307.1 for
 * appliances and G2408.1 for gas appliances (TRADE.md S); for other buildings IMC 304.1 (from memory) and
 * IFGC 305.1 (S).
 */
export const LISTING: CitationEntry[] = [{ source: 'mechanical', code: 'IMC', section: '304.1', confidence: 'M' }];
export const LISTING_VARIANTS: CitationVariantDefinition[] = [
  {
    when: { 'space.isDwelling': true, 'gas.isGasDryer': true },
    adopted: { slot: 'building', code: 'IRC' },
    citations: [{ source: 'building', code: 'IRC', section: 'M1307.1 and G2408.1', confidence: 'S' }],
  },
  {
    when: { 'space.isDwelling': true },
    adopted: { slot: 'building', code: 'IRC' },
    citations: [{ source: 'building', code: 'IRC', section: 'M1307.1', confidence: 'S' }],
  },
  {
    when: { 'gas.isGasDryer': true },
    citations: [
      { source: 'fuelGas', code: 'IFGC', section: '305.1', confidence: 'S' },
      { source: 'fuelGas', code: 'IRC', section: 'G2408.1', confidence: 'S' },
    ],
    note: 'For the washer, the adopted mechanical code’s rule on installing per the listing applies (IMC 304.1).',
  },
];

export const clearanceRules: RuleDefinition[] = [
  {
    key: 'clearances.width',
    title: "Maker's side clearances",
    area: 'clearances',
    severity: 'fail',
    citations: LISTING,
    citationVariants: LISTING_VARIANTS,
    applicability: null,
    conditions: all('wide-enough', cond('inside-width-at-least-required', 'clearances.insideWidthIn', 'greaterThanInclusive', { fact: 'clearances.requiredWidthIn' })),
    requires: ['clearances.insideWidthIn', 'clearances.requiredWidthIn'],
    measured: 'clearances.insideWidthIn',
    limit: { fact: 'clearances.requiredWidthIn' },
    unit: 'length',
    messages: {
      pass: 'Inside width {measured} takes the units and their side clearances ({limit}).',
      fail: `The maker's side clearances are {shortfall} short: inside width {measured}, where the units and their side clearances need {limit}. ${MAKER}`,
      notApplicable: 'No enclosure.',
    },
    remedy: 'clearances.widen',
  },
  {
    key: 'clearances.depth',
    title: "Maker's front and rear clearances",
    area: 'clearances',
    severity: 'fail',
    citations: LISTING,
    citationVariants: LISTING_VARIANTS,
    applicability: null,
    conditions: all('deep-enough', cond('inside-depth-at-least-required', 'clearances.insideDepthIn', 'greaterThanInclusive', { fact: 'clearances.requiredDepthIn' })),
    requires: ['clearances.insideDepthIn', 'clearances.requiredDepthIn'],
    measured: 'clearances.insideDepthIn',
    limit: { fact: 'clearances.requiredDepthIn' },
    unit: 'length',
    messages: {
      pass: 'Inside depth {measured} takes the units, their knobs and doors, and front and rear clearances ({limit}).',
      fail: `The maker's front and rear clearances are {shortfall} short: inside depth {measured}, where the units, knobs, doors and those clearances need {limit}. ${MAKER}`,
      notApplicable: 'No enclosure.',
    },
    remedy: 'clearances.deepen',
  },
  {
    key: 'clearances.height',
    title: "Maker's top clearance",
    area: 'clearances',
    severity: 'fail',
    citations: LISTING,
    citationVariants: LISTING_VARIANTS,
    applicability: null,
    conditions: all('tall-enough', cond('inside-height-at-least-required', 'clearances.insideHeightIn', 'greaterThanInclusive', { fact: 'clearances.requiredHeightIn' })),
    requires: ['clearances.insideHeightIn', 'clearances.requiredHeightIn'],
    measured: 'clearances.insideHeightIn',
    limit: { fact: 'clearances.requiredHeightIn' },
    unit: 'length',
    messages: {
      pass: 'Inside height {measured} takes the units and their top clearance ({limit}).',
      fail: `The maker's top clearance is {shortfall} short: inside height {measured}, where the units and their top clearance need {limit}. ${MAKER}`,
      notApplicable: 'No enclosure.',
    },
    remedy: 'clearances.raise',
  },
  {
    key: 'clearances.rear-zone',
    title: 'Rear zone for vent, hoses and cord',
    area: 'clearances',
    severity: 'caution',
    citations: [commonPractice()],
    applicability: null,
    conditions: all('rear-zone-ok', cond('rear-zone-at-least', 'clearances.rearZoneIn', 'greaterThanInclusive', { fact: 'clearances.rearZoneRequiredIn' })),
    requires: ['clearances.rearZoneIn', 'clearances.rearZoneRequiredIn'],
    measured: 'clearances.rearZoneIn',
    limit: { fact: 'clearances.rearZoneRequiredIn' },
    unit: 'length',
    messages: {
      pass: 'Behind the units there is {measured} for the vent elbow, hoses and cord ({limit} wanted).',
      fail: 'Only {measured} is left behind the units for the vent elbow, hoses and cord; about {limit} is wanted so the transition duct is not crushed.',
      notApplicable: 'No enclosure.',
    },
    remedy: 'clearances.rear-zone',
  },
];
