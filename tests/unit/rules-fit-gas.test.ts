import { describe, expect, it } from 'vitest';
import { parsePlan } from '@/lib/domain/plan';
import { buildRuleSet } from '@/rules';
import { check, EDITIONS_2018, finding, findingFor, variant, type LoosePlan } from './support/check';

const gasDryer = (p: LoosePlan) => {
  p.dryer.fuel = 'gas';
  p.gas = { shutoffDistance: '4 ft', shutoffSameRoom: true, connectorLength: '4 ft' };
};

/** A gas dryer in a reach-in closet opening into a bedroom that meets the exception in every part. */
const dedicatedCloset = (p: LoosePlan) => {
  gasDryer(p);
  Object.assign(p.space, {
    kind: 'reach-in-closet',
    opensInto: 'bedroom',
    dedicatedToLaundry: true,
    door: { solid: true, weatherStripped: true, selfClosing: true },
  });
  p.gas.combustionAirFromOutdoors = true;
};

/** Only the sizes: units and enclosure known, no clearances, projections or anything else. */
const sizesOnly = (enclosure: Record<string, unknown>, arrangement: string) => ({
  units: 'imperial',
  arrangement,
  enclosure: { depthMeasured: 'inside', ...enclosure },
  washer: { width: 24, depth: 24, height: 34 },
  dryer: { width: 24, depth: 24, height: 34 },
});

describe('unknowns never hide an impossible fit', () => {
  it('two 24 in units side by side in 44-1/2 in fail even with no clearances given, which are asked for apart', async () => {
    // Compact units 24 in wide (TRADE.md unit sizes, S): 24 + 24 = 48 in > 44-1/2 in.
    const evaluation = await check(sizesOnly({ width: 44.5, depth: 30, height: 80 }, 'side-by-side'));
    const fit = finding(evaluation, 'fit.width');
    expect(fit.status).toBe('fail');
    expect(fit.message).toContain('3-1/2'); // 48 - 44-1/2 = 3-1/2 in short
    expect(fit.citation.code).toMatch(/physical fit/);
    const clearance = finding(evaluation, 'clearances.width');
    expect(clearance.status).toBe('needs-info');
    expect(clearance.missing).toEqual(expect.arrayContaining(['washer.clearances.side', 'dryer.clearances.side']));
  });

  it('a stacked pair in a 60 in tall enclosure fails; side by side it fits', async () => {
    // 34 + 34 = 68 in stacked (TRADE.md front-load heights, S).
    expect((await findingFor('fit.height', sizesOnly({ width: 60, depth: 30, height: 60 }, 'stacked'))).status).toBe('fail');
    expect((await findingFor('fit.height', sizesOnly({ width: 60, depth: 30, height: 60 }, 'side-by-side'))).status).toBe('pass');
  });

  it('depth fits on the cabinets when the knobs are not given, and counts them when they are', async () => {
    // 24 in cabinet in 25 in; with 2 in of knobs and door it is 26 in.
    expect((await findingFor('fit.depth', sizesOnly({ width: 60, depth: 25, height: 80 }, 'side-by-side'))).status).toBe('pass');
    const withKnobs = sizesOnly({ width: 60, depth: 25, height: 80 }, 'side-by-side') as LoosePlan;
    withKnobs.dryer.frontProjection = 2;
    expect((await findingFor('fit.depth', withKnobs)).status).toBe('fail');
  });
});

describe("maker's clearances fail, citing installation per the listing", () => {
  it('names the clearance that is short and by how much, and cites IRC M1307.1 for a dwelling', async () => {
    // 24 + 24 + three 1 in gaps = 51 in needed; 52-1/4 in outside less two 3/4 in panels = 50-3/4 in inside.
    const f = await findingFor('clearances.width', variant((p) => (p.enclosure.width = 52.25)));
    expect(f.status).toBe('fail');
    expect(f.message).toMatch(/side clearances are 1\/4" short/);
    expect(f.citation).toEqual({ code: 'IRC', edition: '2018', section: 'M1307.1' }); // IRC M1307.1 (TRADE.md S)
    expect(f.confidence).toBe('S');
  });

  it('cites G2408.1 too for a gas dryer, and the IMC / IFGC for other buildings', async () => {
    const gas = await findingFor('clearances.height', variant((p) => { gasDryer(p); p.enclosure.height = 35.7; }));
    expect(gas.citation).toEqual({ code: 'IRC', edition: '2018', section: 'M1307.1 and G2408.1' });
    const other = await findingFor('clearances.height', variant((p) => { p.space.buildingType = 'other'; p.enclosure.height = 35.7; }));
    expect(other.citation).toEqual({ code: 'IMC', edition: '2018', section: '304.1' }); // from memory
    expect(other.confidence).toBe('M');
    const otherGas = await findingFor('clearances.height', variant((p) => { gasDryer(p); p.space.buildingType = 'other'; p.enclosure.height = 35.7; }));
    expect(otherGas.citation).toEqual({ code: 'IFGC', edition: '2018', section: '305.1' }); // IFGC 305.1 (TRADE.md S)
  });
});

describe('units come out without removing permanent construction (IRC M1305.1)', () => {
  it('fails an opening narrower than the widest unit, and cautions one without the usual margin', async () => {
    const narrow = await check(variant((p) => (p.enclosure.openingWidth = 23.5))); // widest unit 24 in
    expect(finding(narrow, 'service.opening-width').status).toBe('fail');
    expect(finding(narrow, 'service.opening-width').message).toMatch(/is 1\/2" narrower than the widest unit/);
    expect(finding(narrow, 'service.opening-width').citation.section).toBe('M1305.1');
    const snug = await check(variant((p) => (p.enclosure.openingWidth = 24.5))); // 24 + 1 in margin, common practice
    expect(finding(snug, 'service.opening-width').status).toBe('pass');
    expect(finding(snug, 'service.removal-width').status).toBe('caution');
  });
});

describe('gas dryer location and its exception (IRC G2406.2 / IFGC 303.3)', () => {
  it('passes a closet opening into a bedroom that is dedicated, has a solid weather-stripped self-closing door and outdoor combustion air', async () => {
    const f = await findingFor('gas.location', variant(dedicatedCloset));
    expect(f.status, f.message).toBe('pass');
    expect(f.citation).toEqual({ code: 'IRC', edition: '2018', section: 'G2406.2' });
  });

  const parts: Array<[string, (p: LoosePlan) => void, RegExp]> = [
    ['used for storage too', (p) => (p.space.dedicatedToLaundry = false), /used for other purposes/],
    ['a louvred door', (p) => (p.space.door.solid = false), /not solid/],
    ['no weather-stripping', (p) => (p.space.door.weatherStripped = false), /not weather-stripped/],
    ['no self-closer', (p) => (p.space.door.selfClosing = false), /no self-closing device/],
    ['indoor combustion air', (p) => (p.gas.combustionAirFromOutdoors = false), /combustion air/],
  ];
  for (const [what, change, says] of parts) {
    it(`fails with ${what}`, async () => {
      const f = await findingFor('gas.location', variant((p) => { dedicatedCloset(p); change(p); }));
      expect(f.status).toBe('fail');
      expect(f.message).toMatch(says);
      expect(f.remedy).toBeTruthy();
    });
  }

  it('never lets a walk-in clothes closet qualify, whatever its door', async () => {
    const f = await findingFor('gas.location', variant((p) => { dedicatedCloset(p); p.space.kind = 'walk-in-closet'; }));
    expect(f.status).toBe('fail');
    expect(f.message).toMatch(/walk-in clothes closet/);
  });

  it('fails a gas dryer standing in a bedroom itself', async () => {
    expect((await findingFor('gas.location', variant((p) => { dedicatedCloset(p); p.space.kind = 'bedroom'; }))).status).toBe('fail');
  });

  it('asks for the exception’s parts when they are not given, and only then', async () => {
    const f = await findingFor('gas.location', variant((p) => { gasDryer(p); p.space.opensInto = 'bedroom'; }));
    expect(f.status).toBe('needs-info');
    expect(f.missing).toEqual(['space.dedicatedToLaundry', 'space.door.solid', 'space.door.weatherStripped', 'space.door.selfClosing', 'gas.combustionAirFromOutdoors']);
    expect((await findingFor('gas.location', variant(gasDryer))).status).toBe('pass'); // opens into a hallway
  });
});

describe('which code a finding cites depends on the building', () => {
  it('cites the IRC fuel-gas chapter for a dwelling and the adopted IFGC otherwise', async () => {
    const dwelling = await check(variant(gasDryer));
    expect(finding(dwelling, 'gas.shutoff').citation).toEqual({ code: 'IRC', edition: '2018', section: 'G2420.5.1' });
    expect(finding(dwelling, 'gas.connector-length').citation).toEqual({ code: 'IRC', edition: '2018', section: 'G2422.1.2.1' });
    expect(finding(dwelling, 'gas.makeup-air').citation).toEqual({ code: 'IRC', edition: '2018', section: 'G2439.5' });
    expect(finding(dwelling, 'gas.makeup-air').confidence).toBe('M'); // from memory (TRADE.md)
    const other = await check(variant((p) => { gasDryer(p); p.space.buildingType = 'other'; }));
    expect(finding(other, 'gas.shutoff').citation).toEqual({ code: 'IFGC', edition: '2018', section: '409.5.1' });
    expect(finding(other, 'gas.location').citation).toEqual({ code: 'IFGC', edition: '2018', section: '303.3' });
  });

  it('keeps the IFGC where the jurisdiction did not adopt the IRC as its building code', async () => {
    const f = await findingFor('gas.shutoff', variant(gasDryer), { ...EDITIONS_2018, building: 'IBC 2018' });
    expect(f.citation).toEqual({ code: 'IFGC', edition: '2018', section: '409.5.1' });
  });

  it('checks the 100 sq in closet opening for every dryer and says which adopted code it comes from', async () => {
    // IMC 2018 504.6: at least 100 sq in.
    const electric = await findingFor('makeup-air.closet-opening', variant());
    expect(electric.status).toBe('pass');
    expect(electric.citation).toEqual({ code: 'IMC', edition: '2018', section: '504.6' });
    expect(electric.citationNote).toMatch(/comes from the adopted mechanical code \(IMC 2018 504\.6\)/);
    expect(electric.citationNote).toMatch(/IRC governs one- and two-family dwellings/);
    const other = await findingFor('makeup-air.closet-opening', variant((p) => (p.space.buildingType = 'other')));
    expect(other.citationNote).toBe('The 100 sq in closet opening comes from the adopted mechanical code (IMC 2018 504.6).');
  });

  it('shows an admin’s re-citation for every plan, and a stored rule without variants as stored', async () => {
    const overridden = buildRuleSet(EDITIONS_2018, { rules: { 'gas.shutoff': { citation: { code: 'local amendment', edition: '2020', section: '12-4' } } } });
    expect(overridden.rules.find((r) => r.key === 'gas.shutoff')!.citationVariants).toBeUndefined();
    const built = buildRuleSet(EDITIONS_2018);
    const shutoff = built.rules.find((r) => r.key === 'gas.shutoff')!;
    expect(shutoff.citation).toEqual({ code: 'IFGC', edition: '2018', section: '409.5.1' });
    expect(shutoff.citationVariants?.variants[0].citation).toEqual({ code: 'IRC', edition: '2018', section: 'G2420.5.1' });
  });
});

describe('bad input names the field', () => {
  it('refuses wrong types and unknown values on the new fields', () => {
    const parsed = parsePlan(variant((p) => {
      p.space.buildingType = 'house';
      p.space.dedicatedToLaundry = 'yes';
      p.space.door = { solid: 1, latch: true };
      p.gas = { combustionAirFromOutdoors: 'true' };
    }));
    expect(parsed.ok).toBe(false);
    if (parsed.ok) return;
    expect(parsed.errors.map((e) => e.path).sort()).toEqual(
      ['gas.combustionAirFromOutdoors', 'space.buildingType', 'space.dedicatedToLaundry', 'space.door.latch', 'space.door.solid'].sort(),
    );
  });
});
