import { all, cond, param, type CitationEntry, type CitationVariantDefinition, type RuleDefinition } from '@/lib/domain/rule-format/define';

const gas = (irc: string, ifgc: string, confidence: CitationEntry['confidence'], ifgcConfidence = confidence): CitationEntry[] => [
  { source: 'fuelGas', code: 'IRC', section: irc, confidence },
  { source: 'fuelGas', code: 'IFGC', section: ifgc, confidence: ifgcConfidence },
];

/*
 * The IRC governs one- and two-family dwellings and townhouses: where it is the adopted building code, a
 * gas finding for a dwelling cites its fuel-gas chapter; other buildings cite the adopted fuel gas code.
 */
const inDwelling = (irc: string, confidence: CitationEntry['confidence']): CitationVariantDefinition[] => [
  {
    when: { 'space.isDwelling': true },
    adopted: { slot: 'building', code: 'IRC' },
    citations: [{ source: 'building', code: 'IRC', section: irc, confidence }],
  },
];

const GAS_DRYER = all('gas-dryer', cond('dryer-burns-gas', 'gas.isGasDryer', 'equal', true));
const CO = 'Gas work is for a qualified gas fitter; a gas appliance short of air or in the wrong room can produce carbon monoxide.';

export const gasRules: RuleDefinition[] = [
  {
    key: 'gas.location',
    title: 'Gas dryer location',
    area: 'gas',
    severity: 'fail',
    citations: gas('G2406.2', '303.3', 'S'),
    citationVariants: inDwelling('G2406.2', 'S'),
    applicability: GAS_DRYER,
    conditions: all('location-allowed', cond('no-location-problem', 'gas.locationShortfall', 'equal', 'location-ok')),
    requires: ['gas.locationShortfall'],
    measured: 'gas.locationShortfall',
    limit: 'location-ok',
    unit: 'text',
    messages: {
      pass: 'The dryer space is not a bedroom, bathroom, toilet room or storage closet, or it opens into one and meets the exception: used for nothing else, a solid, weather-stripped, self-closing door, and all combustion air from outdoors.',
      fail: `A fuel-gas appliance may not stand in a bedroom, bathroom, toilet room or storage closet, or in a space that opens only into one, unless that space is used for nothing else, has a solid, weather-stripped door with a self-closing device and takes all combustion air from outdoors (direct-vent appliances aside). Here {measured}. Ask the AHJ before building. ${CO}`,
      notApplicable: 'The dryer is not a gas dryer.',
    },
    remedy: 'gas.relocate',
  },
  {
    key: 'gas.shutoff',
    title: 'Gas shut-off valve within reach',
    area: 'gas',
    severity: 'fail',
    citations: gas('G2420.5.1', '409.5.1', 'S'),
    citationVariants: inDwelling('G2420.5.1', 'S'),
    applicability: GAS_DRYER,
    conditions: all(
      'shutoff-ok',
      cond('shutoff-within-distance', 'gas.shutoffDistanceIn', 'lessThanInclusive', param('gas.shutoffMaxDistanceIn')),
      cond('shutoff-same-room', 'gas.shutoffSameRoom', 'equal', true),
    ),
    requires: ['gas.shutoffDistanceIn', 'gas.shutoffSameRoom'],
    measured: 'gas.shutoffDistanceIn',
    limit: param('gas.shutoffMaxDistanceIn'),
    unit: 'length',
    messages: {
      pass: 'An accessible shut-off valve is in the same room, {measured} from the dryer (within {limit}).',
      fail: `The shut-off valve must be accessible, in the same room and within {limit} of the dryer (it is {measured} away). ${CO}`,
      notApplicable: 'The dryer is not a gas dryer.',
    },
    remedy: 'gas.move-shutoff',
  },
  {
    key: 'gas.connector-length',
    title: 'Gas appliance connector length',
    area: 'gas',
    severity: 'fail',
    citations: gas('G2422.1.2.1', '411.1.3', 'S', 'M'),
    citationVariants: inDwelling('G2422.1.2.1', 'S'),
    applicability: GAS_DRYER,
    conditions: all('connector-ok', cond('connector-within-max', 'gas.connectorLengthIn', 'lessThanInclusive', param('gas.connectorMaxLengthIn'))),
    requires: ['gas.connectorLengthIn'],
    measured: 'gas.connectorLengthIn',
    limit: param('gas.connectorMaxLengthIn'),
    unit: 'length',
    messages: {
      pass: 'One appliance connector, {measured} long (at most {limit}).',
      fail: `The appliance connector is {measured}; one connector of at most {limit}, not through walls or floors. ${CO}`,
      notApplicable: 'The dryer is not a gas dryer.',
    },
    remedy: 'gas.shorten-connector',
  },
  {
    key: 'gas.makeup-air',
    title: 'Make-up air for a gas dryer in a closet',
    area: 'gas',
    severity: 'fail',
    // From memory (TRADE.md M): the fuel-gas chapter repeats the closet make-up air rule.
    citations: gas('G2439.5', '614.6', 'M'),
    citationVariants: inDwelling('G2439.5', 'M'),
    applicability: all(
      'gas-dryer-in-closet',
      cond('dryer-burns-gas', 'gas.isGasDryer', 'equal', true),
      cond('space-is-closet', 'makeupAir.isCloset', 'equal', true),
    ),
    conditions: all('opening-large-enough', cond('opening-at-least-minimum', 'makeupAir.openingAreaSqIn', 'greaterThanInclusive', param('makeupAir.closetOpeningMinSqIn'))),
    requires: ['makeupAir.openingAreaSqIn'],
    measured: 'makeupAir.openingAreaSqIn',
    limit: param('makeupAir.closetOpeningMinSqIn'),
    unit: 'area',
    messages: {
      pass: 'Closet openings of {measured} give the gas dryer make-up air ({limit} needed).',
      fail: `A gas dryer in a closet needs make-up air: openings of at least {limit} (given {measured}) or another approved means. ${CO}`,
      notApplicable: 'Not a gas dryer in a closet.',
    },
    remedy: 'makeup-air.add-opening',
  },
];
