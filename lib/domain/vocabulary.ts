// The words NookPass uses for areas, statuses, confidence and citations: defined once, read by pages, the PDF and the engine.

/** The areas a check covers, in the order findings are shown. */
export const areas = ['exhaust', 'makeup-air', 'gas', 'electrical', 'plumbing', 'clearances', 'service', 'door-hardware'] as const;
export type Area = (typeof areas)[number];

export const areaTitles: Record<string, string> & Record<Area, string> = {
  exhaust: 'Dryer exhaust',
  'makeup-air': 'Make-up air',
  gas: 'Gas',
  electrical: 'Electrical',
  plumbing: 'Plumbing',
  clearances: 'Service clearance',
  service: 'Removal path',
  'door-hardware': 'Door hardware room',
};

export const areaOrder: readonly string[] = areas;

export type FindingStatus = 'pass' | 'fail' | 'caution' | 'needs-info' | 'not-applicable';

/** `label` for pages, `short` for the PDF's narrow status column. */
export const findingStatusLabels: Record<FindingStatus, { label: string; short: string }> = {
  pass: { label: 'Pass', short: 'PASS' },
  fail: { label: 'Fails', short: 'FAILS' },
  caution: { label: 'Caution', short: 'CAUTION' },
  'needs-info': { label: 'Needs info', short: 'NEEDS INFO' },
  'not-applicable': { label: 'Not applicable', short: 'N/A' },
};

export const confidenceLabel: Record<string, string> = {
  V: 'verified against the code text',
  S: 'from secondary sources; confirm with the AHJ',
  M: 'from memory; confirm with the AHJ',
  CP: 'common practice, no published source',
};

export function citationText(c: { code: string; edition: string | null; section: string | null }): string {
  return [c.code, c.edition, c.section].filter(Boolean).join(' ');
}
