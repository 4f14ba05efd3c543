import { describe, expect, it } from 'vitest';
import { citationMismatches } from '@/lib/domain/rule-sets/citations';
import { diffRuleSets, diffValues, isEmptyDiff } from '@/lib/domain/rule-sets/diff';
import { outcomeOf as outcomeFor } from '@/lib/domain/checks/outcome';
import { compareFindingSets, summarizeComparisons } from '@/lib/domain/rule-sets/dry-run';
import { fieldsOf, leafFields, readPath } from '@/lib/domain/rule-sets/form-schema';
import { publishErrors } from '@/lib/domain/rule-sets/publish-check';
import { parseRuleInput, ruleToInput } from '@/lib/domain/rule-sets/rule-input';
import { stableStringify } from '@/lib/domain/rule-sets/stable-json';
import { evaluate } from '@/lib/domain/engine';
import { ruleSetParametersSchema } from '@/lib/domain/params';
import { parsePlan } from '@/lib/domain/plan';
import { buildRuleSet } from '@/rules';
import { hallClosetPassPlan } from '@/tests/fixtures/plans';

const county = { building: 'IRC 2018', electrical: 'NEC 2017', plumbing: 'IPC 2018', plumbingFamily: 'IPC', mechanical: 'IMC 2018', fuelGas: 'IFGC 2018' } as const;
const city = { building: 'IRC 2021', electrical: 'NEC 2023', plumbing: 'UPC 2021', plumbingFamily: 'UPC', mechanical: 'IMC 2021', fuelGas: 'IFGC 2021' } as const;
const FT = 12;

function leafPaths(value: unknown, base = ''): string[] {
  if (value && typeof value === 'object' && !Array.isArray(value)) {
    return Object.entries(value).flatMap(([k, v]) => leafPaths(v, base ? `${base}.${k}` : k));
  }
  return [base];
}

describe('parameters form generated from the zod schema', () => {
  const fields = leafFields(fieldsOf(ruleSetParametersSchema));
  const byPath = new Map(fields.map((f) => [f.path, f]));

  it('has one field for every parameter, arrays as rows', () => {
    const params = buildRuleSet(county).parameters;
    expect(fields.map((f) => f.path).sort()).toEqual(leafPaths(params).sort());
    for (const f of fields) expect(readPath(params, f.path), f.path).not.toBeUndefined();
  });

  it('labels fields from their descriptions and reads the unit from them', () => {
    expect(byPath.get('exhaust.maxDevelopedLengthIn')).toMatchObject({
      kind: 'number',
      unit: 'in',
      nullable: false,
      label: 'Maximum developed length of the exhaust duct, transition duct not counted',
      min: 0,
    });
    expect(byPath.get('makeupAir.closetOpeningMinSqIn')).toMatchObject({ kind: 'number', unit: 'sq in' });
    expect(byPath.get('exhaust.terminationClearanceIn')).toMatchObject({ kind: 'number', nullable: true, unit: 'in' });
    expect(byPath.get('plumbing.drainPanPolicy')).toMatchObject({ kind: 'enum', options: ['never', 'over-finished-space', 'always'] });
    expect(byPath.get('plumbing.drainPanSection')).toMatchObject({ kind: 'text', nullable: true });
    expect(byPath.get('exhaust.allowManufacturerLength')).toMatchObject({ kind: 'boolean' });
    const chart = byPath.get('doors.hingeCountChart');
    expect(chart?.kind).toBe('rows');
    if (chart?.kind === 'rows') expect(chart.row.map((c) => [c.path, c.kind, c.kind === 'number' && c.integer])).toEqual([['maxDoorHeightIn', 'number', false], ['hinges', 'number', true]]);
    // IRC Table M1502.4.6.1 lists eight fittings; each gets a field.
    expect(fields.filter((f) => f.path.startsWith('exhaust.fittingEquivalentsIn.'))).toHaveLength(8);
  });
});

describe('rule editor input', () => {
  it('round-trips every baseline rule through the editor’s text form unchanged', () => {
    for (const editions of [county, city]) {
      for (const rule of buildRuleSet(editions).rules) {
        const parsed = parseRuleInput(ruleToInput(rule));
        expect(parsed.ok, rule.key).toBe(true);
        if (parsed.ok) expect(stableStringify(parsed.rule), rule.key).toBe(stableStringify(rule));
      }
    }
  });

  it('puts bad JSON, unknown facts, parameters and operators at their field paths', () => {
    const rule = buildRuleSet(county).rules.find((r) => r.key === 'exhaust.developed-length')!;
    const text = ruleToInput(rule);
    const bad = parseRuleInput({ ...text, conditions: '{"name": "x", "all": [' });
    expect(bad).toMatchObject({ ok: false, errors: [{ path: 'rule.conditions', message: expect.stringMatching(/^Not valid JSON/) }] });
    const unknown = parseRuleInput({ ...text, conditions: JSON.stringify({ name: 'a', all: [{ name: 'b', fact: 'exhaust.nope', operator: 'lessThan', value: 1 }] }) });
    expect(unknown.ok === false && unknown.errors).toContainEqual({ path: 'rule.conditions.all.0.fact', message: "Unknown fact 'exhaust.nope'." });
    const param = parseRuleInput({ ...text, limit: '{"fact":"params","path":"$.exhaust.nope"}' });
    expect(param.ok === false && param.errors).toContainEqual({ path: 'rule.limit', message: "Unknown parameter '$.exhaust.nope'." });
    const op = parseRuleInput({ ...text, conditions: JSON.stringify({ name: 'a', all: [{ name: 'b', fact: 'exhaust.material', operator: 'lessThan', value: 'rigid-metal' }] }), requires: 'exhaust.material' });
    expect(op.ok === false && op.errors.map((e) => e.path)).toContain('rule.conditions.all.0.operator');
    const unlisted = parseRuleInput({ ...text, requires: '' });
    expect(unlisted.ok === false && unlisted.errors.map((e) => e.path)).toContain('rule.requires');
  });

  it('reads a plain-text limit as a value and text that looks like JSON as JSON', () => {
    const rule = buildRuleSet(county).rules.find((r) => r.key === 'exhaust.material')!;
    const plain = parseRuleInput({ ...ruleToInput(rule), limit: 'rigid-metal' });
    expect(plain.ok && plain.rule.limit).toBe('rigid-metal');
    const broken = parseRuleInput({ ...ruleToInput(rule), limit: '{"fact": ' });
    expect(broken.ok === false && broken.errors[0].path).toBe('rule.limit');
  });
});

describe('diff of two versions', () => {
  it('finds the renumbered length section and the edition parameters between IRC 2018 and IRC 2021', () => {
    const diff = diffRuleSets(buildRuleSet(county), buildRuleSet(city));
    expect(diff.parameters).toContainEqual({ path: 'editions.building', from: 'IRC 2018', to: 'IRC 2021' });
    const length = diff.rules.changed.find((c) => c.key === 'exhaust.developed-length');
    // IRC 2018 M1502.4.5.1 became IRC 2021 M1502.4.6.1 (same 35 ft rule, renumbered).
    expect(length?.fields.map((f) => f.path)).toEqual(['citation.edition', 'citation.section', 'citationVariants']);
    expect(length?.fields.slice(0, 2)).toEqual([
      { path: 'citation.edition', from: '2018', to: '2021' },
      { path: 'citation.section', from: 'M1502.4.5.1', to: 'M1502.4.6.1' },
    ]);
    // The maker's-length clause moved with it: IRC 2018 M1502.4.5.2 became IRC 2021 M1502.4.6.2 (TRADE.md S).
    type Variants = { variants: Array<{ when: Record<string, unknown>; citation: { section: string } }> };
    const makers = (v: unknown) => (v as Variants).variants.find((x) => x.when['exhaust.allowedLengthSource'] === 'manufacturer')!.citation.section;
    const variants = length!.fields[2];
    expect([makers(variants.from), makers(variants.to)]).toEqual(['M1502.4.5.2', 'M1502.4.6.2']);
    expect(diff.rules.added).toEqual([]);
    expect(diff.rules.removed).toEqual([]);
  });

  it('reports added, removed and disabled rules, and ignores key order', () => {
    const a = buildRuleSet(county);
    const [first, ...rest] = a.rules;
    const reordered = JSON.parse(JSON.stringify(a.rules.map((r) => Object.fromEntries(Object.entries(r).reverse()))));
    expect(isEmptyDiff(diffRuleSets(a, { parameters: a.parameters, rules: reordered }))).toBe(true);
    const local = { ...first, key: 'local.extra', title: 'Local extra' };
    const b = { parameters: { ...a.parameters, exhaust: { ...a.parameters.exhaust, maxDevelopedLengthIn: 20 * FT } }, rules: [...rest.map((r, i) => (i === 0 ? { ...r, enabled: false } : r)), local] };
    const diff = diffRuleSets(a, b);
    expect(diff.parameters).toEqual([{ path: 'exhaust.maxDevelopedLengthIn', from: 35 * FT, to: 20 * FT }]);
    expect(diff.rules.added.map((r) => r.key)).toEqual(['local.extra']);
    expect(diff.rules.removed.map((r) => r.key)).toEqual([first.key]);
    expect(diff.rules.changed).toEqual([{ key: rest[0].key, title: rest[0].title, fields: [{ path: 'enabled', from: true, to: false }] }]);
    expect(diff.rules.unchanged).toBe(rest.length - 1);
  });

  it('compares arrays whole', () => {
    expect(diffValues({ a: [1, 2] }, { a: [1, 2, 3] })).toEqual([{ path: 'a', from: [1, 2], to: [1, 2, 3] }]);
  });
});

describe('dry-run comparison', () => {
  it('flips the hall-closet plan’s developed length to fail under a 20 ft local limit', async () => {
    const parsed = parsePlan(hallClosetPassPlan);
    if (!parsed.ok) throw new Error('fixture does not parse');
    const published = buildRuleSet(county);
    const amended = buildRuleSet(county, { parameters: { exhaust: { maxDevelopedLengthIn: 20 * FT } } });
    const before = await evaluate({ jurisdiction: 't', version: 1, ...published }, parsed.plan);
    const after = await evaluate({ jurisdiction: 't', version: 2, ...amended }, parsed.plan);
    const changes = compareFindingSets(before.findings, after.findings);
    // 24 in + 5 ft (mitered 90°) + 12 ft + 1 ft 9 in (6-in smooth 90°) + 1 ft 6 in = 22 ft 3 in, IRC Table M1502.4.5.1.
    expect(changes.map((c) => c.ruleKey)).toEqual(['exhaust.developed-length', 'exhaust.length-label']);
    expect(changes[0]).toEqual(
      {
        ruleKey: 'exhaust.developed-length',
        title: 'Exhaust duct developed length',
        area: 'exhaust',
        statusChanged: true,
        from: { status: 'pass', measured: `22' 3"`, limit: `35' 0"`, citation: 'IRC 2018 M1502.4.5.1' }, // IRC 2018 M1502.4.5.1: 35 ft
        to: { status: 'fail', measured: `22' 3"`, limit: `20' 0"`, citation: 'IRC 2018 M1502.4.5.1' },
      },
    );
    // IRC 2018 M1502.4.6: the length label is required only where the length exceeds the maximum,
    // so the label rule now applies (and the plan's label passes it).
    expect(changes[1]).toMatchObject({ statusChanged: true, from: { status: 'not-applicable' }, to: { status: 'pass' } });
    expect(outcomeFor(after.summary)).toBe('fail');
    expect(compareFindingSets(before.findings, before.findings)).toEqual([]);
  });

  it('counts rules that appear or disappear as changes, status changes first', () => {
    const f = (ruleKey: string, status: 'pass' | 'fail', limit = '1"') =>
      ({ ruleKey, title: ruleKey, area: 'exhaust', status, display: { measured: null, limit }, citation: { code: 'IRC', edition: '2018', section: 'X' } }) as never;
    const changes = compareFindingSets([f('a', 'pass'), f('b', 'pass')], [f('a', 'pass', '2"'), f('c', 'fail')]);
    expect(changes.map((c) => [c.ruleKey, c.statusChanged])).toEqual([['c', true], ['b', true], ['a', false]]);
    const totals = summarizeComparisons([
      { kind: 'project', id: '1', name: 'p', detail: '', before: { outcome: 'pass', summary: {} as never }, after: { outcome: 'fail', summary: {} as never }, changes, error: null },
      { kind: 'project', id: '2', name: 'q', detail: '', before: null, after: null, changes: [], error: 'x' },
    ]);
    expect(totals).toEqual({ subjects: 2, changed: 1, detailOnly: 0, newlyFailing: 1, newlyPassing: 0, errors: 1 });
  });
});

describe('publish checks and citations', () => {
  it('accepts a baseline rule set and refuses duplicate keys or no enabled rule', () => {
    const built = buildRuleSet(city);
    expect(publishErrors(built)).toEqual([]);
    const dup = { ...built, rules: [...built.rules, built.rules[0]] };
    expect(publishErrors(dup).map((e) => e.path)).toEqual([`rules.${built.rules.length}.key`]);
    const off = { ...built, rules: built.rules.map((r) => ({ ...r, enabled: false })) };
    expect(publishErrors(off).map((e) => e.path)).toEqual(['rules']);
  });

  it('finds no edition mismatch in a baseline, and flags IRC 2021 citations in an IRC 2018 jurisdiction', () => {
    expect(citationMismatches(buildRuleSet(county).rules, county)).toEqual([]);
    expect(citationMismatches(buildRuleSet(city).rules, city)).toEqual([]);
    const copied = citationMismatches(buildRuleSet(city).rules, { ...city, building: 'IRC 2018' });
    expect(copied).toContainEqual({ ruleKey: 'exhaust.developed-length', cited: 'IRC 2021', adopted: 'IRC 2018' });
  });
});
