import { getDb } from '@/db';
import { requireCaller } from '@/lib/platform/auth/session';
import { json, parseBody, route } from '@/lib/platform/http';
import { evaluateForJurisdiction } from '@/lib/services/evaluation';
import { countEvaluation } from '@/lib/services/usage-limits';
import { evaluationRequestSchema } from '@/lib/domain/api/requests';

// Stateless: evaluates a plan against a jurisdiction's published rules and stores nothing. An integration that
// only needs to know what blocks the plan asks for `findings: "failing"` and gets a much smaller answer; the
// summary always counts every finding.
export const POST = route(async (request) => {
  await countEvaluation(await requireCaller(request));
  const body = await parseBody(request, evaluationRequestSchema);
  const result = await evaluateForJurisdiction(getDb(), body);
  const findings = body.findings === 'failing' ? result.findings.filter((f) => f.status === 'fail') : result.findings;
  return json({ ruleSet: result.ruleSet, summary: result.summary, findings });
});
