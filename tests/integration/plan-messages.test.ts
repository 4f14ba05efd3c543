import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { hallClosetPassPlan } from '@/tests/fixtures/plans';
import { api, appDb, postJson, signIn } from './helpers';

const db = appDb();
let installer: string;

beforeAll(async () => {
  installer = await signIn('installer@nookpass.demo');
});
afterAll(async () => {
  await db.destroy();
});

describe('plan API messages', () => {
  it('answers a word typed for a number, a negative rating and 14 inches after the feet with what was typed and what is wanted', async () => {
    const created = await api('/api/projects', postJson({ name: `IT messages ${Math.random().toString(36).slice(2)}`, siteAddress: '7 Integration Way', jurisdiction: 'demo-county' }, { cookie: installer }));
    expect(created.status).toBe(201);
    const plan = {
      ...hallClosetPassPlan,
      enclosure: { ...hallClosetPassPlan.enclosure, width: '6 ft 14' },
      dryer: { ...hallClosetPassPlan.dryer, exhaustCfm: 'lots' },
      electrical: { ...hallClosetPassPlan.electrical, laundryCircuit: { amps: -20 } },
    };
    const res = await api(`/api/projects/${created.body.id}/plans`, postJson({ plan }, { cookie: installer }));
    expect(res.status).toBe(400);
    expect(res.body.errors).toEqual(
      expect.arrayContaining([
        { path: 'plan.dryer.exhaustCfm', message: 'Exhaust rate: “lots” is not a number; enter cubic feet per minute, e.g. 150.' },
        { path: 'plan.electrical.laundryCircuit.amps', message: 'Laundry circuit rating must be more than 0 A (you entered −20).' },
        // 6 ft 14 in is 86 in (6 × 12 + 14).
        { path: 'plan.enclosure.width', message: `Enclosure width: inches after the feet must be under 12 ('6 ft 14'); if you meant 7' 2", enter that or 86".` },
      ]),
    );
    for (const e of res.body.errors as Array<{ message: string }>) expect(e.message).not.toMatch(/required|Too small|expected number/);
  });
});
