import { z } from 'zod';
import { applianceInputSchema, applianceUpdateSchema } from '@/lib/domain/appliances/model';
import {
  applianceListRequestQuerySchema,
  attachmentUpdateSchema,
  checkRunRequestSchema,
  evaluationRequestSchema,
  planSaveRequestSchema,
} from '@/lib/domain/api/requests';
import { companySettingsSchema, passwordChangeSchema, passwordResetRequestSchema, passwordResetSchema, signUpSchema } from '@/lib/domain/accounts/forms';
import { acceptInvitationSchema, auditFilterSchema, invitationSchema, personUpdateSchema } from '@/lib/domain/accounts/people';
import { projectExportQuerySchema } from '@/lib/domain/exports/schema';
import { planInputSchema } from '@/lib/domain/plan';
import { projectDuplicateSchema, quickCheckSaveSchema } from '@/lib/domain/projects/duplicate';
import { projectInputSchema, projectListQuerySchema, projectUpdateSchema } from '@/lib/domain/projects/schema';
import { inspectionFilterSchema } from '@/lib/domain/reports/inspection-filter';
import { reviewSchema } from '@/lib/domain/reports/review-schema';
import { answerSchema } from '@/lib/domain/reports/thread';
import { sendSchema } from '@/lib/domain/reports/send-schema';
import { citationCheckSchema } from '@/lib/domain/rule-sets/citation-checks';
import { jurisdictionCreateSchema, jurisdictionListItemSchema, jurisdictionUpdateSchema } from '@/lib/domain/rule-sets/jurisdiction-schema';
import { draftCreateSchema, draftSaveSchema, dryRunStartSchema, impactRunStartSchema, publishSchema, retireSchema, revisionQuerySchema, ruleSaveSchema } from '@/lib/domain/rule-sets/requests';
import type { Role } from '@/lib/domain/roles';
import { newTokenSchema } from '@/lib/platform/auth/api-token-form';
import { webhookCreateSchema, webhookDeliveriesQuerySchema, webhookUpdateSchema } from '@/lib/domain/webhooks/schema';

/**
 * Who may call an operation: anyone; any signed-in person or API token; only these roles; or only a signed-in
 * browser (API tokens get 403).
 */
export type Access = 'public' | 'signed-in' | readonly Role[] | 'browser';

export type BodyKind =
  | { json: z.ZodType }
  | { raw: 'text/csv' | 'application/pdf' | 'multipart/form-data'; description: string };

export interface OperationEntry {
  summary: string;
  access: Access;
  body?: BodyKind;
  query?: z.ZodObject;
  /** Success status and what it holds; `schema` only where the answer has one. */
  ok: { status: 200 | 201 | 202 | 204; description: string; contentType?: 'application/json' | 'text/csv' | 'application/pdf' | 'application/octet-stream'; schema?: z.ZodType };
  /** Answers beyond those that follow from access, body, query and path (400/401/403/404/413). */
  conflict?: string;
  /** The route is limited; its 429 carries Retry-After. */
  rateLimited?: string;
  /** The route answers 404 although its path has no parameter (a missing named thing in the body or query). */
  notFound?: string;
}

export type Method = 'get' | 'post' | 'put' | 'patch' | 'delete';

export type RouteEntry = { [M in Method]?: OperationEntry } | { undocumented: string };

const json = (schema: z.ZodType): BodyKind => ({ json: schema });
const installers = ['installer'] as const;
const installersAndAdmins = ['installer', 'admin'] as const;
const admins = ['admin'] as const;
const inspectorsAndAdmins = ['inspector', 'admin'] as const;
const ok200 = (description: string, schema?: z.ZodType) => ({ status: 200 as const, description, schema });
const ok201 = (description: string, schema?: z.ZodType) => ({ status: 201 as const, description, schema });
const noContent = (description: string) => ({ status: 204 as const, description });
const accepted = (description: string) => ({ status: 202 as const, description });
const csv = (description: string) => ({ status: 200 as const, description, contentType: 'text/csv' as const });

// The plan as the routes take it, described once in the document's components.
const planDoc = planInputSchema.meta({ id: 'PlanInput', description: 'A plan; GET /api/schema/plan gives the same as JSON Schema.' });

// The diff compares against another version named in the query; the route reads it by hand.
const ruleSetDiffQuerySchema = z.object({ against: z.string().describe('Id of the rule set version to compare with.') });

/**
 * Every route file under app/api, keyed by its path relative to app/api. A new route needs one entry here (a
 * unit test lists the files and fails for a route without one); the OpenAPI document is generated from this.
 */
export const apiRoutes: Record<string, RouteEntry> = {
  'account/password/route.ts': { post: { summary: 'Change your password', access: 'browser', body: json(passwordChangeSchema), ok: ok200('Password changed.') } },
  'admin/audit/route.ts': { get: { summary: 'Audit log of all companies', access: admins, query: auditFilterSchema, ok: ok200('Audit entries.') } },
  'appliances/route.ts': {
    get: { summary: "List the company's appliance models", access: installers, query: applianceListRequestQuerySchema, ok: ok200('Appliance models.') },
    post: { summary: 'Add an appliance model', access: installers, body: json(applianceInputSchema), ok: ok201('The model as stored.'), conflict: 'A model with this label already exists.' },
  },
  'appliances/[id]/route.ts': {
    get: { summary: 'One appliance model', access: installers, ok: ok200('The model.') },
    patch: { summary: 'Change an appliance model', access: installers, body: json(applianceUpdateSchema), ok: ok200('The model as stored.'), conflict: 'A model with this label already exists.' },
    delete: { summary: 'Delete an appliance model', access: installers, ok: noContent('Deleted.') },
  },
  'appliances/csv/route.ts': {
    get: { summary: 'Appliance library as CSV', access: installers, ok: csv('The library, one model a line.') },
    post: { summary: 'Import appliance models from CSV', access: installers, body: { raw: 'text/csv', description: 'The CSV file (header line first), up to 1 MiB.' }, ok: ok201('What was added and changed.') },
  },
  'attachments/[id]/route.ts': {
    get: { summary: 'Download an attachment (`?variant=thumb` or `display` for a photo\'s thumbnail or report-size image)', access: 'signed-in', ok: { status: 200, description: 'The file.', contentType: 'application/octet-stream' }, conflict: 'The thumbnail or report-size image is not made yet.' },
    patch: { summary: "Change an attachment's caption", access: installers, body: json(attachmentUpdateSchema), ok: ok200('The caption as stored.'), conflict: 'The attachment was already sent with a report.' },
    delete: { summary: 'Delete an attachment', access: installers, ok: noContent('Deleted.'), conflict: 'The attachment was already sent with a report.' },
  },
  'attachments/[id]/derivatives/route.ts': {
    get: { summary: "Where a photo's thumbnail and report-size image are (pending, making, retrying, ready, failed)", access: 'signed-in', ok: ok200('The state, attempts made and the last error.') },
    post: { summary: "Make a photo's thumbnail and report-size image again after the last attempt failed", access: installers, ok: { status: 202, description: 'Queued again with a fresh set of attempts.' }, conflict: 'The images are made, or are still being made.' },
  },
  'auth/[...nextauth]/route.ts': { undocumented: 'Browser sign-in, handled by the authentication library; integrators use API tokens.' },
  'checks/[id]/route.ts': { get: { summary: 'One check with its findings', access: installersAndAdmins, ok: ok200('The check as stored.') } },
  'checks/[id]/findings.csv/route.ts': { get: { summary: "A check's findings as CSV", access: installersAndAdmins, ok: csv('Rule, section cited, status, message and remedy of each finding.') } },
  'checks/[id]/report/route.ts': { post: { summary: 'Issue the report of a check (PDF)', access: installersAndAdmins, ok: { status: 200, description: 'The report; X-Report-Code and X-Report-Sha256 name it.', contentType: 'application/pdf' }, rateLimited: 'Reports issued per person an hour (120).' } },
  'checks/[id]/send/route.ts': {
    post: { summary: "E-mail a check's report to the inspector", access: installers, body: json(sendSchema), ok: ok201('The send as recorded.'), rateLimited: 'Report e-mails per company an hour.', conflict: 'Confirmation needed (failing findings) or the address is not confirmed.' },
  },
  'email-confirmations/route.ts': { post: { summary: 'Send the e-mail confirmation again', access: 'signed-in', ok: { status: 202, description: 'Queued.' }, rateLimited: 'Confirmation e-mails an hour.' } },
  'email-confirmations/[token]/route.ts': { post: { summary: 'Confirm an e-mail address', access: 'public', ok: ok200('Confirmed.'), conflict: 'The link expired or was used.' } },
  'evaluations/route.ts': {
    post: { summary: 'Check a plan against a jurisdiction (stores nothing)', access: 'signed-in', body: json(evaluationRequestSchema.extend({ plan: planDoc })), ok: ok200('Rule set, summary and findings.'), notFound: 'No published rule set for the jurisdiction.', rateLimited: 'Evaluations a minute per API token (1,200) and per person (2,400).' },
  },
  'health/route.ts': { get: { summary: 'Whether the app and its database answer', access: 'public', ok: ok200('Up (503 when the database is down).') } },
  'inspections/route.ts': { get: { summary: "The inspector's reports to review", access: inspectorsAndAdmins, query: inspectionFilterSchema, ok: ok200('Inspections, a page of them, with the total.') } },
  'inspections/[reportId]/route.ts': { get: { summary: 'One report to review', access: inspectorsAndAdmins, ok: ok200('The report and its outcome.') } },
  'inspections/[reportId]/review/route.ts': { post: { summary: 'Record an inspection outcome', access: ['inspector'], body: json(reviewSchema), ok: ok201('The outcome as recorded.'), conflict: 'An outcome is already recorded: revise it explicitly (revise: true).' } },
  'invitations/route.ts': {
    get: { summary: 'Open invitations', access: installersAndAdmins, ok: ok200('Invitations.') },
    post: { summary: 'Invite a person', access: installersAndAdmins, body: json(invitationSchema), ok: ok201('The invitation.'), conflict: 'The person already has an account.', rateLimited: 'Invitation e-mails an hour.' },
  },
  'invitations/[id]/route.ts': { delete: { summary: 'Withdraw an invitation', access: installersAndAdmins, ok: ok200('The withdrawn invitation.') } },
  'invitations/[id]/accept/route.ts': { post: { summary: 'Accept an invitation (signs in)', access: 'public', body: json(acceptInvitationSchema), ok: ok201('The new account; a session cookie is set.'), conflict: 'The invitation expired or was used.' } },
  'jurisdictions/route.ts': {
    get: { summary: 'Jurisdictions', access: 'signed-in', ok: ok200('Jurisdictions with their adopted editions, IANA time zone and published version.', z.array(jurisdictionListItemSchema)) },
    post: { summary: 'Add a jurisdiction', access: admins, body: json(jurisdictionCreateSchema), ok: ok201('The jurisdiction.'), conflict: 'The slug is taken.' },
  },
  'jurisdictions/[slug]/route.ts': {
    get: { summary: 'One jurisdiction', access: admins, ok: ok200('The jurisdiction.') },
    patch: { summary: 'Change a jurisdiction', access: admins, body: json(jurisdictionUpdateSchema), ok: ok200('The jurisdiction as stored.') },
  },
  'jurisdictions/[slug]/audit/route.ts': { get: { summary: "A jurisdiction's audit log", access: admins, ok: ok200('Audit entries.') } },
  'jurisdictions/[slug]/impact/route.ts': { get: { summary: 'Projects a draft would change', access: admins, ok: ok200('Impact.') } },
  'jurisdictions/[slug]/impact-runs/route.ts': {
    post: { summary: 'Start an impact run of the published version (a job)', access: admins, body: json(impactRunStartSchema), ok: accepted('The run, queued (or the one already working on this version, joined: true); poll its Location.'), conflict: 'Nothing is published, or another version is published than the one sent.' },
  },
  'jurisdictions/[slug]/impact-runs/[runId]/route.ts': { get: { summary: 'An impact run: state, projects done of total, result when done', access: admins, ok: ok200('The run.') } },
  'jurisdictions/[slug]/published/[version]/route.ts': { get: { summary: 'A published rule set (immutable)', access: 'signed-in', ok: ok200('The rule set.') } },
  'jurisdictions/[slug]/rule-sets/route.ts': {
    get: { summary: "A jurisdiction's rule set versions", access: admins, ok: ok200('Versions.') },
    post: { summary: 'Start a draft', access: admins, body: json(draftCreateSchema), ok: ok201('The draft.'), conflict: 'A draft already exists.' },
  },
  'mail/[id]/route.ts': { get: { summary: "One e-mail's delivery state (queued, sending, retrying, sent, failed)", access: 'signed-in', ok: ok200('The state, attempts made and the last error.') } },
  'mail/[id]/send-again/route.ts': {
    post: { summary: 'Queue an e-mail again after its last attempt failed', access: 'signed-in', ok: { status: 202, description: 'Queued again with a fresh set of attempts.' }, conflict: 'The e-mail was sent, or is still being tried.' },
  },
  'me/route.ts': { get: { summary: 'Who is calling', access: 'signed-in', ok: ok200('The person and role.') } },
  'organization/route.ts': {
    get: { summary: "The company's settings", access: installers, ok: ok200('Settings.') },
    patch: { summary: "Change the company's settings (owner)", access: installers, body: json(companySettingsSchema), ok: ok200('Settings as stored.') },
  },
  'organization/audit/route.ts': { get: { summary: "The company's audit log (owner)", access: installers, query: auditFilterSchema, ok: ok200('Audit entries.') } },
  'organization/members/route.ts': { get: { summary: "The company's people", access: installers, ok: ok200('People.') } },
  'password-resets/route.ts': { post: { summary: 'Ask for a password-reset e-mail', access: 'public', body: json(passwordResetRequestSchema), ok: { status: 202, description: 'Sent if the address has an account.' }, rateLimited: 'Reset requests per address and client an hour.' } },
  'password-resets/[token]/route.ts': { post: { summary: 'Set a new password from a reset link', access: 'public', body: json(passwordResetSchema), ok: noContent('Password set.'), conflict: 'The link expired or was used.' } },
  'ping/route.ts': { get: { summary: 'A fixed answer (benchmark baseline)', access: 'public', ok: ok200('{ ok: true }.') } },
  'projects/route.ts': {
    get: { summary: "The company's projects", access: installersAndAdmins, query: projectListQuerySchema, ok: ok200('A page of projects and the total.') },
    post: { summary: 'Start a project', access: installers, body: json(projectInputSchema), ok: ok201('The project.') },
  },
  'projects.csv/route.ts': { get: { summary: 'The projects list as CSV (every page)', access: installersAndAdmins, query: projectExportQuerySchema, ok: csv('One project a line, with the filters and order of the list.') } },
  'projects/[id]/route.ts': {
    get: { summary: 'One project', access: installersAndAdmins, ok: ok200('The project.') },
    patch: { summary: 'Change or archive a project', access: installersAndAdmins, body: json(projectUpdateSchema), ok: ok200('The project as stored.') },
  },
  'projects/[id]/attachments/route.ts': {
    get: { summary: "A project's attachments", access: installersAndAdmins, ok: ok200('Attachments.') },
    post: { summary: 'Upload photos or documents', access: installers, body: { raw: 'multipart/form-data', description: 'Files in the field "file" (15 MB each), optional "caption".' }, ok: ok201('What was stored.'), rateLimited: 'Uploads per person an hour (300).' },
  },
  'projects/[id]/checks/route.ts': {
    get: { summary: "A project's checks", access: installersAndAdmins, ok: ok200('Checks, newest first.') },
    post: { summary: 'Check a plan revision', access: installers, body: json(checkRunRequestSchema), ok: ok201('The check with its findings.') },
  },
  'projects/[id]/duplicate/route.ts': { post: { summary: 'Copy a project with its latest plan', access: installersAndAdmins, body: json(projectDuplicateSchema), ok: ok201('The new project.') } },
  'projects/[id]/plans/route.ts': {
    get: { summary: "A project's plan revisions", access: installersAndAdmins, ok: ok200('Revisions.') },
    post: { summary: 'Save a plan revision', access: installers, body: json(planSaveRequestSchema.extend({ plan: planDoc })), ok: ok201('The revision number and what changed.') },
  },
  'projects/[id]/plans/[number]/route.ts': { get: { summary: 'One plan revision', access: installersAndAdmins, ok: ok200('The revision.') } },
  'quick-checks/route.ts': { post: { summary: 'Save a quick check as a project', access: installersAndAdmins, body: json(quickCheckSaveSchema), ok: ok201('The project and its check.') } },
  'reports/[code]/answers/route.ts': {
    get: { summary: "A sent report's thread: sends, outcomes and answers in order, with what changed", access: ['installer', 'inspector', 'admin'], ok: ok200('The thread.') },
    post: { summary: 'Answer "corrections needed" with a newer check and a note', access: installers, body: json(answerSchema), ok: ok201('The answer and the report issued for its check.'), conflict: 'The report is not waiting for corrections, or the check is not newer.', rateLimited: 'Report e-mails per company an hour.' },
  },
  'reports/[code]/route.ts': { get: { summary: 'Public facts of an issued report', access: 'public', ok: ok200('The report facts.'), rateLimited: 'Report look-ups per client a minute.' } },
  'reports/[code]/pdf/route.ts': { get: { summary: "Download an issued report's PDF", access: 'signed-in', ok: { status: 200, description: 'The PDF as issued.', contentType: 'application/pdf' } } },
  'reports/[code]/verify/route.ts': {
    post: { summary: 'Check whether a PDF is the report as issued', access: 'public', body: { raw: 'application/pdf', description: 'The PDF file, up to 30 MB.' }, ok: ok200('genuine, and both digests.'), rateLimited: 'Report look-ups per client a minute.' },
  },
  'rule-sets/[id]/route.ts': {
    get: { summary: 'One rule set version', access: admins, ok: ok200('The rule set.') },
    patch: { summary: "Save a draft's parameters and note", access: admins, body: json(draftSaveSchema), ok: ok200('The draft as stored.'), conflict: 'The draft changed since it was read (revision) or is not a draft.' },
    delete: { summary: 'Discard a draft', access: admins, query: revisionQuerySchema, ok: noContent('Discarded.'), conflict: 'The draft changed since it was read, or is not a draft.' },
  },
  'rule-sets/[id]/citations/route.ts': {
    get: { summary: "A draft's citation checks", access: admins, ok: ok200('Marks.') },
    post: { summary: 'Mark a citation checked against the adopted text', access: admins, body: json(citationCheckSchema), ok: ok201('The mark.'), conflict: 'Not a draft.' },
  },
  'rule-sets/[id]/diff/route.ts': { get: { summary: 'Differences between two versions', access: admins, query: ruleSetDiffQuerySchema, ok: ok200('The difference.') } },
  'rule-sets/[id]/dry-run/route.ts': { post: { summary: "Run a draft over the jurisdiction's projects", access: admins, ok: ok200('Outcome changes.') } },
  'rule-sets/[id]/dry-runs/route.ts': {
    post: { summary: "Start a dry run of a draft over the jurisdiction's projects (a job)", access: admins, body: json(dryRunStartSchema), ok: accepted('The run, queued (or the one already working on this revision, joined: true); poll its Location.'), conflict: 'The draft is at another revision than the one sent.' },
  },
  'rule-sets/[id]/dry-runs/[runId]/route.ts': { get: { summary: 'A dry run: state, plans done of total, result when done', access: admins, ok: ok200('The run.') } },
  'rule-sets/[id]/publish/route.ts': { post: { summary: 'Publish a draft', access: admins, body: json(publishSchema), ok: ok200('The published version.'), conflict: 'Changed since read, or unchecked citations need confirm: true (needsConfirmation).' } },
  'rule-sets/[id]/retire/route.ts': { post: { summary: 'Retire a published version', access: admins, body: json(retireSchema), ok: ok200('Retired.'), conflict: 'A draft, already retired, or no successor.' } },
  'rule-sets/[id]/rules/route.ts': { post: { summary: 'Add a rule to a draft', access: admins, body: json(ruleSaveSchema), ok: ok201('The draft.'), conflict: 'Changed since read, or the key is taken.' } },
  'rule-sets/[id]/rules/[key]/route.ts': {
    put: { summary: "Change a draft's rule", access: admins, body: json(ruleSaveSchema), ok: ok200('The draft.'), conflict: 'Changed since read.' },
    delete: { summary: "Remove a rule from a draft", access: admins, query: revisionQuerySchema, ok: ok200('The draft.'), conflict: 'Changed since read.' },
  },
  'schema/plan/route.ts': { get: { summary: 'JSON Schema of a plan', access: 'public', ok: ok200('JSON Schema (draft 2020-12).') } },
  'sessions/revoke-others/route.ts': { post: { summary: 'Sign out your other sessions', access: 'browser', ok: ok200('How many ended.') } },
  'sign-up/route.ts': { post: { summary: 'Sign up a company and its owner', access: 'public', body: json(signUpSchema), ok: ok201('The account; a session cookie is set.'), conflict: 'The e-mail has an account.', rateLimited: 'Sign-ups per address and client an hour.' } },
  'tokens/route.ts': {
    get: { summary: 'Your API tokens', access: 'signed-in', ok: ok200('Tokens (never their secrets).') },
    post: { summary: 'Create an API token (shown once)', access: 'browser', body: json(newTokenSchema), ok: ok201('The token and its secret.'), rateLimited: 'Tokens per person an hour.' },
  },
  'tokens/[id]/route.ts': { delete: { summary: 'Revoke an API token', access: 'signed-in', ok: ok200('{ revoked: true }.') } },
  'users/route.ts': { get: { summary: 'Everyone (administrators)', access: admins, ok: ok200('People.') } },
  'users/[id]/route.ts': { patch: { summary: "Change a person's role or access", access: installersAndAdmins, body: json(personUpdateSchema), ok: ok200('The person as stored.') } },
  'openapi.json/route.ts': { get: { summary: 'This description (OpenAPI 3.1)', access: 'public', ok: ok200('The OpenAPI document.') } },
  // Webhooks: installers of the company read; owners change (others of the company get 403, other companies 404).
  'webhooks/route.ts': {
    get: { summary: "The company's webhook endpoints", access: installers, ok: ok200('Endpoints (never their secrets).') },
    post: { summary: 'Add a webhook endpoint (owner; the secret is shown once)', access: installers, body: json(webhookCreateSchema), ok: ok201('The endpoint and its signing secret.'), conflict: 'The company has the most endpoints allowed.' },
  },
  'webhooks/[id]/route.ts': {
    patch: { summary: 'Change a webhook endpoint (owner)', access: installers, body: json(webhookUpdateSchema), ok: ok200('The endpoint as stored.') },
    delete: { summary: 'Remove a webhook endpoint, or deactivate it when it has deliveries (owner)', access: installers, ok: ok200('{ deleted, deactivated, endpoint }.') },
  },
  'webhooks/[id]/rotate-secret/route.ts': { post: { summary: "Replace a webhook endpoint's signing secret (owner; shown once)", access: installers, ok: ok200('The endpoint and its new secret.') } },
  'webhooks/[id]/deliveries/route.ts': { get: { summary: "A webhook endpoint's latest deliveries", access: installers, query: webhookDeliveriesQuerySchema, ok: ok200('Deliveries with state, attempts and the last response status.') } },
  'webhook-deliveries/[id]/send-again/route.ts': {
    post: { summary: 'Queue a webhook delivery again after its last attempt failed (owner)', access: installers, ok: { status: 202, description: 'Queued again with a fresh set of attempts.' }, conflict: 'The delivery was delivered, is still being tried, or its endpoint is deactivated.' },
  },
};
