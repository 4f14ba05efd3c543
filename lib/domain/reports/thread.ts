import { z } from 'zod';
import { ConflictError } from '@/lib/domain/errors';
import type { ReviewOutcome } from '@/lib/domain/reports/review-schema';
import { formatDateTime } from '@/lib/domain/dates/format';

/**
 * The conversation on one sent report: the inspector's outcomes and the installer's answers, in order.
 * Rows are append-only; what is "current" is derived here, from the whole history, never stored.
 */
export type ThreadOutcome = {
  id: string;
  outcome: ReviewOutcome;
  comment: string;
  findingComments: Record<string, string>;
  /** The outcome this one revises. */
  revisesId: string | null;
  /** The answer it was recorded on; null for outcomes on the report as first sent. */
  answerId: string | null;
  inspectorName: string | null;
  createdAt: Date;
};

export type ThreadAnswer = {
  id: string;
  /** The "corrections needed" outcome it answers. */
  reviewId: string;
  checkId: string;
  reportId: string;
  reportCode: string;
  note: string;
  installerName: string | null;
  createdAt: Date;
};

export type ThreadState =
  /** Nothing recorded on what is under review (the report as sent, or the latest answer). */
  | { kind: 'awaiting-outcome'; answerId: string | null }
  /** The inspector asked for corrections and the installer has not answered yet. */
  | { kind: 'awaiting-corrections'; current: ThreadOutcome }
  | { kind: 'approved'; current: ThreadOutcome };

export const OUTCOME_LABEL: Record<ReviewOutcome, string> = { approved: 'Approved', 'corrections-needed': 'Corrections needed' };

/** The outcome standing on what is under review now: the one of the latest answer's round that nobody revised. */
export function currentOutcome(outcomes: ThreadOutcome[], answers: ThreadAnswer[]): ThreadOutcome | null {
  const latestAnswer = latest(answers);
  const round = outcomes.filter((o) => o.answerId === (latestAnswer?.id ?? null));
  const revised = new Set(round.map((o) => o.revisesId).filter(Boolean));
  const heads = round.filter((o) => !revised.has(o.id));
  return latest(heads);
}

export function threadState(outcomes: ThreadOutcome[], answers: ThreadAnswer[]): ThreadState {
  const current = currentOutcome(outcomes, answers);
  if (!current) return { kind: 'awaiting-outcome', answerId: latest(answers)?.id ?? null };
  if (current.outcome === 'approved') return { kind: 'approved', current };
  return { kind: 'awaiting-corrections', current };
}

/** How the request asks to revise: `revise: true`, or the id of the outcome it replaces. */
export type ReviseRequest = { revise?: boolean; revises?: string };

function describe(o: ThreadOutcome, timeZone: string): string {
  return `${OUTCOME_LABEL[o.outcome]} (recorded ${formatDateTime(o.createdAt, timeZone)}${o.inspectorName ? ` by ${o.inspectorName}` : ''})`;
}

/**
 * Where a new outcome goes: a first outcome on what is under review, or an explicit revision of the
 * standing one. Recording over a standing outcome without saying so is refused, naming that outcome.
 */
export function placeOutcome(outcomes: ThreadOutcome[], answers: ThreadAnswer[], request: ReviseRequest, timeZone: string): { revisesId: string | null; answerId: string | null } {
  const current = currentOutcome(outcomes, answers);
  const answerId = latest(answers)?.id ?? null;
  const revising = request.revise === true || request.revises !== undefined;
  if (!current) {
    if (revising) throw new ConflictError('There is no outcome to revise yet: record the outcome without revise.');
    return { revisesId: null, answerId };
  }
  if (!revising) {
    throw new ConflictError(`An outcome is already recorded: ${describe(current, timeZone)}. To change it, revise that outcome (send revise: true or revises: "${current.id}").`);
  }
  if (request.revises !== undefined && request.revises !== current.id) {
    throw new ConflictError(`Outcome ${request.revises} is not the standing outcome; the standing outcome is ${describe(current, timeZone)}, id ${current.id}.`);
  }
  return { revisesId: current.id, answerId };
}

function latest<T extends { createdAt: Date }>(rows: T[]): T | null {
  return rows.reduce<T | null>((a, r) => (!a || +r.createdAt >= +a.createdAt ? r : a), null);
}

export const ANSWER_NOTE_MAX_CHARS = 4000;

/** The installer's answer form and the API share this schema. */
export const answerSchema = z.strictObject({
  checkId: z.uuid('Choose the check that answers the corrections.'),
  note: z
    .string('Say what you corrected.')
    .trim()
    .min(1, 'Say what you corrected.')
    .max(ANSWER_NOTE_MAX_CHARS, `Keep the note to ${ANSWER_NOTE_MAX_CHARS.toLocaleString('en-US')} characters.`),
});
export type AnswerInput = z.infer<typeof answerSchema>;

/** One entry of the thread as both sides read it, oldest first. */
export type ThreadEntry =
  | { kind: 'sent'; at: Date; by: string | null; to: string; note: string | null; reportCode: string }
  | ({ kind: 'outcome'; at: Date } & ThreadOutcome)
  | ({ kind: 'answer'; at: Date } & ThreadAnswer);

export function threadEntries(sends: Extract<ThreadEntry, { kind: 'sent' }>[], outcomes: ThreadOutcome[], answers: ThreadAnswer[]): ThreadEntry[] {
  const all: ThreadEntry[] = [
    ...sends,
    ...outcomes.map((o) => ({ kind: 'outcome' as const, at: o.createdAt, ...o })),
    ...answers.map((a) => ({ kind: 'answer' as const, at: a.createdAt, ...a })),
  ];
  return all.sort((a, b) => +a.at - +b.at);
}
