import { all, cond, type CitationEntry, type RuleDefinition } from '@/lib/domain/rule-format/define';

// Arithmetic on the plan's own sizes: no code section, and none needed, to say a box will not go in.
const PHYSICAL: CitationEntry[] = [{ source: 'physical', confidence: 'V' }];
const CANNOT = 'The units cannot go in as drawn';

export const fitRules: RuleDefinition[] = [
  {
    key: 'fit.width',
    title: 'Units fit the enclosure width',
    area: 'clearances',
    severity: 'fail',
    citations: PHYSICAL,
    applicability: null,
    conditions: all('units-fit-width', cond('inside-width-at-least-units', 'clearances.insideWidthIn', 'greaterThanInclusive', { fact: 'fit.unitsWidthIn' })),
    requires: ['clearances.insideWidthIn', 'fit.unitsWidthIn'],
    measured: 'clearances.insideWidthIn',
    limit: { fact: 'fit.unitsWidthIn' },
    unit: 'length',
    messages: {
      pass: 'Inside width {measured} takes the units themselves ({limit}, before clearances).',
      fail: `${CANNOT}: the units need {limit} of width for their arrangement and the enclosure is {measured} wide inside, {shortfall} short before any clearance.`,
      notApplicable: 'No enclosure.',
    },
    remedy: 'clearances.widen',
  },
  {
    key: 'fit.depth',
    title: 'Units fit the enclosure depth',
    area: 'clearances',
    severity: 'fail',
    citations: PHYSICAL,
    applicability: null,
    conditions: all('units-fit-depth', cond('inside-depth-at-least-units', 'clearances.insideDepthIn', 'greaterThanInclusive', { fact: 'fit.unitsDepthIn' })),
    requires: ['clearances.insideDepthIn', 'fit.unitsDepthIn'],
    measured: 'clearances.insideDepthIn',
    limit: { fact: 'fit.unitsDepthIn' },
    unit: 'length',
    messages: {
      pass: 'Inside depth {measured}, back panel to the closed doors, takes the deeper unit ({limit}, before clearances).',
      fail: `${CANNOT}: the deeper unit takes {limit} (cabinet, with knobs and door where given) and the enclosure is {measured} deep to the closed doors, {shortfall} short before any clearance; the doors would not close.`,
      notApplicable: 'No enclosure.',
    },
    remedy: 'clearances.deepen',
  },
  {
    key: 'fit.height',
    title: 'Units fit the enclosure height',
    area: 'clearances',
    severity: 'fail',
    citations: PHYSICAL,
    applicability: null,
    conditions: all('units-fit-height', cond('inside-height-at-least-units', 'clearances.insideHeightIn', 'greaterThanInclusive', { fact: 'fit.unitsHeightIn' })),
    requires: ['clearances.insideHeightIn', 'fit.unitsHeightIn'],
    measured: 'clearances.insideHeightIn',
    limit: { fact: 'fit.unitsHeightIn' },
    unit: 'length',
    messages: {
      pass: 'Inside height {measured} takes the units for their arrangement ({limit}, before clearances).',
      fail: `${CANNOT}: the units need {limit} of height for their arrangement and the enclosure is {measured} tall inside, {shortfall} short before any clearance.`,
      notApplicable: 'No enclosure.',
    },
    remedy: 'clearances.raise',
  },
];
