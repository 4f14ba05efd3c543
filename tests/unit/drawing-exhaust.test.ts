import { describe, expect, it } from 'vitest';
import { exhaustSchematic } from '@/lib/domain/drawing';
import { computeFacts } from '@/lib/domain/facts';
import { defaultParameters } from '@/lib/domain/params';
import { parsePlan, type Plan } from '@/lib/domain/plan';
import { demoPlans } from '@/tests/fixtures/plans';
import { check, EDITIONS_2018, variant } from './support/check';

const params = defaultParameters(EDITIONS_2018);
const FT = 12; // 1 ft = 12 in (NIST SP 811, Appendix B)

function planOf(input: unknown): Plan {
  const parsed = parsePlan(input);
  if (!parsed.ok) throw new Error(JSON.stringify(parsed.errors));
  return parsed.plan;
}

describe('exhaust schematic', () => {
  it('worked example: two 4-in-radius mitered 90° elbows + 18 ft straight = 28 ft', () => {
    // IRC 2018 Table M1502.4.5.1: a 4-in radius mitered 90° elbow counts 5 ft; 10 ft + 8 ft + 2 × 5 ft = 28 ft.
    const plan = planOf(
      variant((p) => {
        p.exhaust.run = [{ straight: '10 ft' }, { elbow: 90, fitting: 'mitered' }, { straight: '8 ft' }, { elbow: 90, fitting: 'mitered' }];
      }),
    );
    const drawing = exhaustSchematic(plan, { params });
    expect(drawing.segments.map((s) => s.equivalentIn)).toEqual([10 * FT, 5 * FT, 8 * FT, 5 * FT]);
    expect(drawing.segments.map((s) => s.runningTotalIn)).toEqual([10 * FT, 15 * FT, 23 * FT, 28 * FT]);
    expect(drawing.developedLengthIn).toBe(28 * FT);
    // IRC 2018 M1502.4.5.1: 35 ft allowed, so 7 ft to spare and nothing drawn over the limit.
    expect(drawing.allowedLengthIn).toBe(35 * FT);
    expect(drawing.overByIn).toBe(0);
    expect(drawing.shapes.some((s) => s.role === 'over-limit' && s.kind === 'rect')).toBe(false);
    const texts = drawing.shapes.flatMap((s) => (s.kind === 'text' ? [s.text] : []));
    expect(texts).toContain(`Developed length 28' 0"`);
    expect(texts).toContain(`Within the allowed 35' 0", 7' 0" to spare.`);
  });

  it('draws each bar as long as what the piece counts, end to end', () => {
    // IRC 2018 Table M1502.4.5.1: 6-in radius smooth 90° = 1 ft 9 in.
    const plan = planOf(variant((p) => (p.exhaust.run = [{ straight: 24 }, { elbow: 90, fitting: 'smooth-6in' }])));
    const drawing = exhaustSchematic(plan, { params });
    const bars = drawing.shapes.filter((s) => s.kind === 'rect' && (s.role === 'duct' || s.role === 'fitting'));
    const [straight, elbow, total] = bars as Array<{ x: number; width: number }>;
    expect(straight.width).toBe(24);
    expect(elbow.width).toBe(21);
    expect(elbow.x).toBeCloseTo(straight.x + 24, 9);
    expect(total.width).toBe(45);
  });

  it('shows the transition duct but never counts it', () => {
    // IRC 2018 M1502.4.5.1: developed length is measured from the transition-duct connection; the transition is not counted.
    const plan = planOf(variant((p) => (p.exhaust.transition.length = '8 ft')));
    const drawing = exhaustSchematic(plan, { params });
    const transition = drawing.shapes.find((s) => s.kind === 'rect' && s.role === 'transition');
    expect(transition && transition.kind === 'rect' ? transition.width : null).toBe(8 * FT);
    expect(drawing.transitionLengthIn).toBe(8 * FT);
    expect(drawing.developedLengthIn).toBe(computeFacts(plan, params)['exhaust.developedLengthIn']);
    expect(drawing.shapes.some((s) => s.kind === 'text' && s.text === 'not counted')).toBe(true);
  });

  it.each(demoPlans.map((d) => [d.slug, d.plan] as const))('%s: the total equals the developed-length fact', (_slug, input) => {
    const plan = planOf(input);
    const drawing = exhaustSchematic(plan, { params });
    expect(drawing.developedLengthIn).toBe(computeFacts(plan, params)['exhaust.developedLengthIn']);
    expect(drawing.segments.at(-1)?.runningTotalIn).toBe(drawing.developedLengthIn);
  });

  it('marks a route over the allowed length, and by how much', async () => {
    // Demo plan: 6 + 10 + 8 + 4 ft straight, three mitered 90° (5 ft each) and one mitered 45° (2 ft 6 in),
    // IRC 2018 Table M1502.4.5.1 → 45 ft 6 in against 35 ft: 10 ft 6 in over.
    const input = demoPlans.find((d) => d.slug === 'demo-long-exhaust')!.plan;
    const evaluation = await check(input);
    const drawing = exhaustSchematic(planOf(input), { params, marks: evaluation.findings });
    expect(drawing.developedLengthIn).toBe(45 * FT + 6);
    expect(drawing.overByIn).toBe(10 * FT + 6);
    const over = drawing.shapes.filter((s) => s.kind === 'rect' && s.role === 'over-limit');
    // The part past the limit: 10' 6" on the route rows and 10' 6" on the total bar.
    const overRows = over.slice(0, -1).reduce((sum, s) => sum + (s.kind === 'rect' ? s.width : 0), 0);
    expect(overRows).toBeCloseTo(10 * FT + 6, 9);
    expect(over.every((s) => s.status === 'fail')).toBe(true);
    expect(drawing.shapes.some((s) => s.kind === 'mark' && s.ruleKey === 'exhaust.developed-length')).toBe(true);
    expect(drawing.shapes.some((s) => s.kind === 'text' && s.text === `Over the allowed 35' 0" by 10' 6".`)).toBe(true);
  });

  it("uses the dryer maker's maximum where the plan gives one", () => {
    // IRC 2018 M1502.4.5.2: the maker's length replaces 35 ft. 12 m = 12000 mm / 25.4 mm per in (NIST SP 811).
    const input = demoPlans.find((d) => d.slug === 'demo-gas-walk-in')!.plan;
    const drawing = exhaustSchematic(planOf(input), { params });
    expect(drawing.allowedLengthSource).toBe('manufacturer');
    expect(drawing.allowedLengthIn).toBeCloseTo(12000 / 25.4, 6);
    expect(drawing.shapes.some((s) => s.kind === 'text' && s.text.startsWith('allowed 12000 mm'))).toBe(true);
  });

  it('counts an elbow of unknown kind at the 4-in mitered value and says so', () => {
    // TRADE.md: fittings not in the table count at the 4-in mitered value (common practice, no published source).
    const plan = planOf(variant((p) => (p.exhaust.run = [{ elbow: 45 }])));
    const drawing = exhaustSchematic(plan, { params });
    expect(drawing.segments[0].equivalentIn).toBe(2 * FT + 6); // IRC 2018 Table M1502.4.5.1: mitered 45° = 2 ft 6 in
    expect(drawing.notes.some((n) => n.includes('counted as 4-in radius mitered'))).toBe(true);
  });

  it('a ventless dryer: no route drawn and none asked for', () => {
    // IRC M1502.2 exception: a listed condensing dryer needs no exhaust duct (TRADE.md S).
    const plan = planOf(
      variant((p) => {
        Object.assign(p.dryer, { type: 'condensing', condensate: 'reservoir' });
        delete p.exhaust;
      }),
    );
    const drawing = exhaustSchematic(plan, { params });
    expect(drawing.missing).toEqual([]);
    expect(drawing.segments).toEqual([]);
    expect(drawing.shapes.some((s) => s.kind === 'text' && /needs none/.test(s.text))).toBe(true);
    // The same plan as vented asks for its route.
    const vented = planOf(variant((p) => delete p.exhaust));
    expect(exhaustSchematic(vented, { params }).missing).toContain('exhaust.run');
  });
});
