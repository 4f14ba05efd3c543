import { describe, expect, it } from 'vitest';
import { ConflictError } from '@/lib/domain/errors';
import { answerSchema, currentOutcome, placeOutcome, threadState, type ThreadAnswer, type ThreadOutcome } from '@/lib/domain/reports/thread';

const at = (minute: number) => new Date(Date.UTC(2026, 11, 6, 4, minute));
const outcome = (id: string, minute: number, o: Partial<ThreadOutcome> = {}): ThreadOutcome => ({
  id,
  outcome: 'corrections-needed',
  comment: 'Fix it.',
  findingComments: {},
  revisesId: null,
  answerId: null,
  inspectorName: 'Demo Inspector',
  createdAt: at(minute),
  ...o,
});
const answer = (id: string, reviewId: string, minute: number): ThreadAnswer => ({
  id,
  reviewId,
  checkId: `check-${id}`,
  reportId: `report-${id}`,
  reportCode: 'NP-AAAA-BBBB-CCCC-DDDD',
  note: 'Done.',
  installerName: 'Demo Installer',
  createdAt: at(minute),
});

describe('the standing outcome of a thread', () => {
  it('is nothing before the first outcome, so the first one needs no revise', () => {
    expect(threadState([], [])).toEqual({ kind: 'awaiting-outcome', answerId: null });
    expect(placeOutcome([], [], {}, 'UTC')).toEqual({ revisesId: null, answerId: null });
    expect(() => placeOutcome([], [], { revise: true }, 'UTC')).toThrow(ConflictError);
  });

  it('refuses a second outcome without revise, naming the standing one', () => {
    const first = outcome('o1', 1);
    expect(() => placeOutcome([first], [], {}, 'UTC')).toThrow(/already recorded: Corrections needed \(recorded Dec 6, 2026, 4:01 AM UTC by Demo Inspector\)/);
    // tz database: America/Denver is UTC-7 in December; the outcome is named on the jurisdiction's clock.
    expect(() => placeOutcome([first], [], {}, 'America/Denver')).toThrow(/recorded Dec 5, 2026, 9:01 PM MST by Demo Inspector/);
  });

  it('revises the head of the chain, never an outcome already revised', () => {
    const first = outcome('o1', 1);
    const second = outcome('o2', 2, { revisesId: 'o1', outcome: 'approved' });
    expect(currentOutcome([first, second], [])?.id).toBe('o2');
    expect(placeOutcome([first, second], [], { revise: true }, 'UTC')).toEqual({ revisesId: 'o2', answerId: null });
    expect(placeOutcome([first, second], [], { revises: 'o2' }, 'UTC')).toEqual({ revisesId: 'o2', answerId: null });
    expect(() => placeOutcome([first, second], [], { revises: 'o1' }, 'UTC')).toThrow(/not the standing outcome/);
    expect(threadState([first, second], []).kind).toBe('approved');
  });

  it('after an answer, awaits a fresh outcome on it; outcomes of the earlier round no longer stand', () => {
    const first = outcome('o1', 1);
    const a1 = answer('a1', 'o1', 5);
    expect(threadState([first], [a1])).toEqual({ kind: 'awaiting-outcome', answerId: 'a1' });
    expect(placeOutcome([first], [a1], {}, 'UTC')).toEqual({ revisesId: null, answerId: 'a1' });
    const onAnswer = outcome('o3', 6, { answerId: 'a1' });
    expect(threadState([first, onAnswer], [a1])).toMatchObject({ kind: 'awaiting-corrections', current: { id: 'o3' } });
    expect(() => placeOutcome([first, onAnswer], [a1], {}, 'UTC')).toThrow(ConflictError);
  });
});

describe('the answer schema', () => {
  it('names the field that is wrong', () => {
    const r = answerSchema.safeParse({ checkId: 'not-a-uuid', note: '   ' });
    expect(r.success).toBe(false);
    expect(r.error!.issues.map((i) => i.path.join('.')).sort()).toEqual(['checkId', 'note']);
    // 4000 characters is our own limit for a note (common practice, no published source).
    expect(answerSchema.safeParse({ checkId: '00000000-0000-4000-8000-000000000000', note: 'x'.repeat(4001) }).success).toBe(false);
    expect(answerSchema.safeParse({ checkId: '00000000-0000-4000-8000-000000000000', note: 'x'.repeat(4000) }).success).toBe(true);
    expect(answerSchema.safeParse({ checkId: '00000000-0000-4000-8000-000000000000', note: 'ok', extra: 1 }).success).toBe(false);
  });
});
