import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { drawPlan } from '@/lib/domain/drawing';
import { computeFactsWithMissing, factCatalog } from '@/lib/domain/facts';
import { defaultParameters } from '@/lib/domain/params';
import {
  editorSections,
  entryAt,
  isAreaPath,
  labelForPath,
  MAX_DOORS,
  MAX_EXHAUST_RUN_PIECES,
  MAX_HINGES_PER_DOOR,
  MAX_MAKEUP_AIR_OPENINGS,
  MAX_RECEPTACLES,
  parsePlan,
  PLAN_LIST_LIMITS,
  planInputSchema,
  registryEntries,
} from '@/lib/domain/plan';
import { demoPlans } from '@/tests/fixtures/plans';

// The public JSON Schema (GET /api/schema/plan) as the plan schema produced it before the field registry;
// integrators build against it, so deriving the schema from the registry must not change it.
const published = JSON.parse(readFileSync('tests/fixtures/schema/plan-input.schema.json', 'utf8'));

describe('plan JSON Schema', () => {
  it('is the published one', () => {
    // Property order may differ (the dryer's fuel comes first, as the editor asks it); the content may not.
    expect(z.toJSONSchema(planInputSchema, { io: 'input', unrepresentable: 'any' })).toEqual(published);
  });
});

describe('the field registry', () => {
  const params = defaultParameters({ building: 'IRC 2021', electrical: 'NEC 2023', plumbing: 'IPC 2021', plumbingFamily: 'IPC', mechanical: 'IMC 2021', fuelGas: 'IFGC 2021' });
  const plans: unknown[] = [
    { units: 'imperial' },
    { units: 'imperial', dryer: { fuel: 'gas' }, gas: {}, doors: [{}], electrical: { receptacles: [{ serves: 'washer' }, { serves: 'dryer' }] }, makeupAir: { openings: [{}] }, plumbing: { drainPan: {} }, enclosure: { toeKick: {} }, exhaust: { boosterFan: {}, fastenersIntoAirstream: true, concealed: true } },
    ...demoPlans.map((d) => d.plan),
  ];

  it('has every field a fact is computed from', () => {
    const unknown = factCatalog.flatMap((f) => f.planPaths.filter((p) => !entryAt(p)).map((p) => `${f.name}: ${p}`));
    expect(unknown).toEqual([]);
  });

  it('has every field a fact or a drawing names as missing', () => {
    const named = new Set<string>();
    for (const input of plans) {
      const parsed = parsePlan(input);
      if (!parsed.ok) throw new Error(JSON.stringify(parsed.errors));
      Object.values(computeFactsWithMissing(parsed.plan, params).missing).flat().forEach((p) => named.add(p));
      const drawn = drawPlan(parsed.plan, { params });
      if (drawn.ok) Object.values(drawn.drawings).flat().forEach((d) => (d as { missing?: string[] })?.missing?.forEach((p) => named.add(p)));
    }
    expect(named.size).toBeGreaterThan(20);
    expect([...named].filter((p) => !entryAt(p))).toEqual([]);
  });

  it('names list items by their item names, counted from 1', () => {
    expect(labelForPath('doors.0.hinges.1')).toBe('Door 1, hinge 2');
    expect(labelForPath('exhaust.run.2')).toBe('Exhaust piece 3');
    expect(labelForPath('electrical.receptacles.1.volts')).toBe('Receptacle 2, voltage');
    expect(labelForPath('makeupAir.openings.0.netFreeArea')).toBe('Opening 1, net free area');
    for (const { path } of registryEntries) expect(labelForPath(path.replace(/\*/g, '0'))).not.toMatch(/\bitem\b/);
  });

  it('names fields by their editor labels, qualified where a label alone is ambiguous', () => {
    expect(labelForPath('exhaust.thickness')).toBe('Duct wall thickness');
    expect(labelForPath('exhaust.material')).toBe('Duct material');
    expect(labelForPath('enclosure.depth')).toBe('Enclosure depth');
    expect(labelForPath('washer.width')).toBe('Washer width');
    expect(labelForPath('dryer.clearances.side')).toBe('Dryer maker’s side clearance');
    const names = registryEntries.filter((e) => !e.path.includes('*')).map((e) => labelForPath(e.path));
    expect(names.length - new Set(names).size).toBe(0);
  });

  it('labels fields in messages as before, list items by number', () => {
    expect(labelForPath('exhaust.run.2.straight')).toBe('Exhaust piece 3, straight length');
    expect(labelForPath('doors.0.hinges')).toBe('Door 1, hinge positions');
    expect(labelForPath('enclosure.colour')).toBe('Enclosure colour');
    expect(labelForPath('')).toBe('Value');
  });

  it('knows which fields are areas', () => {
    expect(['makeupAir.openings.3.netFreeArea', 'dryer.closetVent.top', 'dryer.closetVent.bottom'].map(isAreaPath)).toEqual([true, true, true]);
    expect(['enclosure.width', 'exhaust.run.0.straight', 'doors.0.hinges.1', 'nothing'].map(isAreaPath)).toEqual([false, false, false, false]);
  });

  it('gives every list its limit, outer lists first', () => {
    expect(PLAN_LIST_LIMITS.map((l) => [l.path, l.max])).toEqual([
      ['doors', MAX_DOORS],
      ['doors.*.hinges', MAX_HINGES_PER_DOOR],
      ['exhaust.run', MAX_EXHAUST_RUN_PIECES],
      ['makeupAir.openings', MAX_MAKEUP_AIR_OPENINGS],
      ['electrical.receptacles', MAX_RECEPTACLES],
    ]);
  });

  it('puts every field in exactly one editor section, lists included', () => {
    const shown = editorSections.flatMap((s) => [
      ...s.fields.map((f) => (f.kind === 'presence' ? f.group! : f.path)),
      ...s.lists.flatMap((l) => [l.path, ...l.fields.map((f) => `${l.path}.*.${f.path}`)]),
    ]);
    expect(new Set(shown).size).toBe(shown.length);
    const leaves = registryEntries.filter((e) => e.entry.kind !== 'group' && !e.path.endsWith('*')).map((e) => e.path);
    expect(leaves.filter((p) => !shown.includes(p))).toEqual([]);
  });

  it('writes every help text as a sentence and gives every editor field a label', () => {
    for (const { path, entry } of registryEntries) {
      expect(entry.help, path).toMatch(/^[A-Z].*\.$/);
      if (entry.kind !== 'group' && !path.endsWith('*')) expect(entry.label, path).toBeTruthy();
    }
  });
});
