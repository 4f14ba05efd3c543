import { createHash, randomBytes, randomUUID } from 'node:crypto';
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative, sep } from 'node:path';
import bcrypt from 'bcryptjs';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { hallClosetPassPlan, longExhaustFailPlan } from '@/tests/fixtures/plans';
import { api, appDb, baseUrl, deactivateTestPeople, postJson, signIn, testAddress, waitForThumbnail } from './helpers';

/*
 * Who may do what, for every route handler and every page, from the file system: a route file,
 * an exported method, a page or a 'use server' file without an entry here fails the first tests.
 *
 * The six callers:
 *   anon   nobody signed in
 *   owner  installer@nookpass.demo, whose company (Demo Closet Works) owns the project
 *   other  other-installer@nookpass.demo, an installer of another company
 *   insp   inspector@nookpass.demo, Demo County, the project's jurisdiction (the report was sent there)
 *   oinsp  an inspector of Demo City, made for this test
 *   admin  admin@nookpass.demo
 *
 * The resources are real, made in beforeAll through the API: a Demo County project with a plan
 * revision and a check, a photo the report includes, the report sent to the county inspector,
 * a second photo to delete, an API token of the owner, and a throwaway jurisdiction with a
 * published version 1 and an open draft version 2.
 *
 * Other companies' projects and other jurisdictions' reports answer 404, not 403, on purpose:
 * the answer must not reveal that the id exists.
 */

const ROLES = ['anon', 'owner', 'other', 'insp', 'oinsp', 'admin'] as const;
type RoleName = (typeof ROLES)[number];
type Statuses = readonly [number, number, number, number, number, number];

type Ids = {
  projectId: string;
  checkId: string;
  attachmentId: string;
  attachmentToDeleteId: string;
  failedDerivativesAttachmentId: string;
  reportId: string;
  reportCode: string;
  mailId: string;
  tokenId: string;
  slug: string;
  publishedId: string;
  draftId: string;
  dryRunId: string;
  impactRunId: string;
  ruleKey: string;
  applianceId: string;
  applianceToDeleteId: string;
  invitationId: string;
  invitationToken: string;
  memberId: string;
  webhookId: string;
  webhookToDeleteId: string;
  webhookDeliveryId: string;
};

type Send =
  | { json: (ids: Ids) => unknown | Promise<unknown> }
  | { form: () => Promise<FormData> }
  | { bytes: () => Uint8Array };

/**
 * `ownAccounts`: the row is called by throwaway accounts of the six callers' roles, because the call acts on
 * the caller's whole account (ending its other sessions) and the demo accounts are signed in by other tests.
 */
type ApiRow = { path: (ids: Ids) => string; send?: Send; expect: Statuses; ownAccounts?: true; headers?: () => Record<string, string> };

/** Rows whose requests are counted per client address stand for a fresh address each call (X-Forwarded-For). */
const freshAddress = () => ({ 'x-forwarded-for': testAddress() });
const uniqueTag = () => randomBytes(5).toString('hex');
// A well-formed token that was never issued: 43 base64url characters.
const UNISSUED_TOKEN = 'A'.repeat(43);

const NIL_UUID = '00000000-0000-4000-8000-000000000000';
// The .test top-level name never resolves (RFC 2606), so deliveries to it fail at once and reach nobody.
const MATRIX_HOOK_URL = 'https://hooks.matrix.example.test/nookpass';

async function smallPng(shade: string): Promise<Buffer> {
  return sharp({ create: { width: 24, height: 16, channels: 3, background: shade } }).png().toBuffer();
}

async function photoForm(): Promise<FormData> {
  const form = new FormData();
  form.set('file', new Blob([new Uint8Array(await smallPng('#446688'))], { type: 'image/png' }), 'matrix-photo.png');
  form.set('caption', 'matrix upload');
  return form;
}

const db = appDb();

/** The draft's current revision, read just before a call that must carry it. */
async function draftRevision(id: string): Promise<number> {
  const row = await db.selectFrom('rule_sets').select('revision').where('id', '=', id).executeTakeFirstOrThrow();
  return row.revision;
}

let draftRule: Record<string, unknown>;

const a = (...s: Statuses) => s;

const matrixWasher = () => ({ kind: 'washer', label: `Matrix washer ${randomBytes(4).toString('hex')} (test)`, widthIn: 27, depthIn: 32, heightIn: 39 });

//                                                              anon owner other insp oinsp admin
const apiMatrix: Record<string, ApiRow> = {
  'GET /api/health':                             { path: () => '/api/health', expect: a(200, 200, 200, 200, 200, 200) },
  'GET /api/ping':                               { path: () => '/api/ping', expect: a(200, 200, 200, 200, 200, 200) },
  'GET /api/schema/plan':                        { path: () => '/api/schema/plan', expect: a(200, 200, 200, 200, 200, 200) },
  'GET /api/openapi.json':                       { path: () => '/api/openapi.json', expect: a(200, 200, 200, 200, 200, 200) },
  // next-auth's own endpoints answer everyone; the session is empty for anon.
  'GET /api/auth/[...nextauth]':                 { path: () => '/api/auth/session', expect: a(200, 200, 200, 200, 200, 200) },
  // A sign-out POST without next-auth's CSRF token is sent back to the confirmation page, signing nobody out.
  'POST /api/auth/[...nextauth]':                { path: () => '/api/auth/signout', send: { json: () => ({}) }, expect: a(302, 302, 302, 302, 302, 302) },
  'GET /api/me':                                 { path: () => '/api/me', expect: a(401, 200, 200, 200, 200, 200) },
  'GET /api/users':                              { path: () => '/api/users', expect: a(401, 403, 403, 403, 403, 200) },
  'GET /api/admin/audit':                        { path: () => '/api/admin/audit', expect: a(401, 403, 403, 403, 403, 200) },
  'GET /api/tokens':                             { path: () => '/api/tokens', expect: a(401, 200, 200, 200, 200, 200) },
  'POST /api/tokens':                            { path: () => '/api/tokens', send: { json: () => ({ name: 'authorization matrix' }) }, expect: a(401, 201, 201, 201, 201, 201) },
  // Someone else's token is "no live token on your account", whoever asks.
  'DELETE /api/tokens/[id]':                     { path: (i) => `/api/tokens/${i.tokenId}`, expect: a(401, 200, 404, 404, 404, 404) },
  // Ends the caller's other sessions; the current one stays, so the caller is still signed in.
  'POST /api/sessions/revoke-others':           { path: () => '/api/sessions/revoke-others', expect: a(401, 200, 200, 200, 200, 200), ownAccounts: true },
  'POST /api/evaluations':                       { path: () => '/api/evaluations', send: { json: () => ({ jurisdiction: 'demo-county', plan: hallClosetPassPlan }) }, expect: a(401, 200, 200, 200, 200, 200) },
  'GET /api/projects':                           { path: () => '/api/projects', expect: a(401, 200, 200, 403, 403, 200) },
  'GET /api/projects.csv':                       { path: () => '/api/projects.csv', expect: a(401, 200, 200, 403, 403, 200) },
  'POST /api/projects':                          { path: () => '/api/projects', send: { json: () => ({ name: 'Matrix project (test)', siteAddress: '1 Matrix Way', jurisdiction: 'demo-county' }) }, expect: a(401, 201, 201, 403, 403, 403) },
  'GET /api/projects/[id]':                      { path: (i) => `/api/projects/${i.projectId}`, expect: a(401, 200, 404, 403, 403, 200) },
  'PATCH /api/projects/[id]':                    { path: (i) => `/api/projects/${i.projectId}`, send: { json: () => ({ notes: 'Checked by the authorization matrix.' }) }, expect: a(401, 200, 404, 403, 403, 200) },
  'GET /api/projects/[id]/plans':                { path: (i) => `/api/projects/${i.projectId}/plans`, expect: a(401, 200, 404, 403, 403, 200) },
  'POST /api/projects/[id]/plans':               { path: (i) => `/api/projects/${i.projectId}/plans`, send: { json: () => ({ plan: longExhaustFailPlan }) }, expect: a(401, 201, 404, 403, 403, 403) },
  'GET /api/projects/[id]/plans/[number]':       { path: (i) => `/api/projects/${i.projectId}/plans/1`, expect: a(401, 200, 404, 403, 403, 200) },
  'GET /api/projects/[id]/checks':               { path: (i) => `/api/projects/${i.projectId}/checks`, expect: a(401, 200, 404, 403, 403, 200) },
  'POST /api/projects/[id]/checks':              { path: (i) => `/api/projects/${i.projectId}/checks`, send: { json: () => ({}) }, expect: a(401, 201, 404, 403, 403, 403) },
  'GET /api/projects/[id]/attachments':          { path: (i) => `/api/projects/${i.projectId}/attachments`, expect: a(401, 200, 404, 403, 403, 200) },
  'POST /api/projects/[id]/attachments':         { path: (i) => `/api/projects/${i.projectId}/attachments`, send: { form: photoForm }, expect: a(401, 201, 404, 403, 403, 403) },
  // The county inspector sees the photo because the report that includes it was sent to the county.
  // The appliance library is the company's installers' alone; another company's model answers 404.
  'GET /api/appliances':                         { path: () => '/api/appliances', expect: a(401, 200, 200, 403, 403, 403) },
  'POST /api/appliances':                        { path: () => '/api/appliances', send: { json: () => matrixWasher() }, expect: a(401, 201, 201, 403, 403, 403) },
  'GET /api/appliances/[id]':                    { path: (i) => `/api/appliances/${i.applianceId}`, expect: a(401, 200, 404, 403, 403, 403) },
  'PATCH /api/appliances/[id]':                  { path: (i) => `/api/appliances/${i.applianceId}`, send: { json: () => ({ frontProjectionIn: 2 }) }, expect: a(401, 200, 404, 403, 403, 403) },
  'DELETE /api/appliances/[id]':                 { path: (i) => `/api/appliances/${i.applianceToDeleteId}`, expect: a(401, 204, 404, 403, 403, 403) },
  'GET /api/appliances/csv':                     { path: () => '/api/appliances/csv', expect: a(401, 200, 200, 403, 403, 403) },
  'POST /api/appliances/csv':                    { path: () => '/api/appliances/csv', send: { bytes: () => new TextEncoder().encode(`kind,label,width_in,depth_in,height_in\r\nwasher,${matrixWasher().label},27,32,39\r\n`) }, expect: a(401, 201, 201, 403, 403, 403) },
  'POST /api/projects/[id]/duplicate':           { path: (i) => `/api/projects/${i.projectId}/duplicate`, send: { json: () => ({ name: 'Matrix copy (test)' }) }, expect: a(401, 201, 404, 403, 403, 403) },
  'POST /api/quick-checks':                      { path: () => '/api/quick-checks', send: { json: () => ({ name: 'Matrix quick check (test)', siteAddress: '3 Matrix Lane', jurisdiction: 'demo-county', plan: hallClosetPassPlan }) }, expect: a(401, 201, 201, 403, 403, 403) },
  'GET /api/attachments/[id]':                   { path: (i) => `/api/attachments/${i.attachmentId}`, expect: a(401, 200, 404, 200, 404, 200) },
  'PATCH /api/attachments/[id]':                 { path: (i) => `/api/attachments/${i.attachmentId}`, send: { json: () => ({ caption: 'Matrix caption' }) }, expect: a(401, 200, 404, 403, 403, 403) },
  'DELETE /api/attachments/[id]':                { path: (i) => `/api/attachments/${i.attachmentToDeleteId}`, expect: a(401, 200, 404, 403, 403, 403) },
  'GET /api/attachments/[id]/derivatives':       { path: (i) => `/api/attachments/${i.attachmentId}/derivatives`, expect: a(401, 200, 404, 200, 404, 200) },
  // The photo's images ended failed (set in the setup), so the company's installer may queue them again.
  'POST /api/attachments/[id]/derivatives':      { path: (i) => `/api/attachments/${i.failedDerivativesAttachmentId}/derivatives`, expect: a(401, 202, 404, 403, 403, 403) },
  'GET /api/checks/[id]':                        { path: (i) => `/api/checks/${i.checkId}`, expect: a(401, 200, 404, 403, 403, 200) },
  'GET /api/checks/[id]/findings.csv':           { path: (i) => `/api/checks/${i.checkId}/findings.csv`, expect: a(401, 200, 404, 403, 403, 200) },
  'POST /api/checks/[id]/report':                { path: (i) => `/api/checks/${i.checkId}/report`, expect: a(401, 200, 404, 403, 403, 200) },
  'POST /api/checks/[id]/send':                  { path: (i) => `/api/checks/${i.checkId}/send`, send: { json: () => ({ note: 'Sent by the authorization matrix.', confirmFailingFindings: true }) }, expect: a(401, 201, 404, 403, 403, 403) },
  // Public on purpose: whoever holds the paper can confirm it.
  'GET /api/reports/[code]':                     { path: (i) => `/api/reports/${i.reportCode}`, expect: a(200, 200, 200, 200, 200, 200) },
  'POST /api/reports/[code]/verify':             { path: (i) => `/api/reports/${i.reportCode}/verify`, send: { bytes: () => new TextEncoder().encode('%PDF-1.4 not the report') }, expect: a(200, 200, 200, 200, 200, 200) },
  'GET /api/reports/[code]/pdf':                 { path: (i) => `/api/reports/${i.reportCode}/pdf`, expect: a(401, 200, 404, 200, 404, 200) },
  'GET /api/reports/[code]/answers':             { path: (i) => `/api/reports/${i.reportCode}/answers`, expect: a(401, 200, 404, 200, 404, 200) },
  // No outcome asks for corrections on the matrix report, so the owner's answer is a 409 (and changes nothing).
  'POST /api/reports/[code]/answers':            { path: (i) => `/api/reports/${i.reportCode}/answers`, send: { json: (i) => ({ checkId: i.checkId, note: 'Matrix answer.' }) }, expect: a(401, 409, 404, 403, 403, 403) },
  'GET /api/inspections':                        { path: () => '/api/inspections', expect: a(401, 403, 403, 200, 200, 200) },
  // The report e-mail: seen by whoever can read the report; sent again only after its last attempt failed.
  'GET /api/mail/[id]':                          { path: (i) => `/api/mail/${i.mailId}`, expect: a(401, 200, 404, 200, 404, 200) },
  'POST /api/mail/[id]/send-again':              { path: (i) => `/api/mail/${i.mailId}/send-again`, expect: a(401, 409, 404, 409, 404, 409) },
  'GET /api/inspections/[reportId]':             { path: (i) => `/api/inspections/${i.reportId}`, expect: a(401, 403, 403, 200, 404, 200) },
  'POST /api/inspections/[reportId]/review':     { path: (i) => `/api/inspections/${i.reportId}/review`, send: { json: () => ({ outcome: 'approved', comment: 'Matrix review.' }) }, expect: a(401, 403, 403, 201, 404, 403) },
  'GET /api/jurisdictions':                      { path: () => '/api/jurisdictions', expect: a(401, 200, 200, 200, 200, 200) },
  'POST /api/jurisdictions':                     { path: () => '/api/jurisdictions', send: { json: () => jurisdictionBody(`it-matrix-new-${randomBytes(4).toString('hex')}`) }, expect: a(401, 403, 403, 403, 403, 201) },
  'GET /api/jurisdictions/[slug]':               { path: (i) => `/api/jurisdictions/${i.slug}`, expect: a(401, 403, 403, 403, 403, 200) },
  'PATCH /api/jurisdictions/[slug]':             { path: (i) => `/api/jurisdictions/${i.slug}`, send: { json: () => ({ amendmentNotes: 'Edited by the authorization matrix.' }) }, expect: a(401, 403, 403, 403, 403, 200) },
  'GET /api/jurisdictions/[slug]/audit':         { path: (i) => `/api/jurisdictions/${i.slug}/audit`, expect: a(401, 403, 403, 403, 403, 200) },
  'GET /api/jurisdictions/[slug]/impact':        { path: (i) => `/api/jurisdictions/${i.slug}/impact`, expect: a(401, 403, 403, 403, 403, 200) },
  'POST /api/jurisdictions/[slug]/impact-runs':  { path: (i) => `/api/jurisdictions/${i.slug}/impact-runs`, send: { json: () => ({}) }, expect: a(401, 403, 403, 403, 403, 202) },
  'GET /api/jurisdictions/[slug]/impact-runs/[runId]': { path: (i) => `/api/jurisdictions/${i.slug}/impact-runs/${i.impactRunId}`, expect: a(401, 403, 403, 403, 403, 200) },
  'GET /api/jurisdictions/[slug]/published/[version]': { path: (i) => `/api/jurisdictions/${i.slug}/published/1`, expect: a(401, 200, 200, 200, 200, 200) },
  'GET /api/jurisdictions/[slug]/rule-sets':     { path: (i) => `/api/jurisdictions/${i.slug}/rule-sets`, expect: a(401, 403, 403, 403, 403, 200) },
  // A jurisdiction has at most one open draft; the admin passes the role check and meets that rule.
  'POST /api/jurisdictions/[slug]/rule-sets':    { path: (i) => `/api/jurisdictions/${i.slug}/rule-sets`, send: { json: () => ({ from: 'published' }) }, expect: a(401, 403, 403, 403, 403, 409) },
  'GET /api/rule-sets/[id]':                     { path: (i) => `/api/rule-sets/${i.draftId}`, expect: a(401, 403, 403, 403, 403, 200) },
  'PATCH /api/rule-sets/[id]':                   { path: (i) => `/api/rule-sets/${i.draftId}`, send: { json: async (i) => ({ revision: await draftRevision(i.draftId), changelog: 'Matrix changelog.' }) }, expect: a(401, 403, 403, 403, 403, 200) },
  'POST /api/rule-sets/[id]/rules':              { path: (i) => `/api/rule-sets/${i.draftId}/rules`, send: { json: async (i) => ({ revision: await draftRevision(i.draftId), rule: { ...draftRule, key: i.ruleKey } }) }, expect: a(401, 403, 403, 403, 403, 201) },
  'PUT /api/rule-sets/[id]/rules/[key]':         { path: (i) => `/api/rule-sets/${i.draftId}/rules/${i.ruleKey}`, send: { json: async (i) => ({ revision: await draftRevision(i.draftId), rule: { ...draftRule, key: i.ruleKey, title: 'Matrix copy, edited' } }) }, expect: a(401, 403, 403, 403, 403, 200) },
  'DELETE /api/rule-sets/[id]/rules/[key]':      { path: (i) => `/api/rule-sets/${i.draftId}/rules/${i.ruleKey}?revision=${REVISION_PLACEHOLDER}`, expect: a(401, 403, 403, 403, 403, 200) },
  'GET /api/rule-sets/[id]/diff':                { path: (i) => `/api/rule-sets/${i.draftId}/diff?against=${i.publishedId}`, expect: a(401, 403, 403, 403, 403, 200) },
  'GET /api/rule-sets/[id]/citations':          { path: (i) => `/api/rule-sets/${i.draftId}/citations`, expect: a(401, 403, 403, 403, 403, 200) },
  'POST /api/rule-sets/[id]/citations':         { path: (i) => `/api/rule-sets/${i.draftId}/citations`, send: { json: () => ({ ruleKey: 'exhaust.developed-length', checked: true, against: 'IRC 2018 as adopted (matrix test)' }) }, expect: a(401, 403, 403, 403, 403, 201) },
  'POST /api/rule-sets/[id]/dry-run':            { path: (i) => `/api/rule-sets/${i.draftId}/dry-run`, send: { json: () => ({}) }, expect: a(401, 403, 403, 403, 403, 200) },
  'POST /api/rule-sets/[id]/dry-runs':           { path: (i) => `/api/rule-sets/${i.draftId}/dry-runs`, send: { json: () => ({}) }, expect: a(401, 403, 403, 403, 403, 202) },
  'GET /api/rule-sets/[id]/dry-runs/[runId]':    { path: (i) => `/api/rule-sets/${i.draftId}/dry-runs/${i.dryRunId}`, expect: a(401, 403, 403, 403, 403, 200) },
  // The three rows below would end the draft, so the admin sends a stale revision on purpose:
  // past the role check, the revision check refuses (409) and the draft stays for the pages.
  'POST /api/rule-sets/[id]/publish':            { path: (i) => `/api/rule-sets/${i.draftId}/publish`, send: { json: () => ({ revision: 9999, changelog: 'Never published.' }) }, expect: a(401, 403, 403, 403, 403, 409) },
  'POST /api/rule-sets/[id]/retire':             { path: (i) => `/api/rule-sets/${i.publishedId}/retire`, send: { json: (i) => ({ successorId: i.draftId, revision: 9999, changelog: 'Never retired.' }) }, expect: a(401, 403, 403, 403, 403, 409) },
  'DELETE /api/rule-sets/[id]':                  { path: (i) => `/api/rule-sets/${i.draftId}?revision=9999`, expect: a(401, 403, 403, 403, 403, 409) },
  // Owners invite into their company; an admin invites inspectors and admins, so an installer role is a 400 naming it.
  'GET /api/invitations':                        { path: () => '/api/invitations', expect: a(401, 200, 403, 403, 403, 200) },
  'POST /api/invitations':                       { path: () => '/api/invitations', send: { json: () => ({ email: `matrix-invitee-${randomBytes(4).toString('hex')}@example.test`, role: 'installer' }) }, expect: a(401, 201, 403, 403, 403, 400) },
  // The owner's company sent it: the admins (who send their own) do not see it; plain installers may not revoke.
  'DELETE /api/invitations/[id]':                { path: (i) => `/api/invitations/${i.invitationId}`, expect: a(401, 200, 403, 403, 403, 404) },
  // Public: the link is the credential. The first caller (anon) uses it; everyone after finds it used.
  'POST /api/invitations/[id]/accept':           { path: (i) => `/api/invitations/${i.invitationToken}/accept`, send: { json: () => ({ name: 'Matrix Invitee', password: 'matrix-invitee-password' }) }, expect: a(201, 409, 409, 409, 409, 409) },
  'GET /api/organization/members':               { path: () => '/api/organization/members', expect: a(401, 200, 403, 403, 403, 403) },
  'GET /api/organization/audit':                 { path: () => '/api/organization/audit', expect: a(401, 200, 403, 403, 403, 403) },
  // A no-op role change of a teammate in the owner's company; plain installers may not change people.
  'PATCH /api/users/[id]':                       { path: (i) => `/api/users/${i.memberId}`, send: { json: () => ({ role: 'installer' }) }, expect: a(401, 200, 403, 403, 403, 200) },
  // Anyone may sign a new company up, signed in or not; each call is a new company from a new address.
  'POST /api/sign-up':                           { path: () => '/api/sign-up', send: { json: () => { const t = uniqueTag(); return { company: `Matrix Co ${t} (test)`, name: 'Matrix Person', email: `matrix-signup-${t}@example.test`, password: 'matrix sign-up password' }; } }, headers: freshAddress, expect: a(201, 201, 201, 201, 201, 201) },
  // The demo people's addresses are confirmed already: past the sign-in check, nothing is sent (409).
  'POST /api/email-confirmations':               { path: () => '/api/email-confirmations', headers: freshAddress, expect: a(401, 409, 409, 409, 409, 409) },
  // A link works for whoever holds it; one never issued is 404 for everyone.
  'POST /api/email-confirmations/[token]':       { path: () => `/api/email-confirmations/${UNISSUED_TOKEN}`, expect: a(404, 404, 404, 404, 404, 404) },
  // The same 202 for everyone, known address or not.
  'POST /api/password-resets':                   { path: () => '/api/password-resets', send: { json: () => ({ email: `matrix-nobody-${uniqueTag()}@example.test` }) }, headers: freshAddress, expect: a(202, 202, 202, 202, 202, 202) },
  'POST /api/password-resets/[token]':           { path: () => `/api/password-resets/${UNISSUED_TOKEN}`, send: { json: () => ({ password: 'matrix new password' }) }, expect: a(404, 404, 404, 404, 404, 404) },
  // Signed-in browsers only; the wrong current password is refused beside its field (400), changing nothing.
  'POST /api/account/password':                  { path: () => '/api/account/password', send: { json: () => ({ currentPassword: 'not the password', password: 'matrix new password' }) }, expect: a(401, 400, 400, 400, 400, 400) },
  // An installer reads their own company; only its owner changes it (the matrix owner owns Demo Closet Works).
  'GET /api/organization':                       { path: () => '/api/organization', expect: a(401, 200, 200, 403, 403, 403) },
  'PATCH /api/organization':                     { path: () => '/api/organization', send: { json: () => ({ name: 'Demo Closet Works', licenseNumber: 'DEMO-HIC-000123' }) }, expect: a(401, 200, 403, 403, 403, 403) },
  // Webhooks follow the company settings: its installers read, its owners change; another company's endpoint is 404.
  'GET /api/webhooks':                           { path: () => '/api/webhooks', expect: a(401, 200, 200, 403, 403, 403) },
  'POST /api/webhooks':                          { path: () => '/api/webhooks', send: { json: () => ({ url: MATRIX_HOOK_URL, events: ['report.sent'] }) }, expect: a(401, 201, 403, 403, 403, 403) },
  'PATCH /api/webhooks/[id]':                    { path: (i) => `/api/webhooks/${i.webhookId}`, send: { json: () => ({ events: ['report.sent', 'inspection.outcome_recorded'] }) }, expect: a(401, 200, 403, 403, 403, 403) },
  'DELETE /api/webhooks/[id]':                   { path: (i) => `/api/webhooks/${i.webhookToDeleteId}`, expect: a(401, 200, 403, 403, 403, 403) },
  'POST /api/webhooks/[id]/rotate-secret':       { path: (i) => `/api/webhooks/${i.webhookId}/rotate-secret`, expect: a(401, 200, 403, 403, 403, 403) },
  'GET /api/webhooks/[id]/deliveries':           { path: (i) => `/api/webhooks/${i.webhookId}/deliveries`, expect: a(401, 200, 404, 403, 403, 403) },
  // The matrix delivery was delivered already: past the checks, the owner meets a 409 and nothing is sent.
  'POST /api/webhook-deliveries/[id]/send-again': { path: (i) => `/api/webhook-deliveries/${i.webhookDeliveryId}/send-again`, expect: a(401, 409, 403, 403, 403, 403) },
};

// DELETE carries the revision in the query; it is filled in just before the call.
const REVISION_PLACEHOLDER = '__revision__';

type PageOutcome = 'ok' | 'sign-in' | 'forbidden' | 'not-found' | `→ ${string}`;
type PageRow = { path: (ids: Ids) => string; expect: readonly [PageOutcome, PageOutcome, PageOutcome, PageOutcome, PageOutcome, PageOutcome] };
const p = (...s: PageRow['expect']) => s;

//                                                anon       owner   other        insp         oinsp        admin
const pageMatrix: Record<string, PageRow> = {
  '/':                                  { path: () => '/', expect: p('ok', 'ok', 'ok', 'ok', 'ok', 'ok') },
  '/sign-in':                           { path: () => '/sign-in', expect: p('ok', 'ok', 'ok', 'ok', 'ok', 'ok') },
  '/sign-out':                          { path: () => '/sign-out', expect: p('ok', 'ok', 'ok', 'ok', 'ok', 'ok') },
  '/forbidden':                         { path: () => '/forbidden?from=%2Fusers', expect: p('ok', 'ok', 'ok', 'ok', 'ok', 'ok') },
  '/verify/[code]':                     { path: (i) => `/verify/${i.reportCode}`, expect: p('ok', 'ok', 'ok', 'ok', 'ok', 'ok') },
  '/home':                              { path: () => '/home', expect: p('sign-in', '→ /projects', '→ /projects', '→ /inspections', '→ /inspections', '→ /rules') },
  '/account':                           { path: () => '/account', expect: p('sign-in', 'ok', 'ok', 'ok', 'ok', 'ok') },
  '/appliances':                        { path: () => '/appliances', expect: p('sign-in', 'ok', 'ok', 'forbidden', 'forbidden', 'forbidden') },
  '/quick-check':                       { path: () => '/quick-check', expect: p('sign-in', 'ok', 'ok', 'forbidden', 'forbidden', 'forbidden') },
  '/projects':                          { path: () => '/projects', expect: p('sign-in', 'ok', 'ok', 'forbidden', 'forbidden', 'ok') },
  '/projects/new':                      { path: () => '/projects/new', expect: p('sign-in', 'ok', 'ok', 'forbidden', 'forbidden', 'forbidden') },
  '/projects/[id]':                     { path: (i) => `/projects/${i.projectId}`, expect: p('sign-in', 'ok', 'not-found', 'forbidden', 'forbidden', 'ok') },
  '/projects/[id]/edit':                { path: (i) => `/projects/${i.projectId}/edit`, expect: p('sign-in', 'ok', 'not-found', 'forbidden', 'forbidden', 'ok') },
  '/projects/[id]/plan':                { path: (i) => `/projects/${i.projectId}/plan`, expect: p('sign-in', 'ok', 'not-found', 'forbidden', 'forbidden', 'ok') },
  '/projects/[id]/drawing':             { path: (i) => `/projects/${i.projectId}/drawing`, expect: p('sign-in', 'ok', 'not-found', 'forbidden', 'forbidden', 'ok') },
  '/projects/[id]/checks/[checkId]':    { path: (i) => `/projects/${i.projectId}/checks/${i.checkId}`, expect: p('sign-in', 'ok', 'not-found', 'forbidden', 'forbidden', 'ok') },
  '/inspections':                       { path: () => '/inspections', expect: p('sign-in', 'forbidden', 'forbidden', 'ok', 'ok', 'ok') },
  '/inspections/[reportId]':            { path: (i) => `/inspections/${i.reportId}`, expect: p('sign-in', 'forbidden', 'forbidden', 'ok', 'not-found', 'ok') },
  '/rules':                             { path: () => '/rules', expect: p('sign-in', 'forbidden', 'forbidden', 'forbidden', 'forbidden', 'ok') },
  '/rules/[slug]':                      { path: (i) => `/rules/${i.slug}`, expect: p('sign-in', 'forbidden', 'forbidden', 'forbidden', 'forbidden', 'ok') },
  '/rules/[slug]/versions/[version]':   { path: (i) => `/rules/${i.slug}/versions/2`, expect: p('sign-in', 'forbidden', 'forbidden', 'forbidden', 'forbidden', 'ok') },
  '/rules/[slug]/diff':                 { path: (i) => `/rules/${i.slug}/diff?from=1&to=2`, expect: p('sign-in', 'forbidden', 'forbidden', 'forbidden', 'forbidden', 'ok') },
  '/rules/[slug]/impact':               { path: (i) => `/rules/${i.slug}/impact`, expect: p('sign-in', 'forbidden', 'forbidden', 'forbidden', 'forbidden', 'ok') },
  '/jurisdictions':                     { path: () => '/jurisdictions', expect: p('sign-in', 'forbidden', 'forbidden', 'forbidden', 'forbidden', 'ok') },
  '/jurisdictions/new':                 { path: () => '/jurisdictions/new', expect: p('sign-in', 'forbidden', 'forbidden', 'forbidden', 'forbidden', 'ok') },
  '/jurisdictions/[slug]':              { path: (i) => `/jurisdictions/${i.slug}`, expect: p('sign-in', 'forbidden', 'forbidden', 'forbidden', 'forbidden', 'ok') },
  '/users':                             { path: () => '/users', expect: p('sign-in', 'forbidden', 'forbidden', 'forbidden', 'forbidden', 'ok') },
  // The matrix owner owns Demo Closet Works; the other company's installer is not an owner.
  '/people':                            { path: () => '/people', expect: p('sign-in', 'ok', 'forbidden', 'forbidden', 'forbidden', 'forbidden') },
  '/audit':                             { path: () => '/audit', expect: p('sign-in', 'ok', 'forbidden', 'forbidden', 'forbidden', 'ok') },
  '/invitations/[token]':               { path: (i) => `/invitations/${i.invitationToken}`, expect: p('ok', 'ok', 'ok', 'ok', 'ok', 'ok') },
  '/sign-up':                           { path: () => '/sign-up', expect: p('ok', 'ok', 'ok', 'ok', 'ok', 'ok') },
  '/forgot-password':                   { path: () => '/forgot-password', expect: p('ok', 'ok', 'ok', 'ok', 'ok', 'ok') },
  '/reset-password/[token]':            { path: () => `/reset-password/${UNISSUED_TOKEN}`, expect: p('ok', 'ok', 'ok', 'ok', 'ok', 'ok') },
  '/confirm-email/[token]':             { path: () => `/confirm-email/${UNISSUED_TOKEN}`, expect: p('ok', 'ok', 'ok', 'ok', 'ok', 'ok') },
  '/company':                           { path: () => '/company', expect: p('sign-in', 'ok', 'ok', 'forbidden', 'forbidden', 'forbidden') },
};

/** Files with a 'use server' directive (server actions), each with the roles its actions accept. None exist today. */
const serverActions: Record<string, { roles: readonly RoleName[] }> = {};

// ---------------------------------------------------------------------------------------------

const root = process.cwd();
const METHODS = ['GET', 'HEAD', 'POST', 'PUT', 'PATCH', 'DELETE', 'OPTIONS'] as const;

function walk(dir: string, out: string[] = []): string[] {
  for (const name of readdirSync(dir)) {
    if (name === 'node_modules' || name.startsWith('.')) continue;
    const full = join(dir, name);
    if (statSync(full).isDirectory()) walk(full, out);
    else out.push(full);
  }
  return out;
}

/** '/app/(app)/projects/[id]/page.tsx' → '/projects/[id]': route groups do not show in the URL. */
function urlPattern(file: string): string {
  const parts = relative(join(root, 'app'), file).split(sep).slice(0, -1).filter((s) => !/^\(.*\)$/.test(s));
  return '/' + parts.join('/');
}

/** The HTTP methods a route file exports, as `export const GET`, `export async function POST` or `export { h as GET }`. */
function exportedMethods(source: string): string[] {
  const found = new Set<string>();
  for (const m of source.matchAll(/export\s+(?:const|let|async\s+function|function)\s+([A-Z]+)\b/g)) found.add(m[1]);
  for (const m of source.matchAll(/export\s*\{([^}]*)\}/g)) {
    for (const part of m[1].split(',')) found.add(part.trim().split(/\s+as\s+/).pop()!.trim());
  }
  return [...found].filter((name) => (METHODS as readonly string[]).includes(name));
}

function routeEntries(): string[] {
  return walk(join(root, 'app'))
    .filter((f) => f.endsWith(`${sep}route.ts`))
    .flatMap((f) => exportedMethods(readFileSync(f, 'utf8')).map((m) => `${m} ${urlPattern(f)}`))
    .sort();
}

function pageEntries(): string[] {
  return walk(join(root, 'app')).filter((f) => f.endsWith(`${sep}page.tsx`)).map(urlPattern).sort();
}

function useServerFiles(): string[] {
  return ['app', 'lib', 'components', 'db']
    .flatMap((d) => walk(join(root, d)))
    .filter((f) => /\.(ts|tsx|js|mjs)$/.test(f))
    .filter((f) => /^\s*['"]use server['"]/m.test(readFileSync(f, 'utf8')))
    .map((f) => relative(root, f).split(sep).join('/'))
    .sort();
}

describe('the matrix covers the file system', () => {
  it('has exactly one entry per exported method of every route.ts under app/api', () => {
    const onDisk = routeEntries();
    expect(onDisk.length).toBeGreaterThan(40);
    expect(Object.keys(apiMatrix).sort()).toEqual(onDisk);
  });

  it('has exactly one entry per page.tsx under app', () => {
    const onDisk = pageEntries();
    expect(onDisk.length).toBeGreaterThan(20);
    expect(Object.keys(pageMatrix).sort()).toEqual(onDisk);
  });

  it("has an entry for every file with a 'use server' directive (none today)", () => {
    expect(Object.keys(serverActions).sort()).toEqual(useServerFiles());
  });

  it('reads the exports the way Next does', () => {
    expect(exportedMethods("import x from 'y';\nexport const GET = route(a);\nexport async function POST() {}\nexport { handler as PATCH, other as DELETE };\nexport const dynamic = 'force-dynamic';")).toEqual(['GET', 'POST', 'PATCH', 'DELETE']);
    expect(urlPattern(join(root, 'app', '(app)', 'projects', '[id]', 'page.tsx'))).toBe('/projects/[id]');
  });
});

// ---------------------------------------------------------------------------------------------

const cookies = {} as Record<RoleName, string | undefined>;
const ownAccountCookies = {} as Record<RoleName, string | undefined>;
const ids = {} as Ids;

function jurisdictionBody(slug: string) {
  return {
    slug,
    name: `IT matrix ${slug.slice(-8)} (test)`,
    region: 'Test State (invented)',
    editions: { building: 'IRC 2018', electrical: 'NEC 2017', plumbing: 'IPC 2018', plumbingFamily: 'IPC', mechanical: 'IMC 2018', fuelGas: 'IFGC 2018' },
    inspectorEmail: '',
    amendmentNotes: 'Throwaway jurisdiction of the authorization matrix.',
    startFrom: 'baseline',
    publishChangelog: 'Version 1 (test): model codes as published.',
    confirm: true, // its from-memory citations published unchecked
  };
}

async function must(res: { status: number; body: any }, status: number, what: string) {
  expect(res.status, `${what}: ${JSON.stringify(res.body)}`).toBe(status);
  return res.body;
}

async function uploadPhoto(cookie: string, shade: string): Promise<string> {
  const form = new FormData();
  form.set('file', new Blob([new Uint8Array(await smallPng(shade))], { type: 'image/png' }), 'matrix.png');
  form.set('caption', 'Matrix photo');
  const res = await fetch(`${baseUrl}/api/projects/${ids.projectId}/attachments`, { method: 'POST', headers: { cookie }, body: form });
  const body = await res.json();
  expect(res.status, JSON.stringify(body)).toBe(201);
  return body.id;
}

const cityEmail = `matrix-city-inspector-${randomBytes(4).toString('hex')}@example.test`;
const ownEmails: string[] = [];

beforeAll(async () => {
  // The demo company's first installer owns it (as the demo seed records); set here too, so this file does not depend on the seed's age.
  await db.updateTable('users').set({ is_owner: true }).where('email', '=', 'installer@nookpass.demo').execute();
  const city = await db.selectFrom('jurisdictions').select('id').where('slug', '=', 'demo-city').executeTakeFirstOrThrow();
  await db
    .insertInto('users')
    .values({ email: cityEmail, name: 'Matrix City Inspector', role: 'inspector', jurisdiction_id: city.id, password_hash: await bcrypt.hash('matrix-city-pw', 4) })
    .execute();
  [cookies.owner, cookies.other, cookies.insp, cookies.oinsp, cookies.admin] = await Promise.all([
    signIn('installer@nookpass.demo'),
    signIn('other-installer@nookpass.demo'),
    signIn('inspector@nookpass.demo'),
    signIn(cityEmail, 'matrix-city-pw'),
    signIn('admin@nookpass.demo'),
  ]);
  cookies.anon = undefined;

  // Throwaway accounts with the callers' roles and places, for rows that act on the whole account.
  const secondCompany = await db.selectFrom('organizations').select('id').where('name', '=', 'Demo Second Company').executeTakeFirstOrThrow();
  const firstCompany = await db.selectFrom('organizations').select('id').where('name', '=', 'Demo Closet Works').executeTakeFirstOrThrow();
  const county = await db.selectFrom('jurisdictions').select('id').where('slug', '=', 'demo-county').executeTakeFirstOrThrow();
  const own: [RoleName, 'installer' | 'inspector' | 'admin', string | null, string | null][] = [
    ['owner', 'installer', firstCompany.id, null],
    ['other', 'installer', secondCompany.id, null],
    ['insp', 'inspector', null, county.id],
    ['oinsp', 'inspector', null, city.id],
    ['admin', 'admin', null, null],
  ];
  await Promise.all(own.map(async ([role, dbRole, organization_id, jurisdiction_id]) => {
    const email = `matrix-own-${role}-${randomBytes(4).toString('hex')}@example.test`;
    ownEmails.push(email);
    await db.insertInto('users').values({ email, name: `Matrix own ${role}`, role: dbRole, organization_id, jurisdiction_id, password_hash: await bcrypt.hash('matrix-own-pw', 4) }).execute();
    ownAccountCookies[role] = await signIn(email, 'matrix-own-pw');
  }));
  const owner = cookies.owner!;
  const admin = cookies.admin!;

  ids.projectId = (await must(await api('/api/projects', postJson({ name: 'Matrix closet (test)', siteAddress: '2 Matrix Lane', jurisdiction: 'demo-county' }, { cookie: owner })), 201, 'project')).id;
  await must(await api(`/api/projects/${ids.projectId}/plans`, postJson({ plan: longExhaustFailPlan }, { cookie: owner })), 201, 'plan');
  ids.checkId = (await must(await api(`/api/projects/${ids.projectId}/checks`, postJson({}, { cookie: owner })), 201, 'check')).id;
  ids.attachmentId = await uploadPhoto(owner, '#336699');
  const sent = await must(await api(`/api/checks/${ids.checkId}/send`, postJson({ confirmFailingFindings: true }, { cookie: owner })), 201, 'send');
  ids.reportCode = sent.report.code;
  ids.mailId = sent.mail.id;
  ids.reportId = (await db.selectFrom('reports').select('id').where('code', '=', ids.reportCode).executeTakeFirstOrThrow()).id;
  ids.attachmentToDeleteId = await uploadPhoto(owner, '#993366');
  ids.failedDerivativesAttachmentId = await uploadPhoto(owner, '#669933');
  // Once its job is done, the photo's images are recorded as failed, as after a last attempt.
  await waitForThumbnail(ids.failedDerivativesAttachmentId, owner);
  await db.updateTable('attachments').set({ derivatives_status: 'failed', derivatives_error: 'matrix: held as failed' }).where('id', '=', ids.failedDerivativesAttachmentId).execute();
  ids.applianceId = (await must(await api('/api/appliances', postJson(matrixWasher(), { cookie: owner })), 201, 'appliance')).id;
  ids.applianceToDeleteId = (await must(await api('/api/appliances', postJson(matrixWasher(), { cookie: owner })), 201, 'appliance to delete')).id;
  ids.tokenId = (await must(await api('/api/tokens', postJson({ name: 'matrix: to be revoked' }, { cookie: owner })), 201, 'token')).id;

  ids.slug = `it-matrix-${randomBytes(4).toString('hex')}`;
  ids.publishedId = (await must(await api('/api/jurisdictions', postJson(jurisdictionBody(ids.slug), { cookie: admin })), 201, 'jurisdiction')).draft.id;
  ids.draftId = (await must(await api(`/api/jurisdictions/${ids.slug}/rule-sets`, postJson({ from: 'published' }, { cookie: admin })), 201, 'draft')).id;
  const set = await must(await api(`/api/rule-sets/${ids.draftId}`, { cookie: admin }), 200, 'draft read');
  draftRule = set.rules.find((r: { key: string }) => r.key === 'exhaust.developed-length');
  ids.ruleKey = 'local.matrix-copy';
  ids.dryRunId = (await must(await api(`/api/rule-sets/${ids.draftId}/dry-runs`, postJson({}, { cookie: admin })), 202, 'dry run')).id;
  ids.impactRunId = (await must(await api(`/api/jurisdictions/${ids.slug}/impact-runs`, postJson({}, { cookie: admin })), 202, 'impact run')).id;

  ids.invitationId = (await must(await api('/api/invitations', postJson({ email: `matrix-revokable-${randomBytes(4).toString('hex')}@example.test`, role: 'installer' }, { cookie: owner })), 201, 'invitation')).id;
  // An invitation with a token of our own making, stored as the app stores them (SHA-256 hex), for the accept row.
  ids.invitationToken = randomBytes(32).toString('base64url');
  await db.insertInto('invitations').values({
    email: `matrix-accepting-${randomBytes(4).toString('hex')}@example.test`, role: 'installer', organization_id: firstCompany.id,
    token_hash: createHash('sha256').update(ids.invitationToken).digest('hex'), expires_at: new Date(Date.now() + 24 * 3600_000),
  }).execute();
  ids.memberId = (await db.insertInto('users').values({
    email: `matrix-member-${randomBytes(4).toString('hex')}@example.test`, name: 'Matrix Member', role: 'installer', organization_id: firstCompany.id,
    password_hash: await bcrypt.hash('matrix-member-pw', 4),
  }).returning('id').executeTakeFirstOrThrow()).id;

  ids.webhookId = (await must(await api('/api/webhooks', postJson({ url: MATRIX_HOOK_URL, events: ['report.sent'] }, { cookie: owner })), 201, 'webhook')).id;
  ids.webhookToDeleteId = (await must(await api('/api/webhooks', postJson({ url: MATRIX_HOOK_URL, events: ['report.sent'] }, { cookie: owner })), 201, 'webhook to delete')).id;
  // Nothing the matrix does should reach them; they stay only for their rows.
  await db.updateTable('webhook_endpoints').set({ is_active: false }).where('id', 'in', [ids.webhookId, ids.webhookToDeleteId]).execute();
  ids.webhookDeliveryId = (await db.insertInto('webhook_deliveries').values({
    endpoint_id: ids.webhookId, event_id: randomUUID(), event_type: 'report.sent', payload: JSON.stringify({ matrix: true }), max_attempts: 1, status: 'delivered', attempts: 1, last_response_status: 204, delivered_at: new Date(),
  }).returning('id').executeTakeFirstOrThrow()).id;
}, 120_000);

afterAll(async () => {
  await deactivateTestPeople(db, cityEmail, ...ownEmails);
  // The endpoints the matrix added stop receiving (and stop counting against the company's limit).
  await db.updateTable('webhook_endpoints').set({ is_active: false }).where('url', '=', MATRIX_HOOK_URL).execute();
  await db.destroy();
});

async function call(row: ApiRow, role: RoleName): Promise<number> {
  const headers = new Headers(row.headers?.());
  const cookie = (row.ownAccounts ? ownAccountCookies : cookies)[role];
  if (cookie) headers.set('cookie', cookie);
  let path = row.path(ids);
  if (path.includes(REVISION_PLACEHOLDER)) path = path.replace(REVISION_PLACEHOLDER, String(await draftRevision(ids.draftId)));
  let body: BodyInit | undefined;
  if (row.send && 'json' in row.send) {
    headers.set('content-type', 'application/json');
    body = JSON.stringify(await row.send.json(ids));
  } else if (row.send && 'form' in row.send) {
    body = await row.send.form();
  } else if (row.send && 'bytes' in row.send) {
    headers.set('content-type', 'application/pdf');
    body = row.send.bytes() as BodyInit;
  }
  const method = Object.keys(apiMatrix).find((k) => apiMatrix[k] === row)!.split(' ')[0];
  const res = await fetch(`${baseUrl}${path}`, { method, headers, body, redirect: 'manual' });
  await res.arrayBuffer();
  return res.status;
}

describe('route handlers answer each caller as the matrix says', () => {
  it('for every route and method', { timeout: 180_000 }, async () => {
    const got: string[] = [];
    const want: string[] = [];
    for (const [entry, row] of Object.entries(apiMatrix)) {
      // Refusals first and together (they must change nothing), then the permitted callers one by one,
      // so the owner's DELETE comes after everyone else has tried the same id.
      const order = ROLES.map((role, i) => ({ role, status: row.expect[i] }));
      const refused = order.filter((o) => o.status >= 400 && o.status !== 409);
      const permitted = order.filter((o) => !refused.includes(o));
      const results = new Map<RoleName, number>();
      await Promise.all(refused.map(async (o) => results.set(o.role, await call(row, o.role))));
      for (const o of permitted) results.set(o.role, await call(row, o.role));
      got.push(`${entry.padEnd(44)} ${ROLES.map((r) => results.get(r)).join(' ')}`);
      want.push(`${entry.padEnd(44)} ${row.expect.join(' ')}`);
    }
    expect(got.join('\n')).toBe(want.join('\n'));
  });
});

async function pageOutcome(path: string, cookie: string | undefined): Promise<string> {
  const res = await fetch(`${baseUrl}${path}`, { headers: cookie ? { cookie } : {}, redirect: 'manual' });
  const html = await res.text();
  // A redirect is a status before streaming starts, or Next's in-page refresh once it has.
  const inPage = html.match(/<meta id="__next-page-redirect" http-equiv="refresh" content="\d+;url=([^"]+)"/)?.[1];
  const location = [301, 302, 303, 307, 308].includes(res.status) ? res.headers.get('location') : inPage;
  if (location) {
    const target = new URL(location.replace(/&amp;/g, '&'), baseUrl).pathname;
    if (target === '/sign-in') return 'sign-in';
    if (target === '/forbidden') return 'forbidden';
    return `→ ${target}`;
  }
  // notFound() after streaming started keeps the 200 but renders the not-found page with noindex.
  if (res.status === 404 || /<meta name="robots" content="noindex"\/>/.test(html)) return 'not-found';
  return res.status === 200 ? 'ok' : `status ${res.status}`;
}

describe('pages answer each caller as the matrix says', () => {
  it('for every page', { timeout: 180_000 }, async () => {
    const got: string[] = [];
    const want: string[] = [];
    for (const [entry, row] of Object.entries(pageMatrix)) {
      const outcomes = await Promise.all(ROLES.map((role) => pageOutcome(row.path(ids), cookies[role])));
      got.push(`${entry.padEnd(36)} ${outcomes.join(' | ')}`);
      want.push(`${entry.padEnd(36)} ${row.expect.join(' | ')}`);
    }
    expect(got.join('\n')).toBe(want.join('\n'));
  });

  it('never shows another company the project it refused', async () => {
    const html = await (await fetch(`${baseUrl}/projects/${ids.projectId}`, { headers: { cookie: cookies.other! } })).text();
    expect(html).not.toContain('2 Matrix Lane');
    const own = await (await fetch(`${baseUrl}/projects/${ids.projectId}`, { headers: { cookie: cookies.owner! } })).text();
    expect(own).toContain('2 Matrix Lane');
  });
});

describe('lists stay within the caller’s scope', () => {
  it('shows the sent report to the county inspector only, and the project to its own company only', async () => {
    const county = await api(`/api/inspections?q=${ids.reportCode}`, { cookie: cookies.insp });
    const city = await api(`/api/inspections?q=${ids.reportCode}`, { cookie: cookies.oinsp });
    expect(county.body.inspections.map((i: { code: string }) => i.code)).toContain(ids.reportCode);
    expect(city.body.inspections.map((i: { code: string }) => i.code)).not.toContain(ids.reportCode);
    const mine = await api('/api/projects?q=Matrix%20closet', { cookie: cookies.owner });
    const theirs = await api('/api/projects?q=Matrix%20closet', { cookie: cookies.other });
    expect(mine.body.items.map((i: { id: string }) => i.id)).toContain(ids.projectId);
    expect(theirs.body.items.map((i: { id: string }) => i.id)).not.toContain(ids.projectId);
  });

  it('answers an unknown id like a foreign one, so ids cannot be probed', async () => {
    expect((await api(`/api/projects/${NIL_UUID}`, { cookie: cookies.owner })).status).toBe(404);
    expect((await api(`/api/checks/${NIL_UUID}`, { cookie: cookies.owner })).status).toBe(404);
    expect((await api(`/api/attachments/${NIL_UUID}`, { cookie: cookies.owner })).status).toBe(404);
    expect((await api(`/api/inspections/${NIL_UUID}`, { cookie: cookies.insp })).status).toBe(404);
  });
});
