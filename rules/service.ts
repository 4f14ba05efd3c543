import { all, commonPractice, cond, type CitationEntry, type CitationVariantDefinition, type RuleDefinition } from '@/lib/domain/rule-format/define';

/*
 * Appliance access: appliances can be reached for inspection, service, repair and replacement without
 * removing permanent construction (IRC M1305.1, TRADE.md S; for other buildings IMC 306.1, from memory).
 */
const ACCESS: CitationEntry[] = [{ source: 'mechanical', code: 'IMC', section: '306.1', confidence: 'M' }];
const ACCESS_VARIANTS: CitationVariantDefinition[] = [
  {
    when: { 'space.isDwelling': true },
    adopted: { slot: 'building', code: 'IRC' },
    citations: [{ source: 'building', code: 'IRC', section: 'M1305.1', confidence: 'S' }],
  },
];

export const serviceRules: RuleDefinition[] = [
  {
    key: 'service.opening-width',
    title: 'Opening lets the units out',
    area: 'service',
    severity: 'fail',
    citations: ACCESS,
    citationVariants: ACCESS_VARIANTS,
    applicability: null,
    conditions: all('unit-passes', cond('opening-at-least-widest-unit', 'service.openingWidthIn', 'greaterThanInclusive', { fact: 'service.widestUnitIn' })),
    requires: ['service.openingWidthIn', 'service.widestUnitIn'],
    measured: 'service.openingWidthIn',
    limit: { fact: 'service.widestUnitIn' },
    unit: 'length',
    messages: {
      pass: 'The {measured} clear opening is at least as wide as the widest unit ({limit}).',
      fail: 'The {measured} clear opening is {shortfall} narrower than the widest unit ({limit}): it cannot come out for service or replacement without removing the face frame or other permanent construction.',
      notApplicable: 'No enclosure.',
    },
    remedy: 'service.widen-opening',
  },
  {
    key: 'service.removal-width',
    title: 'Room to spare in the opening',
    area: 'service',
    severity: 'caution',
    citations: [commonPractice()],
    applicability: null,
    conditions: all('wide-enough', cond('opening-at-least-unit-plus-margin', 'service.openingWidthIn', 'greaterThanInclusive', { fact: 'service.removalWidthRequiredIn' })),
    requires: ['service.openingWidthIn', 'service.removalWidthRequiredIn'],
    measured: 'service.openingWidthIn',
    limit: { fact: 'service.removalWidthRequiredIn' },
    unit: 'length',
    messages: {
      pass: 'The {measured} opening lets the widest unit out with room to spare ({limit} wanted).',
      fail: 'The {measured} opening leaves less than the usual margin around the widest unit ({limit} wanted); moving it out scrapes the finish.',
      notApplicable: 'No enclosure.',
    },
    remedy: 'service.widen-opening',
  },
  {
    key: 'service.toe-kick',
    title: 'Removable toe kick',
    area: 'service',
    severity: 'fail',
    citations: ACCESS,
    citationVariants: ACCESS_VARIANTS,
    applicability: all('toe-kick-present', cond('has-toe-kick', 'service.toeKickPresent', 'equal', true)),
    conditions: all('removable', cond('toe-kick-removable', 'service.toeKickRemovable', 'equal', true)),
    requires: ['service.toeKickRemovable'],
    measured: 'service.toeKickRemovable',
    limit: true,
    unit: 'boolean',
    messages: {
      pass: 'The toe kick comes off, so the units slide straight out.',
      fail: 'A fixed toe kick across the opening keeps the units in: they cannot come out for service or replacement without removing permanent construction. Make it removable.',
      notApplicable: 'No toe kick across the opening.',
    },
    remedy: 'service.removable-toe-kick',
  },
];
