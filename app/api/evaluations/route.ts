import { getDb } from '@/db';
import { requireCaller } from '@/lib/platform/auth/session';
import { jsonText, parseBody, route } from '@/lib/platform/http';
import { evaluationAnswerForJurisdiction } from '@/lib/services/evaluation';
import { countEvaluation } from '@/lib/services/usage-limits';
import { evaluationRequestSchema } from '@/lib/domain/api/requests';

// Stateless: evaluates a plan against a jurisdiction's published rules and stores nothing. An integration that
// only needs to know what blocks the plan asks for `findings: "failing"` and gets a much smaller answer; the
// summary always counts every finding.
export const POST = route(async (request) => {
  await countEvaluation(await requireCaller(request));
  const body = await parseBody(request, evaluationRequestSchema);
  return jsonText(await evaluationAnswerForJurisdiction(getDb(), body));
});
