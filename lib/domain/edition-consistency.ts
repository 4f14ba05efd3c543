import { parseEdition, type Editions, type EditionSlot } from '@/lib/domain/editions';
import type { FieldError } from '@/lib/domain/errors';

/**
 * Which codes may fill each adopted-edition slot. The rule catalog cites these codes and no others
 * (rules/*.ts and the per-edition defaults): a slot holding another code would be cited with the
 * sections and limits of a code the jurisdiction never adopted.
 * - building: the IRC governs one- and two-family dwellings; the IBC other buildings.
 * - electrical: the NEC (NFPA 70).
 * - plumbing: the code of the chosen family (IPC, UPC, or the IRC's plumbing chapters).
 * - mechanical: the IMC, or the IRC's mechanical chapters (M15 holds the dryer-exhaust section).
 * - fuel gas: the IFGC, or the IRC's fuel-gas chapter (G24).
 */
export const CODES_BY_SLOT: Record<EditionSlot, readonly string[]> = {
  building: ['IRC', 'IBC'],
  electrical: ['NEC'],
  plumbing: ['IPC', 'UPC', 'IRC'],
  mechanical: ['IMC', 'IRC'],
  fuelGas: ['IFGC', 'IRC'],
};

const SLOT_NAMES: Record<EditionSlot, string> = {
  building: 'building code',
  electrical: 'electrical code',
  plumbing: 'plumbing code',
  mechanical: 'mechanical code',
  fuelGas: 'fuel gas code',
};

const EXAMPLES: Record<EditionSlot, string> = {
  building: '"IRC 2021"',
  electrical: '"NEC 2023"',
  plumbing: '"IPC 2021", "UPC 2021" or "IRC 2021"',
  mechanical: '"IMC 2021" or "IRC 2021"',
  fuelGas: '"IFGC 2021" or "IRC 2021"',
};

const slots: EditionSlot[] = ['building', 'electrical', 'plumbing', 'mechanical', 'fuelGas'];

/**
 * Whether the adopted editions fit together: each slot names a code that belongs there, the plumbing
 * code matches its family, and the IRC's chapters are cited from the one IRC edition adopted as the
 * building code (the IRC is one book: its plumbing, mechanical and fuel-gas chapters come with it).
 * Unknown years are not refused: a rule cites the nearest known edition and says so.
 * Paths are relative to the editions object; `prefix` names where it sits in the request.
 */
export function editionConsistencyErrors(editions: Editions, prefix = 'editions'): FieldError[] {
  const errors: FieldError[] = [];
  const at = (slot: string) => (prefix ? `${prefix}.${slot}` : slot);
  const building = parseEdition(editions.building);
  for (const slot of slots) {
    const parsed = parseEdition(editions[slot]);
    if (!parsed) continue; // the format itself is the schema's to report
    const allowed = CODES_BY_SLOT[slot];
    if (!allowed.includes(parsed.code)) {
      errors.push({
        path: at(slot),
        message: `${parsed.code} is not a ${SLOT_NAMES[slot]} NookPass can cite; write ${allowed.join(', ')} with the year, e.g. ${EXAMPLES[slot]}.`,
      });
      continue;
    }
    if (slot === 'plumbing' && parsed.code !== editions.plumbingFamily) {
      errors.push({
        path: at('plumbing'),
        message: `${editions.plumbing} is a ${parsed.code} edition, but the plumbing family is ${editions.plumbingFamily}: choose the ${parsed.code} family, or write the ${editions.plumbingFamily} edition the jurisdiction adopted.`,
      });
      continue;
    }
    if (slot !== 'building' && parsed.code === 'IRC') {
      if (building?.code !== 'IRC') {
        errors.push({
          path: at(slot),
          message: `The ${SLOT_NAMES[slot]} names the IRC, but the building code is ${editions.building}: the IRC's chapters apply only where the IRC is adopted as the building code.`,
        });
      } else if (building.year !== parsed.year) {
        errors.push({
          path: at(slot),
          message: `The ${SLOT_NAMES[slot]} names IRC ${parsed.year}, but the building code is IRC ${building.year}: the IRC's chapters come from the one edition adopted, so write "IRC ${building.year}".`,
        });
      }
    }
  }
  return errors;
}
