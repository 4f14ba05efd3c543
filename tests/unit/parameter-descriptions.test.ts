import { describe, expect, it } from 'vitest';
import { defaultParameters, ruleSetParametersSchema } from '@/lib/domain/params';
import { describeParameter, describeParameterChanges, sameParameterValue, parameterChangeLine, parameterDescriptions, parameterValueText } from '@/lib/domain/params/describe';
import { fieldsOf, leafFields } from '@/lib/domain/rule-sets/form-schema';
import type { Editions } from '@/lib/domain/editions';

const city: Editions = { building: 'IRC 2021', electrical: 'NEC 2023', plumbing: 'IPC 2021', plumbingFamily: 'IPC', mechanical: 'IMC 2021', fuelGas: 'IFGC 2021' };
const county: Editions = { building: 'IRC 2015', electrical: 'NEC 2017', plumbing: 'UPC 2018', plumbingFamily: 'UPC', mechanical: 'IMC 2015', fuelGas: 'IFGC 2015' };

// What must never reach an admin's screen: a dotted key, a JSON null, a machine-length decimal.
const DOTTED_KEY = /\b[a-z]+[A-Za-z]*\.[a-z][A-Za-z-]*\b/;
const LONG_DECIMAL = /\d\.\d{4,}/;
const NULL_WORD = /\bnull\b|\bundefined\b|NaN/;

function expectTradeSpeech(line: string) {
  expect(line, line).not.toMatch(DOTTED_KEY);
  expect(line, line).not.toMatch(LONG_DECIMAL);
  expect(line, line).not.toMatch(NULL_WORD);
}

describe('parameter descriptions', () => {
  const schemaPaths = leafFields(fieldsOf(ruleSetParametersSchema)).map((f) => f.path);

  it('gives every parameter of the schema a label and a unit, and describes nothing the schema lacks', () => {
    for (const path of schemaPaths) {
      const d = describeParameter(path);
      expect(d, path).not.toBeNull();
      expect(d!.label.trim().length, path).toBeGreaterThan(3);
      expect(d!.label, path).not.toMatch(DOTTED_KEY);
      expect(d!.unit, path).toBeTruthy();
    }
    expect(Object.keys(parameterDescriptions).sort()).toEqual([...schemaPaths].sort());
  });

  it('names every choice of every enumerated parameter', () => {
    const fields = leafFields(fieldsOf(ruleSetParametersSchema));
    for (const f of fields) {
      if (f.kind !== 'enum') continue;
      for (const option of f.options) expect(describeParameter(f.path)?.choices?.[option], `${f.path}: ${option}`).toBeTruthy();
    }
  });

  it('reads values in the trade: feet and inches, gauge thickness, "not set"', () => {
    // IRC 2021 M1502.4.6.1: 35 ft maximum developed length.
    expect(parameterValueText('exhaust.maxDevelopedLengthIn', 420)).toBe(`35' 0"`);
    // IRC 2021 M1502.4.1: 0.0157 in (0.4 mm) minimum duct wall thickness.
    expect(parameterValueText('exhaust.minDuctThicknessIn', 0.0157)).toBe('15.7 thousandths of an inch (0.4 mm)');
    // IRC M1502.4.1: 4 in nominal diameter.
    expect(parameterValueText('exhaust.nominalDiameterIn', 4)).toBe('4"');
    expect(parameterValueText('exhaust.maxSupportSpacingIn', null)).toBe('not set');
    // IRC 2018 M1502.3: 12.5 sq in terminal opening.
    expect(parameterValueText('exhaust.minTerminalOpeningSqIn', 12.5)).toBe('12.5 sq in');
    // Hinge makers' chart of 1000 mm = 39.37 in doors, common practice, no published source.
    expect(parameterValueText('doors.hingeCountChart', defaultParameters(city).doors.hingeCountChart)).toMatch(/^2 hinges up to 3' 3-3\/8"; 3 hinges up to/);
  });

  it('says a changed maximum developed length as "Maximum developed length 30\' 0" → 32\' 0""', () => {
    const from = defaultParameters(city);
    const to = { ...from, exhaust: { ...from.exhaust, maxDevelopedLengthIn: 384 } };
    const base = { ...from, exhaust: { ...from.exhaust, maxDevelopedLengthIn: 360 } };
    const changes = describeParameterChanges(base, to);
    expect(changes.map(parameterChangeLine)).toEqual([`Maximum developed length 30' 0" → 32' 0"`]);
  });

  it('writes every line of a diff between two editions without keys, nulls or long decimals', () => {
    const from = defaultParameters(county);
    const to = {
      ...defaultParameters(city),
      exhaust: { ...defaultParameters(city).exhaust, terminationClearanceIn: null },
      amendments: [{ parameter: 'exhaust.terminationClearanceIn', citation: 'Ord. 7 §1 (test)' }],
    };
    const lines = describeParameterChanges(from, to).map(parameterChangeLine);
    // County (IRC 2015) and city (IRC 2021) differ at least in thickness, label trigger, booster fans, GFCI scope.
    expect(lines.length).toBeGreaterThanOrEqual(4);
    expect(lines.some((l) => l.startsWith('Minimum clearance from the terminal to openings into the building 3\' 0" → not set'))).toBe(true);
    expect(lines.some((l) => l.startsWith('Local amendments cited none → Minimum clearance from the terminal'))).toBe(true);
    lines.forEach(expectTradeSpeech);
    // And every parameter's model value alone reads cleanly.
    for (const path of Object.keys(parameterDescriptions)) {
      const value = path.split('.').reduce<unknown>((v, k) => (v as Record<string, unknown> | undefined)?.[k], to);
      expectTradeSpeech(`${describeParameter(path)!.label} ${parameterValueText(path, value)}`);
    }
  });
});

describe('parameters diff and stored figures', () => {
  it('reports no change for a version read back from the database, whose keys come in another order', () => {
    const model = defaultParameters(city);
    // PostgreSQL jsonb stores object keys sorted by length, then bytes (PostgreSQL docs, 8.14 JSON Types).
    const stored = { ...model, doors: { ...model.doors, hingeCountChart: model.doors.hingeCountChart.map((r) => ({ hinges: r.hinges, maxDoorHeightIn: r.maxDoorHeightIn })) } };
    expect(describeParameterChanges(model, stored)).toEqual([]);
  });

  it('takes a figure entered to four decimals as the model value it rounds from', () => {
    // 1000 mm = 39.37007874 in (1 in = 25.4 mm exactly, NIST SP 811); the form shows 39.3701.
    expect(sameParameterValue(39.3701, defaultParameters(city).doors.hingeCountChart[0].maxDoorHeightIn)).toBe(true);
    // IRC 2021 M1502.4.1: 0.0157 in, not IRC 2015's 0.016 in.
    expect(sameParameterValue(0.0157, 0.016)).toBe(false);
  });
});
