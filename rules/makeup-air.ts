import { DUCT_REQUIRED, VENTLESS } from '@/rules/exhaust';
import { all, cond, param, type CitationEntry, type CitationVariantDefinition, type RuleDefinition } from '@/lib/domain/rule-format/define';
import { LISTING } from '@/rules/clearances';

// The dryer's own listing: IRC M1307.1, or G2408.1 for a gas dryer (TRADE.md S); IFGC 305.1 elsewhere.
const DRYER_LISTING_VARIANTS: CitationVariantDefinition[] = [
  {
    when: { 'space.isDwelling': true, 'gas.isGasDryer': true },
    adopted: { slot: 'building', code: 'IRC' },
    citations: [{ source: 'building', code: 'IRC', section: 'G2408.1', confidence: 'S' }],
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
  },
];

const imc = (section: string, confidence: CitationEntry['confidence'], years: number[]): CitationEntry => ({
  source: 'mechanical',
  code: 'IMC',
  section,
  confidence,
  years,
});
// IMC 2015 504.5 / 2018 504.6 (TRADE.md: verified against 2018).
const MAKEUP_AIR_CITATIONS = [imc('504.6', 'V', [2018]), imc('504.5', 'S', [2015]), imc('504.6', 'M', [2021])];

const CLOSET = all('in-a-closet', cond('space-is-closet', 'makeupAir.isCloset', 'equal', true));

export const makeupAirRules: RuleDefinition[] = [
  {
    key: 'makeup-air.closet-opening',
    title: 'Closet opening for dryer make-up air',
    area: 'makeup-air',
    severity: 'fail',
    citations: MAKEUP_AIR_CITATIONS,
    // Checked for every dryer, gas or electric; the note says which adopted code the 100 sq in comes from.
    citationNoteText: 'The 100 sq in closet opening comes from the adopted mechanical code ({citation}).',
    citationVariants: [
      {
        when: { 'space.isDwelling': true },
        adopted: { slot: 'building', code: 'IRC' },
        citations: MAKEUP_AIR_CITATIONS,
        note: 'The 100 sq in closet opening comes from the adopted mechanical code ({citation}); the IRC governs one- and two-family dwellings, so confirm with the AHJ that they apply it here (for a gas dryer the IRC fuel-gas chapter has its own make-up air rule, G2439.5).',
      },
    ],
    applicability: CLOSET,
    conditions: all('opening-large-enough', cond('opening-at-least-minimum', 'makeupAir.openingAreaSqIn', 'greaterThanInclusive', param('makeupAir.closetOpeningMinSqIn'))),
    requires: ['makeupAir.openingAreaSqIn'],
    measured: 'makeupAir.openingAreaSqIn',
    limit: param('makeupAir.closetOpeningMinSqIn'),
    unit: 'area',
    messages: {
      pass: 'Closet openings total {measured} net free area ({limit} needed).',
      fail: 'Closet openings total {measured} net free area; a closet for a dryer needs at least {limit}, or make-up air by another approved means. A starved dryer runs hot.',
      notApplicable: 'The appliances are not in a closet.',
    },
    remedy: 'makeup-air.add-opening',
  },
  {
    key: 'makeup-air.maker-closet-vent',
    title: "Closet vents the dryer maker asks for",
    area: 'makeup-air',
    // The maker's instructions bind through installation per the listing (IRC M1307.1, G2408.1).
    severity: 'fail',
    citations: LISTING,
    citationVariants: DRYER_LISTING_VARIANTS,
    applicability: all(
      'maker-gives-figures',
      cond('space-is-closet', 'makeupAir.isCloset', 'equal', true),
      cond('maker-vent-given', 'makeupAir.makerVentGiven', 'equal', true),
    ),
    conditions: all(
      'maker-vents-met',
      cond('top-vent-met', 'makeupAir.topOpeningAreaSqIn', 'greaterThanInclusive', { fact: 'makeupAir.makerTopSqIn' }),
      cond('bottom-vent-met', 'makeupAir.bottomOpeningAreaSqIn', 'greaterThanInclusive', { fact: 'makeupAir.makerBottomSqIn' }),
    ),
    requires: ['makeupAir.topOpeningAreaSqIn', 'makeupAir.bottomOpeningAreaSqIn', 'makeupAir.makerTopSqIn', 'makeupAir.makerBottomSqIn'],
    measured: 'makeupAir.topOpeningAreaSqIn',
    limit: { fact: 'makeupAir.makerTopSqIn' },
    unit: 'area',
    messages: {
      pass: "Top and bottom openings meet the dryer maker's closet-vent figures (top {measured}, {limit} asked).",
      fail: "The openings fall short of the dryer maker's closet-vent figures (top {measured}, {limit} asked; see the bottom figure too). Gaps around doors do not count. The maker's instructions are part of the listing the code requires the dryer to be installed by; a starved dryer runs hot.",
      notApplicable: "The dryer maker gives no closet-vent figures, or the space is not a closet.",
    },
    remedy: 'makeup-air.maker-vents',
  },
  {
    key: 'makeup-air.exhaust-rate',
    title: 'Make-up air for a high exhaust rate',
    area: 'makeup-air',
    severity: 'fail',
    citations: MAKEUP_AIR_CITATIONS,
    // A ventless dryer exhausts nothing that needs making up.
    applicability: all('over-threshold', DUCT_REQUIRED, cond('exhaust-over-threshold', 'makeupAir.exhaustCfm', 'greaterThan', param('makeupAir.exhaustCfmThreshold'))),
    citationVariants: [{ ...VENTLESS, messages: { notApplicable: 'A listed condensing or heat-pump dryer exhausts no air to the outdoors, so there is no exhaust to make up.' } }],
    conditions: all('makeup-provided', cond('makeup-matches-exhaust', 'makeupAir.providedCfm', 'greaterThanInclusive', { fact: 'makeupAir.exhaustCfm' })),
    requires: ['makeupAir.providedCfm', 'makeupAir.exhaustCfm'],
    measured: 'makeupAir.providedCfm',
    limit: { fact: 'makeupAir.exhaustCfm' },
    unit: 'cfm',
    messages: {
      pass: 'Make-up air {measured} matches the {limit} exhaust.',
      fail: 'The dryer exhausts {limit}, over the threshold; make-up air of about the same rate is needed (given: {measured}).',
      notApplicable: 'The exhaust rate is not over the make-up air threshold.',
    },
    remedy: 'makeup-air.provide-makeup-air',
  },
];
