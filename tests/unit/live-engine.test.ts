import { describe, expect, it } from 'vitest';
import { runLive } from '@/components/live-check/live-engine';
import { buildRuleSet } from '@/rules';
import { EDITIONS_2018, variant } from './support/check';

const set = { id: 'live-engine-test', jurisdiction: 'Testville', version: 1, ...buildRuleSet(EDITIONS_2018) };

describe('live check on the plan as typed', () => {
  it('leaves out a field that does not read, names the findings that wait for it, and checks the rest', async () => {
    const result = await runLive(set, variant((p) => (p.enclosure.depth = '34 bananas')));
    if (!('evaluation' in result)) throw new Error('expected an evaluation');
    expect(result.waiting).toHaveLength(1);
    expect(result.waiting[0].path).toBe('enclosure.depth');
    expect(result.waiting[0].findings.map((f) => f.ruleKey)).toEqual(expect.arrayContaining(['clearances.depth', 'clearances.rear-zone', 'door-hardware.hinge-arm-room']));
    // The route does not read the depth: 24 in + 5 ft + 12 ft + 1 ft 9 in + 18 in is within 35 ft (IRC 2018 M1502.4.5.1).
    expect(result.evaluation.findings.find((f) => f.ruleKey === 'exhaust.developed-length')?.status).toBe('pass');
  });

  it('counts failing findings in each section holding a field they read', async () => {
    // 31-1/2 in outside leaves 30 in inside: depth, rear zone and hinge arms all short (see plan-fixes.test.ts).
    const result = await runLive(set, variant((p) => (p.enclosure.depth = 31.5)));
    if (!('evaluation' in result)) throw new Error('expected an evaluation');
    // The maker's depth clearance is binding (IRC 2018 M1307.1): a fail; rear zone and hinge arms stay cautions.
    expect(result.bySection.enclosure?.fail).toBe(1);
    expect(result.bySection.enclosure?.caution).toBe(2);
    // The inside depth reads each door's overlay or inset, so the depth and hinge-arm findings count in Doors too.
    expect(result.bySection.doors).toEqual({ fail: 1, caution: 1, needsInfo: 0 });
    // Two hinges on a 78 in (1981 mm) door, where the hinge makers' chart asks four up to 2000 mm (TRADE.md, S).
    const hinges = await runLive(set, variant((p) => (p.doors[0].hinges = [3, 75])));
    if (!('evaluation' in hinges)) throw new Error('expected an evaluation');
    expect(hinges.bySection.doors?.caution).toBe(1);
    const fine = await runLive(set, variant(() => {}));
    if (!('evaluation' in fine)) throw new Error('expected an evaluation');
    expect(fine.bySection.enclosure?.caution ?? 0).toBe(0);
  });

  it('answers with the errors when nothing can be left out', async () => {
    const result = await runLive(set, { units: 'furlongs' } as never);
    expect('errors' in result && result.errors[0].path).toBe('units');
  });
});
