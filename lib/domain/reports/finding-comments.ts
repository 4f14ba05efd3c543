// An inspector's comments on single findings, as the installer reads them beside each finding. Pure and
// serialisable (dates as ISO strings), so server pages hand them to client components as they are.

export type InspectorFindingComment = {
  comment: string;
  inspectorName: string | null;
  outcome: 'approved' | 'corrections-needed';
  reportCode: string;
  /** When the outcome carrying the comment was recorded (ISO 8601). */
  at: string;
};

/** Rule key → the comments on that finding, oldest first. */
export type FindingCommentsByKey = Record<string, InspectorFindingComment[]>;

export function groupFindingComments(
  rows: ReadonlyArray<{ ruleKey: string; comment: string; inspectorName: string | null; outcome: InspectorFindingComment['outcome']; reportCode: string; createdAt: Date }>,
): FindingCommentsByKey {
  const out: FindingCommentsByKey = {};
  for (const r of rows) (out[r.ruleKey] ??= []).push({ comment: r.comment, inspectorName: r.inspectorName, outcome: r.outcome, reportCode: r.reportCode, at: r.createdAt.toISOString() });
  return out;
}
