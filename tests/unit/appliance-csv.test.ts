import { describe, expect, it } from 'vitest';
import { parseApplianceCsv, serializeApplianceCsv } from '@/lib/domain/appliances/csv';
import { filledValues } from '@/lib/domain/appliances/fill';
import { APPLIANCE_CSV_HEADER, applianceInputSchema, type ApplianceModel } from '@/lib/domain/appliances/model';

const header = APPLIANCE_CSV_HEADER.join(',');

function rows(text: string) {
  const r = parseApplianceCsv(text);
  if (!r.ok) throw new Error(JSON.stringify(r.errors));
  return r.rows;
}

describe('appliance CSV', () => {
  it('reads quoted cells, doubled quotes and a byte-order mark (RFC 4180 §2 rules 5–7)', () => {
    const [m] = rows(`\ufeff${header}\r\ndryer,"Demo ""Q"", 27 in",27,31,39,2.5,1,1,5.5,1,48,24,420,electric,vented,180,240,30\r\n`);
    expect(m).toMatchObject({ kind: 'dryer', label: 'Demo "Q", 27 in', widthIn: 27, closetVentTopSqIn: 48, maxExhaustLengthIn: 420, dryerType: 'vented', exhaustCfm: 180, volts: 240, amps: 30, line: 2 });
  });

  it('reads sizes with units: 686 mm is 27.0079 in (NIST SP 811: 1 in = 25.4 mm exactly)', () => {
    // A cell holding a double quote is quoted, the quote doubled (RFC 4180 §2 rule 7).
    const [m] = rows('kind,label,width_in,depth_in,height_in\nwasher,W,686 mm,"2\' 8""",39\n');
    expect(m.widthIn).toBeCloseTo(686 / 25.4, 9);
    expect(m.depthIn).toBe(32); // 2 ft 8 in = 32 in (1 ft = 12 in)
  });

  it('takes the columns in any order and empty cells as not given', () => {
    const [m] = rows('height_in,label,kind,depth_in,width_in,fuel\n39,W,washer,32,27,\n');
    expect(m).toMatchObject({ kind: 'washer', widthIn: 27, fuel: null, clearanceRearIn: null });
  });

  it('names the line and column of each bad cell, counting lines inside quoted cells', () => {
    const r = parseApplianceCsv('kind,label,width_in,depth_in,height_in,amps\nwasher,"two\nlines",27,32,39,15\ndryer,D,27,31,39,1.5\nwasher,W,0,32,39,\n');
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.errors.map((e) => [e.line, e.column, e.columnName])).toEqual([
      [2 + 1, 2, 'label'], // the label holds a line break: one line only
      [4, 6, 'amps'],
      [5, 3, 'width_in'],
    ]);
  });

  it('refuses an unknown or doubled column, a missing required one and a too-long row', () => {
    const unknown = parseApplianceCsv('kind,label,width_in,depth_in,height_in,colour\n');
    expect(!unknown.ok && unknown.errors[0]).toMatchObject({ line: 1, column: 6, columnName: 'colour' });
    const doubled = parseApplianceCsv('kind,label,width_in,depth_in,height_in,label\n');
    expect(!doubled.ok && doubled.errors[0]).toMatchObject({ line: 1, column: 6 });
    const missing = parseApplianceCsv('kind,label,width_in,depth_in\nwasher,W,27,32\n');
    expect(!missing.ok && missing.errors[0]).toMatchObject({ line: 1, columnName: 'height_in' });
    const long = parseApplianceCsv('kind,label,width_in,depth_in,height_in\nwasher,W,27,32,39,extra\n');
    expect(!long.ok && long.errors[0]).toMatchObject({ line: 2, column: 6 });
  });

  it('refuses the same kind and label twice in one file, and a file that is not CSV', () => {
    const twice = parseApplianceCsv('kind,label,width_in,depth_in,height_in\nwasher,W,27,32,39\nwasher,w,27,32,39\n');
    expect(!twice.ok && twice.errors[0]).toMatchObject({ line: 3, columnName: 'label' });
    const broken = parseApplianceCsv('kind,label,width_in,depth_in,height_in\nwasher,"W,27,32,39\n');
    expect(broken.ok).toBe(false);
    expect(parseApplianceCsv('').ok).toBe(false);
  });

  it('writes the documented header and reads its own output back unchanged', () => {
    const models = rows(`${header}\ndryer,"=SUM(A1)",27,31,39,2.5,1,1,5.5,1,48,24,420,gas,vented,180,120,15\nwasher,"Plain, comma",27,32.0078740157,39,,,,,,,,,,,,,\n`).map(({ line: _line, ...m }) => m);
    const text = serializeApplianceCsv(models);
    expect(text.split('\r\n')[0]).toBe(header);
    // A cell a spreadsheet would run as a formula is written with a leading apostrophe (CSV injection).
    expect(text).toContain("'=SUM(A1)");
    expect(rows(text).map(({ line: _line, ...m }) => m)).toEqual(models);
  });
});

describe('filling a plan from a model', () => {
  const model = {
    ...applianceInputSchema.parse({ kind: 'dryer', label: 'Demo D', widthIn: 27, depthIn: 31, heightIn: 39, clearanceRearIn: 5.5, closetVentTopSqIn: 48, fuel: 'gas', dryerType: 'vented', exhaustCfm: 180 }),
    id: '6f1c1e0e-4d2a-4b6f-9a53-2f6f3f1f0a11',
    isDemo: true,
    createdAt: new Date(),
    updatedAt: new Date(),
  } satisfies ApplianceModel;

  it('writes the figures in the plan’s units and records the model', () => {
    const imperial = Object.fromEntries(filledValues(model, 'dryer', 'imperial').map((v) => [v.path, v.value]));
    expect(imperial).toMatchObject({ 'dryer.model.id': model.id, 'dryer.model.label': 'Demo D', 'dryer.width': '27', 'dryer.clearances.rear': '5.5', 'dryer.fuel': 'gas', '_has.dryer_closetVent': 'present', 'dryer.closetVent.top': '48', 'dryer.closetVent.bottom': '' });
    const metric = Object.fromEntries(filledValues(model, 'dryer', 'metric').map((v) => [v.path, v.value]));
    expect(metric['dryer.width']).toBe('685.8'); // 27 in × 25.4 mm (NIST SP 811, exact)
    expect(metric['dryer.closetVent.top']).toBe('309.7'); // 48 sq in × 6.4516 cm² (NIST SP 811, exact)
  });

  it('writes the model’s rating into the receptacles that serve its slot, and only those', () => {
    // 240 V 30 A: a 14-30 dryer receptacle's rating (NEMA WD 6); 120 V 20 A: the laundry circuit (NEC 2020 210.11(C)(2)).
    const dryer = { ...model, volts: 240, amps: 30 };
    const receptacles = [{ serves: 'washer' }, { serves: 'dryer' }, { serves: 'both' }, null];
    const filled = Object.fromEntries(filledValues(dryer, 'dryer', 'imperial', receptacles).map((v) => [v.path, v.value]));
    expect(filled).toMatchObject({ 'electrical.receptacles.1.volts': '240', 'electrical.receptacles.1.amps': '30' });
    expect(Object.keys(filled).filter((p) => p.startsWith('electrical.'))).toEqual(['electrical.receptacles.1.volts', 'electrical.receptacles.1.amps']);

    const washer = { ...model, kind: 'washer' as const, volts: 120, amps: 20 };
    const forWasher = filledValues(washer, 'washer', 'metric', receptacles).filter((v) => v.path.startsWith('electrical.'));
    expect(forWasher).toEqual([{ path: 'electrical.receptacles.0.volts', value: '120' }, { path: 'electrical.receptacles.0.amps', value: '20' }]);

    // A combination unit also rates the receptacle that serves both; a model without a rating leaves receptacles alone.
    const combo = filledValues({ ...washer, kind: 'washer-dryer' as const }, 'washer', 'imperial', receptacles).map((v) => v.path);
    expect(combo).toContain('electrical.receptacles.2.volts');
    expect(filledValues({ ...dryer, volts: null, amps: null }, 'dryer', 'imperial', receptacles).some((v) => v.path.startsWith('electrical.'))).toBe(false);
  });

  it('fills a washer slot without a dryer’s figures', () => {
    const paths = filledValues(model, 'washer', 'imperial').map((v) => v.path);
    expect(paths).toContain('washer.width');
    expect(paths.some((p) => p.startsWith('dryer.'))).toBe(false);
  });
});
