import { z } from 'zod';
import { getDb } from '@/db';
import { findJurisdictionWithPublished } from '@/db/jurisdiction-lookup';
import { requireUser } from '@/lib/platform/auth/session';
import { loadImmutableRuleSet } from '@/lib/services/checks/rule-set-cache';
import { evaluate } from '@/lib/domain/engine';
import { NotFoundError, ValidationError } from '@/lib/domain/errors';
import { json, parseBody, route } from '@/lib/platform/http';
import { parsePlan } from '@/lib/domain/plan';

const bodySchema = z.strictObject({
  jurisdiction: z.string().min(1, 'Give the jurisdiction slug, e.g. "demo-county".'),
  plan: z.unknown(),
});

// Stateless: evaluates a plan against a jurisdiction's published rules and stores nothing.
export const POST = route(async (request) => {
  await requireUser(request);
  const body = await parseBody(request, bodySchema);
  const parsed = parsePlan(body.plan);
  if (!parsed.ok) throw new ValidationError(parsed.errors.map((e) => ({ path: `plan.${e.path}`, message: e.message })));
  const db = getDb();
  const jurisdiction = await findJurisdictionWithPublished(db, body.jurisdiction);
  if (!jurisdiction) throw new NotFoundError(`No jurisdiction '${body.jurisdiction}'. GET /api/jurisdictions lists them.`);
  const ruleSet = jurisdiction.publishedRuleSetId ? await loadImmutableRuleSet(db, jurisdiction.publishedRuleSetId) : null;
  if (!ruleSet) throw new NotFoundError(`${jurisdiction.name} has no published rule set yet.`);
  const result = await evaluate(
    { id: ruleSet.id, jurisdiction: jurisdiction.slug, version: ruleSet.version, parameters: ruleSet.parameters, rules: ruleSet.rules },
    parsed.plan,
  );
  return json({ ruleSet: result.ruleSet, summary: result.summary, findings: result.findings });
});
