import { all, any, cond, param, paramCond, type CitationEntry, type CitationVariantDefinition, type RuleDefinition } from '@/lib/domain/rule-format/define';
import type { TopLevelCondition } from 'json-rules-engine';

const irc = (section: string, confidence: CitationEntry['confidence'], years?: number[]): CitationEntry => ({
  source: 'building',
  code: 'IRC',
  section,
  confidence,
  ...(years ? { years } : {}),
});

const LINT = 'Lint builds up in long, crushed or obstructed ducts and is a fire risk.';

/** The dryer is vented (the default): it needs an exhaust duct. */
export const DUCT_REQUIRED = cond('dryer-needs-duct', 'exhaust.ductRequired', 'equal', true);

/**
 * A listed condensing or heat-pump dryer needs no exhaust duct (IRC M1502.2 exception; TRADE.md S): its
 * exhaust findings are not-applicable and cite the exception, never ask for a route it does not have.
 */
export const VENTLESS: CitationVariantDefinition = {
  when: { 'exhaust.ductRequired': false },
  citations: [irc('M1502.2 exception', 'S')],
  messages: { notApplicable: 'A listed condensing or heat-pump dryer needs no exhaust duct; follow its maker’s instructions for condensate and closet clearances.' },
};

/** Gates a rule on a vented dryer: its applicability gains the duct clause and its citation the ventless exception. */
export function forVentedDryer(rule: RuleDefinition): RuleDefinition {
  const current = rule.applicability as unknown as { name: string; all?: unknown[] } | null;
  if (current && !current.all) throw new Error(`${rule.key}: applicability must be an "all" to gate it on a vented dryer`);
  const applicability = current
    ? all(current.name, DUCT_REQUIRED, ...(current.all as unknown[]))
    : (all('dryer-vented', DUCT_REQUIRED) as TopLevelCondition);
  return { ...rule, applicability, citationVariants: [VENTLESS, ...(rule.citationVariants ?? [])] };
}

const exhaustRuleDefinitions: RuleDefinition[] = [
  {
    key: 'exhaust.developed-length',
    title: 'Exhaust duct developed length',
    area: 'exhaust',
    severity: 'fail',
    // Same rule renumbered: IRC 2018 M1502.4.5.1, IRC 2021 M1502.4.6.1 (TRADE.md, V). Before the 2018 IRC
    // inserted the power-ventilator section it was M1502.4.4.1 (2012 S, 2009 and 2015 M).
    citations: [
      irc('M1502.4.5.1', 'V', [2018]),
      irc('M1502.4.6.1', 'V', [2021]),
      irc('M1502.4.4.1', 'S', [2012]),
      irc('M1502.4.4.1', 'M', [2009, 2015]),
    ],
    citationVariants: [
      {
        // The maker's maximum replaces the code's where make and model are known (TRADE.md S; 2012/2015 M).
        when: { 'exhaust.allowedLengthSource': 'manufacturer' },
        citations: [irc('M1502.4.5.2', 'S', [2018]), irc('M1502.4.6.2', 'S', [2021]), irc('M1502.4.4.2', 'M', [2012, 2015])],
        messages: {
          pass: 'Developed length {measured} is within the {limit} the dryer maker allows. The maker’s installation instructions must reach the inspector before the duct is concealed.',
          fail: `Developed length {measured} exceeds the {limit} the dryer maker allows. The maker’s installation instructions must reach the inspector before the duct is concealed. ${LINT}`,
        },
      },
      {
        // With a listed power ventilator the length follows its instructions: IRC 2018 M1502.4.5.3 / 2021 M1502.4.6.3 (S).
        when: { 'exhaust.allowedLengthSource': 'power-ventilator' },
        citations: [irc('M1502.4.5.3', 'S', [2018]), irc('M1502.4.6.3', 'S', [2021])],
        messages: {
          pass: 'Developed length {measured} is within the {limit} the power ventilator’s maker allows.',
          fail: `Developed length {measured} exceeds the {limit} the power ventilator’s maker allows. ${LINT}`,
        },
      },
    ],
    applicability: null,
    conditions: all('within-allowed-length', cond('developed-length-within-limit', 'exhaust.developedLengthIn', 'lessThanInclusive', { fact: 'exhaust.allowedLengthIn' })),
    requires: ['exhaust.developedLengthIn', 'exhaust.allowedLengthIn'],
    measured: 'exhaust.developedLengthIn',
    limit: { fact: 'exhaust.allowedLengthIn' },
    unit: 'length',
    messages: {
      pass: 'Developed length {measured} is within the {limit} allowed.',
      fail: `Developed length {measured} exceeds the {limit} allowed. ${LINT}`,
      notApplicable: 'No exhaust duct.',
    },
    remedy: 'exhaust.shorten-route',
  },
  {
    key: 'exhaust.material',
    title: 'Exhaust duct material',
    area: 'exhaust',
    severity: 'fail',
    citations: [irc('M1502.4.1', 'S')],
    applicability: null,
    conditions: all('rigid-metal', cond('duct-is-rigid-metal', 'exhaust.material', 'equal', 'rigid-metal')),
    requires: ['exhaust.material'],
    measured: 'exhaust.material',
    limit: 'rigid-metal',
    unit: 'text',
    messages: {
      pass: 'The exhaust duct is rigid metal with a smooth interior.',
      fail: `The exhaust duct is {measured}; it must be rigid metal with a smooth interior (only the transition duct may be flexible). ${LINT}`,
      notApplicable: 'No exhaust duct.',
    },
    remedy: 'exhaust.use-rigid-metal',
  },
  {
    key: 'exhaust.diameter',
    title: 'Exhaust duct diameter',
    area: 'exhaust',
    severity: 'fail',
    citations: [irc('M1502.4.1', 'S')],
    applicability: null,
    conditions: all('nominal-diameter', cond('diameter-is-nominal', 'exhaust.diameterNominalIn', 'equal', param('exhaust.nominalDiameterIn'))),
    requires: ['exhaust.diameterNominalIn'],
    measured: 'exhaust.diameterNominalIn',
    limit: param('exhaust.nominalDiameterIn'),
    unit: 'length',
    lengthStyle: 'inches',
    messages: {
      pass: 'The exhaust duct is {limit} nominal.',
      fail: 'The exhaust duct is {measured}; it must be {limit} nominal unless the dryer maker allows otherwise.',
      notApplicable: 'No exhaust duct.',
    },
    remedy: 'exhaust.use-nominal-diameter',
  },
  {
    key: 'exhaust.thickness',
    title: 'Exhaust duct wall thickness',
    area: 'exhaust',
    severity: 'fail',
    citations: [irc('M1502.4.1', 'S')],
    applicability: all('rigid-duct', cond('duct-is-rigid-metal', 'exhaust.material', 'equal', 'rigid-metal')),
    conditions: all('thick-enough', cond('thickness-at-least-minimum', 'exhaust.thicknessIn', 'greaterThanInclusive', param('exhaust.minDuctThicknessIn'))),
    requires: ['exhaust.thicknessIn'],
    measured: 'exhaust.thicknessIn',
    limit: param('exhaust.minDuctThicknessIn'),
    unit: 'length',
    lengthStyle: 'decimal',
    messages: {
      pass: 'Duct wall {measured} meets the {limit} minimum.',
      fail: 'Duct wall {measured} is thinner than the {limit} minimum.',
      notApplicable: 'The duct is not rigid metal; see the material finding.',
    },
    remedy: 'exhaust.thicker-duct',
  },
  {
    key: 'exhaust.transition-length',
    title: 'Transition duct length',
    area: 'exhaust',
    severity: 'fail',
    citations: [irc('M1502.4.3', 'V')],
    applicability: null,
    conditions: all('short-enough', cond('transition-within-max', 'exhaust.transitionLengthIn', 'lessThanInclusive', param('exhaust.transitionMaxLengthIn'))),
    requires: ['exhaust.transitionLengthIn'],
    measured: 'exhaust.transitionLengthIn',
    limit: param('exhaust.transitionMaxLengthIn'),
    unit: 'length',
    messages: {
      pass: 'Transition duct {measured}, within the {limit} maximum (one length).',
      fail: `Transition duct {measured} is longer than the {limit} maximum. ${LINT}`,
      notApplicable: 'No transition duct.',
    },
    remedy: 'exhaust.shorten-transition',
  },
  {
    key: 'exhaust.transition-listed',
    title: 'Transition duct listed and labeled',
    area: 'exhaust',
    severity: 'fail',
    citations: [irc('M1502.4.3', 'V')],
    applicability: null,
    conditions: all('listed', cond('transition-is-listed', 'exhaust.transitionListed', 'equal', true)),
    requires: ['exhaust.transitionListed'],
    measured: 'exhaust.transitionListed',
    limit: true,
    unit: 'boolean',
    messages: {
      pass: 'The transition duct is listed and labeled for dryer transition use.',
      fail: 'The transition duct is not listed and labeled for dryer transition use (UL 2158A).',
      notApplicable: 'No transition duct.',
    },
    remedy: 'exhaust.listed-transition',
  },
  {
    key: 'exhaust.transition-concealed',
    title: 'Transition duct not concealed',
    area: 'exhaust',
    severity: 'fail',
    citations: [irc('M1502.4.3', 'V')],
    applicability: null,
    conditions: all('exposed', cond('transition-not-concealed', 'exhaust.transitionConcealed', 'equal', false)),
    requires: ['exhaust.transitionConcealed'],
    measured: 'exhaust.transitionConcealed',
    limit: false,
    unit: 'boolean',
    messages: {
      pass: 'The transition duct stays in the open.',
      fail: `The transition duct is concealed in construction; it must stay exposed. ${LINT}`,
      notApplicable: 'No transition duct.',
    },
    remedy: 'exhaust.expose-transition',
  },
  {
    key: 'exhaust.fasteners',
    title: 'Fasteners into the airstream',
    area: 'exhaust',
    severity: 'fail',
    citations: [irc('M1502.4.2', 'S', [2015, 2018, 2021]), irc('M1502.4.2', 'M', [2009, 2012])],
    applicability: null,
    conditions: all('fasteners-ok', cond('protrusion-within-limit', 'exhaust.fastenerProtrusionIn', 'lessThanInclusive', param('exhaust.fastenerMaxProtrusionIn'))),
    requires: ['exhaust.fastenerProtrusionIn'],
    measured: 'exhaust.fastenerProtrusionIn',
    limit: param('exhaust.fastenerMaxProtrusionIn'),
    unit: 'length',
    lengthStyle: 'inches',
    messages: {
      pass: 'Fasteners stand {measured} into the duct (at most {limit} allowed).',
      fail: `Fasteners stand {measured} into the duct; at most {limit} is allowed. Screws catch lint. ${LINT}`,
      notApplicable: 'No exhaust duct.',
    },
    remedy: 'exhaust.fasteners',
  },
  {
    key: 'exhaust.cavity-fit',
    title: 'Concealed duct fits its cavity',
    area: 'exhaust',
    severity: 'fail',
    citations: [irc('M1502.4.2', 'S', [2018, 2021])],
    applicability: all('duct-concealed', cond('duct-is-concealed', 'exhaust.concealed', 'equal', true)),
    conditions: all('fits', cond('cavity-deep-enough', 'exhaust.cavityDepthIn', 'greaterThanInclusive', { fact: 'exhaust.ductOutsideIn' })),
    requires: ['exhaust.cavityDepthIn', 'exhaust.ductOutsideIn'],
    measured: 'exhaust.cavityDepthIn',
    limit: { fact: 'exhaust.ductOutsideIn' },
    unit: 'length',
    lengthStyle: 'inches',
    messages: {
      pass: 'The {measured} cavity takes the duct ({limit} outside) without crushing it.',
      fail: `The {measured} cavity is shallower than the duct ({limit} outside); a duct squeezed to fit loses airflow. ${LINT}`,
      notApplicable: 'The duct is not concealed.',
    },
    remedy: 'exhaust.deeper-cavity',
  },
  {
    key: 'exhaust.length-label',
    title: 'Concealed duct length label',
    area: 'exhaust',
    severity: 'fail',
    // IRC 2012/2015 label every concealed duct (M1502.4.5, M); 2018+ only where the length exceeds the maximum.
    citations: [irc('M1502.4.6', 'S', [2018]), irc('M1502.4.7', 'S', [2021]), irc('M1502.4.5', 'M', [2009, 2012, 2015])],
    applicability: all('label-required', cond('edition-requires-label', 'exhaust.lengthLabelRequired', 'equal', true)),
    conditions: all('labelled', cond('label-installed', 'exhaust.lengthLabel', 'equal', true)),
    requires: ['exhaust.lengthLabel'],
    measured: 'exhaust.lengthLabel',
    limit: true,
    unit: 'boolean',
    messages: {
      pass: 'A permanent length label is within 6 ft of the duct connection.',
      fail: 'A permanent label giving the concealed duct length is needed within 6 ft of the dryer connection.',
      notApplicable: 'The adopted edition does not call for a length label on this duct.',
    },
    remedy: 'exhaust.add-length-label',
  },
  {
    key: 'exhaust.termination-clearance',
    title: 'Terminal clearance to openings',
    area: 'exhaust',
    severity: 'fail',
    citations: [irc('M1502.3', 'V')],
    applicability: all('clearance-adopted', paramCond('jurisdiction-keeps-clearance', 'exhaust.terminationClearanceIn', 'notEqual', null)),
    conditions: all('far-enough', cond('clearance-at-least-minimum', 'exhaust.terminationClearanceIn', 'greaterThanInclusive', param('exhaust.terminationClearanceIn'))),
    requires: ['exhaust.terminationClearanceIn'],
    measured: 'exhaust.terminationClearanceIn',
    limit: param('exhaust.terminationClearanceIn'),
    unit: 'length',
    messages: {
      pass: 'The terminal is {measured} from the nearest opening ({limit} needed, unless the dryer maker says otherwise).',
      fail: 'The terminal is {measured} from an opening into the building; {limit} is needed in any direction unless the dryer maker’s instructions say otherwise. Moist, lint-laden air must not come back in.',
      notApplicable: 'The jurisdiction has deleted the terminal clearance by amendment; follow the dryer maker’s instructions.',
    },
    remedy: 'exhaust.move-termination',
  },
  {
    key: 'exhaust.backdraft-damper',
    title: 'Terminal backdraft damper',
    area: 'exhaust',
    severity: 'fail',
    citations: [irc('M1502.3', 'V')],
    applicability: null,
    conditions: all('damper', cond('damper-installed', 'exhaust.backdraftDamper', 'equal', true)),
    requires: ['exhaust.backdraftDamper'],
    measured: 'exhaust.backdraftDamper',
    limit: true,
    unit: 'boolean',
    messages: {
      pass: 'The terminal has a backdraft damper.',
      fail: 'The terminal needs a backdraft damper.',
      notApplicable: 'No terminal.',
    },
    remedy: 'exhaust.add-damper',
  },
  {
    key: 'exhaust.no-screen',
    title: 'No screen at the terminal',
    area: 'exhaust',
    severity: 'fail',
    citations: [irc('M1502.3', 'V')],
    applicability: null,
    conditions: all('unscreened', cond('no-screen', 'exhaust.screen', 'equal', false)),
    requires: ['exhaust.screen'],
    measured: 'exhaust.screen',
    limit: false,
    unit: 'boolean',
    messages: {
      pass: 'The terminal has no screen.',
      fail: `The terminal has a screen; screens are not allowed because they clog with lint. ${LINT}`,
      notApplicable: 'No terminal.',
    },
    remedy: 'exhaust.remove-screen',
  },
  {
    key: 'exhaust.booster-fan',
    title: 'Fan added to the exhaust duct',
    area: 'exhaust',
    severity: 'fail',
    // Power ventilators got their own section in the 2018 IRC; earlier editions are cited from 2018 with a note to confirm.
    citations: [irc('M1502.4.5', 'S', [2021]), irc('M1502.4.4', 'S', [2018])],
    applicability: all('fan-present', cond('has-added-fan', 'exhaust.boosterFanPresent', 'equal', true)),
    conditions: all(
      'fan-allowed',
      cond('fan-is-listed', 'exhaust.boosterFanListed', 'equal', true),
      any(
        'fan-kind-allowed',
        paramCond('any-listed-fan-allowed', 'exhaust.boosterFanPolicy', 'equal', 'listed-fans'),
        cond('fan-is-power-ventilator', 'exhaust.boosterFanKind', 'equal', 'power-ventilator'),
      ),
    ),
    requires: ['exhaust.boosterFanListed', 'exhaust.boosterFanKind'],
    measured: 'exhaust.boosterFanKind',
    limit: param('exhaust.boosterFanPolicy'),
    unit: 'text',
    messages: {
      pass: 'The added fan is listed and allowed under the adopted edition.',
      fail: 'The added fan is not allowed: the adopted edition accepts {limit}, and the fan must be listed for dryer exhaust and installed per its listing.',
      notApplicable: 'No fan is added to the exhaust duct.',
    },
    remedy: 'exhaust.listed-power-ventilator',
  },
  {
    key: 'exhaust.termination-location',
    title: 'Duct ends outdoors',
    area: 'exhaust',
    severity: 'fail',
    // IRC M1502.3: terminate outdoors; M1501.1: never into an attic, soffit, ridge vent or crawl space (TRADE.md S).
    citations: [irc('M1502.3', 'S')],
    applicability: null,
    conditions: all('outdoors', cond('ends-outdoors', 'exhaust.terminationLocation', 'equal', 'outdoors')),
    requires: ['exhaust.terminationLocation'],
    measured: 'exhaust.terminationLocation',
    limit: 'outdoors',
    unit: 'text',
    messages: {
      pass: 'The exhaust duct ends outdoors.',
      fail: `The exhaust duct ends inside the building ({measured}); it must end outdoors, never in an attic, soffit, ridge vent, crawl space, garage or other indoor space (IRC M1501.1 too). Moist, lint-laden air indoors feeds mould and fire. ${LINT}`,
      notApplicable: 'No exhaust duct.',
    },
    remedy: 'exhaust.terminate-outdoors',
  },
  {
    key: 'exhaust.terminal-opening',
    title: 'Terminal opening area',
    area: 'exhaust',
    severity: 'fail',
    // IRC 2018/2021 M1502.3: the terminal's opening at least 12.5 sq in (TRADE.md S); earlier editions set none.
    citations: [irc('M1502.3', 'S', [2018, 2021])],
    applicability: all('edition-sets-opening', paramCond('edition-sets-terminal-opening', 'exhaust.minTerminalOpeningSqIn', 'notEqual', null)),
    conditions: all('open-enough', cond('opening-at-least-minimum', 'exhaust.terminalOpeningSqIn', 'greaterThanInclusive', param('exhaust.minTerminalOpeningSqIn'))),
    requires: ['exhaust.terminalOpeningSqIn'],
    measured: 'exhaust.terminalOpeningSqIn',
    limit: param('exhaust.minTerminalOpeningSqIn'),
    unit: 'area',
    messages: {
      pass: 'The terminal’s opening is {measured} (at least {limit} needed).',
      fail: `The terminal’s opening is {measured}; at least {limit} is needed so it does not choke the airflow. ${LINT}`,
      notApplicable: 'The adopted edition sets no minimum terminal opening.',
    },
    remedy: 'exhaust.larger-terminal',
  },
  {
    key: 'exhaust.support-spacing',
    title: 'Duct support spacing',
    area: 'exhaust',
    severity: 'fail',
    // IRC M1502.4.2: supports at intervals of at most 12 ft, 2015 and later (TRADE.md S).
    citations: [irc('M1502.4.2', 'S', [2015, 2018, 2021])],
    applicability: all('edition-sets-spacing', paramCond('edition-sets-support-spacing', 'exhaust.maxSupportSpacingIn', 'notEqual', null)),
    conditions: all('supported', cond('spacing-within-max', 'exhaust.supportSpacingIn', 'lessThanInclusive', param('exhaust.maxSupportSpacingIn'))),
    requires: ['exhaust.supportSpacingIn'],
    measured: 'exhaust.supportSpacingIn',
    limit: param('exhaust.maxSupportSpacingIn'),
    unit: 'length',
    messages: {
      pass: 'Duct supports are at most {measured} apart (within {limit}).',
      fail: `Duct supports are {measured} apart; at most {limit} is allowed. A sagging duct collects lint and separates at its joints. ${LINT}`,
      notApplicable: 'The adopted edition sets no support spacing for dryer exhaust ducts.',
    },
    remedy: 'exhaust.add-supports',
  },
  {
    key: 'exhaust.shield-plates',
    title: 'Shield plates near the framing face',
    area: 'exhaust',
    severity: 'fail',
    // IRC M1502.5: steel plates where the duct is less than 1-1/4 in from the framing face (TRADE.md S).
    citations: [irc('M1502.5', 'S')],
    applicability: all('duct-concealed', cond('duct-is-concealed', 'exhaust.concealed', 'equal', true)),
    conditions: any(
      'protected-from-fasteners',
      cond('far-from-framing-face', 'exhaust.framingFaceClearanceIn', 'greaterThanInclusive', param('exhaust.shieldPlateMinClearanceIn')),
      cond('shield-plates-installed', 'exhaust.shieldPlates', 'equal', true),
    ),
    requires: ['exhaust.framingFaceClearanceIn', 'exhaust.shieldPlates'],
    measured: 'exhaust.framingFaceClearanceIn',
    limit: param('exhaust.shieldPlateMinClearanceIn'),
    unit: 'length',
    lengthStyle: 'inches',
    messages: {
      pass: 'The duct is {measured} from the framing face ({limit} or more, or protected by shield plates).',
      fail: `The duct is {measured} from the framing face, less than {limit}, with no shield plates: a drywall nail or screw can pierce it and catch lint. ${LINT}`,
      notApplicable: 'The duct is not concealed in framing.',
    },
    remedy: 'exhaust.add-shield-plates',
  },
];

/** Every exhaust rule applies only to a vented dryer. */
export const exhaustRules: RuleDefinition[] = exhaustRuleDefinitions.map(forVentedDryer);
