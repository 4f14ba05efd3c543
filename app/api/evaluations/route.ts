import { getDb } from '@/db';
import { requireUser } from '@/lib/platform/auth/session';
import { json, parseBody, route } from '@/lib/platform/http';
import { evaluateForJurisdiction } from '@/lib/services/evaluation';
import { evaluationRequestSchema } from '@/lib/domain/api/requests';

// Stateless: evaluates a plan against a jurisdiction's published rules and stores nothing.
export const POST = route(async (request) => {
  await requireUser(request);
  const body = await parseBody(request, evaluationRequestSchema);
  const result = await evaluateForJurisdiction(getDb(), body);
  return json({ ruleSet: result.ruleSet, summary: result.summary, findings: result.findings });
});
