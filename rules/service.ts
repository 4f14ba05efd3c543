import { all, commonPractice, cond, type RuleDefinition } from '@/lib/domain/rule-format/define';

export const serviceRules: RuleDefinition[] = [
  {
    key: 'service.removal-width',
    title: 'Opening wide enough to take the units out',
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
      pass: 'The {measured} opening lets the widest unit out ({limit} needed).',
      fail: 'The {measured} opening is narrower than the {limit} needed to take the widest unit out without taking finish apart.',
      notApplicable: 'No enclosure.',
    },
    remedy: 'service.widen-opening',
  },
  {
    key: 'service.toe-kick',
    title: 'Removable toe kick',
    area: 'service',
    severity: 'caution',
    citations: [commonPractice()],
    applicability: all('toe-kick-present', cond('has-toe-kick', 'service.toeKickPresent', 'equal', true)),
    conditions: all('removable', cond('toe-kick-removable', 'service.toeKickRemovable', 'equal', true)),
    requires: ['service.toeKickRemovable'],
    measured: 'service.toeKickRemovable',
    limit: true,
    unit: 'boolean',
    messages: {
      pass: 'The toe kick comes off, so the units slide straight out.',
      fail: 'A fixed toe kick means lifting the units over it or cutting finish to service them; make it removable.',
      notApplicable: 'No toe kick across the opening.',
    },
    remedy: 'service.removable-toe-kick',
  },
];
