import { describe, expect, it } from 'vitest';
import { editionConsistencyErrors } from '@/lib/domain/edition-consistency';
import type { Editions } from '@/lib/domain/editions';
import { jurisdictionCreateSchema, jurisdictionUpdateSchema } from '@/lib/domain/rule-sets/jurisdiction-schema';

// A consistent set: the 2021 I-codes with NEC 2023 (editions as TRADE.md cites them).
const icodes: Editions = { building: 'IRC 2021', electrical: 'NEC 2023', plumbing: 'IPC 2021', plumbingFamily: 'IPC', mechanical: 'IMC 2021', fuelGas: 'IFGC 2021' };

const paths = (e: Editions) => editionConsistencyErrors(e).map((x) => x.path);

describe('adopted editions fit together', () => {
  it('accepts I-code, UPC and all-IRC jurisdictions', () => {
    expect(editionConsistencyErrors(icodes)).toEqual([]);
    // UPC 804.1 is the UPC's standpipe section (TRADE.md, plumbing): a UPC family names a UPC edition.
    expect(editionConsistencyErrors({ ...icodes, plumbing: 'UPC 2021', plumbingFamily: 'UPC' })).toEqual([]);
    // IRC P2706.2, M1502 and G2406.2 are chapters of the one IRC book (TRADE.md).
    expect(editionConsistencyErrors({ ...icodes, plumbing: 'IRC 2021', plumbingFamily: 'IRC', mechanical: 'IRC 2021', fuelGas: 'IRC 2021' })).toEqual([]);
  });

  it('refuses a plumbing edition of another family, naming the plumbing field', () => {
    // UPC 804.1 allows 18–30 in, IPC/IRC 18–42 in (TRADE.md, plumbing, S): a mismatch would cite one with the other's limits.
    const errors = editionConsistencyErrors({ ...icodes, plumbing: 'UPC 2024', plumbingFamily: 'IPC' });
    expect(errors).toHaveLength(1);
    expect(errors[0].path).toBe('editions.plumbing');
    expect(errors[0].message).toMatch(/UPC 2024 is a UPC edition, but the plumbing family is IPC/);
    expect(paths({ ...icodes, plumbing: 'IPC 2021', plumbingFamily: 'UPC' })).toEqual(['editions.plumbing']);
    expect(paths({ ...icodes, plumbing: 'IPC 2021', plumbingFamily: 'IRC' })).toEqual(['editions.plumbing']);
  });

  it('refuses a code in the wrong slot', () => {
    expect(paths({ ...icodes, building: 'NEC 2023' })).toEqual(['editions.building']);
    expect(paths({ ...icodes, electrical: 'IRC 2021' })).toEqual(['editions.electrical']);
    // The catalog cites the IMC or the IRC's M15 for dryer exhaust (TRADE.md, dryer exhaust): not the IPC.
    expect(paths({ ...icodes, mechanical: 'IPC 2021' })).toEqual(['editions.mechanical']);
    expect(paths({ ...icodes, fuelGas: 'IMC 2021' })).toEqual(['editions.fuelGas']);
    expect(editionConsistencyErrors({ ...icodes, fuelGas: 'NEC 2023' })[0].message).toMatch(/IFGC, IRC/);
  });

  it('cites the IRC chapters only from the IRC edition adopted as the building code', () => {
    expect(paths({ ...icodes, mechanical: 'IRC 2018' })).toEqual(['editions.mechanical']);
    expect(paths({ ...icodes, fuelGas: 'IRC 2018' })).toEqual(['editions.fuelGas']);
    expect(paths({ ...icodes, building: 'IBC 2021', plumbing: 'IRC 2021', plumbingFamily: 'IRC' })).toEqual(['editions.plumbing']);
  });

  it('leaves unknown years to the nearest-edition citation, not a refusal', () => {
    expect(editionConsistencyErrors({ ...icodes, building: 'IRC 2027', mechanical: 'IMC 2027' })).toEqual([]);
  });

  it('is applied by the create and edit schemas the route handlers and the admin form share', () => {
    const create = jurisdictionCreateSchema.safeParse({
      slug: 'x-town', name: 'X', region: 'Demo', inspectorEmail: null, amendmentNotes: '', startFrom: 'baseline',
      editions: { ...icodes, plumbing: 'UPC 2024', plumbingFamily: 'IPC' },
    });
    expect(create.success).toBe(false);
    expect(create.error!.issues.map((i) => i.path.join('.'))).toEqual(['editions.plumbing']);
    const edit = jurisdictionUpdateSchema.safeParse({ editions: { ...icodes, electrical: 'IRC 2021' } });
    expect(edit.error!.issues.map((i) => i.path.join('.'))).toEqual(['editions.electrical']);
    expect(jurisdictionUpdateSchema.safeParse({ name: 'Only the name' }).success).toBe(true);
  });
});
