export const areaTitles: Record<string, string> = {
  exhaust: 'Dryer exhaust',
  'makeup-air': 'Make-up air',
  gas: 'Gas',
  electrical: 'Electrical',
  plumbing: 'Plumbing',
  clearances: 'Service clearance',
  service: 'Removal path',
  'door-hardware': 'Door hardware room',
};

export const areaOrder = Object.keys(areaTitles);

export const confidenceLabel: Record<string, string> = {
  V: 'verified against the code text',
  S: 'from secondary sources; confirm with the AHJ',
  M: 'from memory; confirm with the AHJ',
  CP: 'common practice, no published source',
};

export function citationText(c: { code: string; edition: string | null; section: string | null }): string {
  return [c.code, c.edition, c.section].filter(Boolean).join(' ');
}
