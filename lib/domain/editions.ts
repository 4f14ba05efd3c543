import { z } from 'zod';

const EDITION = /^([A-Z][A-Za-z0-9-]*)\s+(\d{4})$/;

const edition = (description: string) =>
  z.string().regex(EDITION, 'Write the code and year, e.g. "IRC 2021".').describe(description);

/** The code editions a jurisdiction has adopted; the database stores this shape as is. */
export const editionsSchema = z
  .object({
    building: edition('Residential building code, e.g. "IRC 2018" (its chapters M15 and G24 govern dwellings).'),
    electrical: edition('Electrical code, e.g. "NEC 2017".'),
    plumbing: edition('Plumbing code, e.g. "IPC 2018", "UPC 2021" or "IRC 2018".'),
    plumbingFamily: z.enum(['IPC', 'UPC', 'IRC']).describe('Which family of plumbing code the jurisdiction follows.'),
    mechanical: edition('Mechanical code, e.g. "IMC 2018".'),
    fuelGas: edition('Fuel gas code, e.g. "IFGC 2018".'),
  })
  .strict()
  .describe('Adopted code editions.');

export type Editions = z.infer<typeof editionsSchema>;

export type PlumbingFamily = Editions['plumbingFamily'];

export type EditionSlot = 'building' | 'electrical' | 'plumbing' | 'mechanical' | 'fuelGas';

export interface ParsedEdition {
  code: string;
  year: number;
}

/** `"IRC 2021"` → `{ code: 'IRC', year: 2021 }`; null when the text is not "<code> <year>". */
export function parseEdition(text: string): ParsedEdition | null {
  const match = EDITION.exec(text.trim());
  return match ? { code: match[1].toUpperCase(), year: Number(match[2]) } : null;
}

export function parseEditionOrThrow(text: string): ParsedEdition {
  const parsed = parseEdition(text);
  if (!parsed) throw new Error(`'${text}' is not a code edition; write e.g. "IRC 2021".`);
  return parsed;
}
