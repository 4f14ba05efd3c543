import type { ColumnType, Generated, Insertable, Selectable, Updateable } from 'kysely';

type Timestamp = ColumnType<Date, Date | string | undefined, Date | string>;
type CreatedAt = ColumnType<Date, Date | string | undefined, never>;
type Json<T> = ColumnType<T, string, string>;

import type { CheckOutcome } from '@/lib/domain/checks/outcome';
import type { PlumbingFamily } from '@/lib/domain/editions';
import type { MailKind, MailStatus } from '@/lib/domain/mail/outbox';
import type { AttachmentDerivativesStatus } from '@/lib/domain/attachments/derivatives';
import type { ReviewOutcome } from '@/lib/domain/reports/review-schema';
import type { Role } from '@/lib/domain/roles';
import type { RuleSetStatus } from '@/lib/domain/rule-sets/status';
import type { WebhookDeliveryStatus, WebhookEventType } from '@/lib/domain/webhooks/events';
import type { RuleSetRunKind, RuleSetRunState } from '@/lib/domain/rule-sets/runs';

export type { CheckOutcome, PlumbingFamily, ReviewOutcome, Role, RuleSetStatus };

export interface OrganizationsTable {
  id: Generated<string>;
  name: string;
  license_number: string | null;
  address: Generated<string>;
  phone: Generated<string>;
  default_jurisdiction_id: string | null;
  is_demo: Generated<boolean>;
  created_at: CreatedAt;
  updated_at: Generated<Date>;
}

export interface JurisdictionsTable {
  id: Generated<string>;
  slug: string;
  name: string;
  region: string;
  building_edition: string;
  electrical_edition: string;
  plumbing_edition: string;
  plumbing_family: PlumbingFamily;
  mechanical_edition: string;
  fuel_gas_edition: string;
  inspector_email: string | null;
  amendment_notes: Generated<string>;
  is_demo: Generated<boolean>;
  /** IANA time zone dates of the jurisdiction are shown in; UTC for rows made before zones were stored. */
  time_zone: Generated<string>;
  created_at: CreatedAt;
  updated_at: Timestamp;
}

export interface UsersTable {
  id: Generated<string>;
  email: string;
  name: string;
  password_hash: string;
  role: Role;
  organization_id: string | null;
  jurisdiction_id: string | null;
  /** An installer who administers their company (its people, settings and invitations). */
  is_owner: Generated<boolean>;
  /** Switched off: sessions and API tokens stop working; the person's records stay. */
  deactivated_at: Timestamp | null;
  email_confirmed_at: Timestamp | null;
  password_changed_at: Timestamp | null;
  is_demo: Generated<boolean>;
  created_at: CreatedAt;
  updated_at: Timestamp;
}

export type InvitedRole = 'installer' | 'owner' | 'inspector' | 'admin';

/** A single-use invitation; only the SHA-256 of its token is kept. */
export interface InvitationsTable {
  id: Generated<string>;
  email: string;
  role: InvitedRole;
  organization_id: string | null;
  jurisdiction_id: string | null;
  invited_by: string | null;
  token_hash: string;
  created_at: CreatedAt;
  expires_at: Timestamp;
  accepted_at: Timestamp | null;
  accepted_user_id: string | null;
  revoked_at: Timestamp | null;
}

/** A single-use token sent by e-mail (password reset, address confirmation); only its SHA-256 is kept. */
export interface EmailTokensTable {
  id: Generated<string>;
  user_id: string;
  token_hash: string;
  created_at: CreatedAt;
  expires_at: Timestamp;
  used_at: Timestamp | null;
}

export interface ApiTokensTable {
  id: Generated<string>;
  user_id: string;
  name: string;
  token_hash: string;
  token_prefix: string;
  created_at: CreatedAt;
  last_used_at: Timestamp | null;
  revoked_at: Timestamp | null;
  expires_at: Timestamp;
}

/** One signed-in browser; the session cookie names it. The database keeps expiry absolute and revocation final. */
export interface SessionsTable {
  id: Generated<string>;
  user_id: string;
  created_at: CreatedAt;
  last_seen_at: Timestamp;
  expires_at: Timestamp;
  revoked_at: Timestamp | null;
  user_agent: string | null;
  client_address: string | null;
}

export interface AuditLogTable {
  id: Generated<number>;
  at: CreatedAt;
  actor_user_id: string | null;
  action: string;
  entity_type: string;
  entity_id: string | null;
  details: Json<Record<string, unknown>>;
  /** The company whose owners may read this row (account events); null for platform-wide events. */
  organization_id: string | null;
}


export interface RuleSetsTable {
  id: Generated<string>;
  jurisdiction_id: string;
  version: number;
  status: Generated<RuleSetStatus>;
  parameters: Json<unknown>;
  /** Schema version of `parameters` (lib/domain/params/upgrade). */
  schema_version: number;
  changelog: Generated<string>;
  based_on_id: string | null;
  revision: Generated<number>;
  created_by: string | null;
  created_at: CreatedAt;
  updated_at: Timestamp;
  published_at: Timestamp | null;
  published_by: string | null;
  retired_at: Timestamp | null;
}

/** Append-only marks that a rule's citation was checked against the adopted text (draft versions only). */
export interface CitationChecksTable {
  id: Generated<string>;
  jurisdiction_id: string;
  rule_set_id: string;
  rule_key: string;
  citation: string;
  checked: boolean;
  checked_against: string | null;
  checked_by: string | null;
  checked_by_name: string;
  checked_at: CreatedAt;
  carried_from_id: string | null;
}

export interface RulesTable {
  id: Generated<string>;
  rule_set_id: string;
  key: string;
  position: number;
  title: string;
  area: string;
  enabled: Generated<boolean>;
  conditions: Json<unknown>;
  definition: Json<Record<string, unknown>>;
}

export interface ProjectsTable {
  id: Generated<string>;
  organization_id: string;
  jurisdiction_id: string;
  name: string;
  site_address: string;
  permit_number: string | null;
  notes: Generated<string>;
  is_demo: Generated<boolean>;
  archived_at: Timestamp | null;
  created_by: string | null;
  created_at: CreatedAt;
  updated_at: Timestamp;
}

export interface PlanRevisionsTable {
  id: Generated<string>;
  project_id: string;
  number: number;
  plan: Json<unknown>;
  canonical: Json<unknown>;
  /** Schema version of `plan` and `canonical` (lib/domain/plan/upgrade). */
  schema_version: number;
  change_summary: Generated<string>;
  created_by: string | null;
  created_at: CreatedAt;
}


export interface ChecksTable {
  id: Generated<string>;
  project_id: string;
  plan_revision_id: string;
  rule_set_id: string;
  inputs: Json<unknown>;
  facts: Json<unknown>;
  findings: Json<unknown>;
  summary: Json<unknown>;
  /** Schema version of the check's JSON columns (lib/domain/checks/stored). */
  schema_version: number;
  outcome: CheckOutcome;
  duration_ms: number;
  created_by: string | null;
  created_at: CreatedAt;
}

export interface AttachmentsTable {
  id: Generated<string>;
  project_id: string;
  kind: 'photo' | 'document';
  filename: string;
  content_type: string;
  byte_size: number;
  sha256: string;
  storage_key: string;
  thumbnail_key: string | null;
  width: number | null;
  height: number | null;
  caption: Generated<string>;
  created_by: string | null;
  created_at: CreatedAt;
  deleted_at: Timestamp | null;
  derivatives_status: ColumnType<AttachmentDerivativesStatus, AttachmentDerivativesStatus | undefined, AttachmentDerivativesStatus>;
  derivatives_attempts: Generated<number>;
  derivatives_max_attempts: Generated<number>;
  derivatives_error: string | null;
  derivatives_claimed_at: Timestamp | null;
  derivatives_updated_at: Timestamp;
}

export interface ReportsTable {
  id: Generated<string>;
  check_id: string;
  code: string;
  sha256: string;
  byte_size: number;
  page_count: number;
  storage_key: string;
  attachment_ids: Json<string[]>;
  /** Schema version of the report's JSON columns (lib/domain/reports/stored). */
  schema_version: number;
  /** What the report said when issued (lib/domain/reports/snapshot.ts); null only for reports issued before snapshots were kept. */
  snapshot: ColumnType<Record<string, unknown> | null, string | undefined, never>;
  created_by: string | null;
  created_at: CreatedAt;
}

export interface ReportSendsTable {
  id: Generated<string>;
  report_id: string;
  project_id: string;
  jurisdiction_id: string;
  to_email: string;
  status: 'sent' | 'failed';
  error: string | null;
  message_id: string | null;
  /** Sent to the jurisdiction's inspector address; null only for sends recorded before this was kept. */
  to_inspector: ColumnType<boolean | null, boolean | undefined, never>;
  /** The installer's note sent with the report; null when none was written or for sends recorded before it was kept. */
  note: ColumnType<string | null, string | null | undefined, never>;
  created_by: string | null;
  created_at: CreatedAt;
}


export interface InspectionReviewsTable {
  id: Generated<string>;
  report_id: string;
  /** The inspector who recorded the outcome. */
  created_by: string | null;
  outcome: ReviewOutcome;
  comment: Generated<string>;
  finding_comments: Json<Record<string, string>>;
  /** The outcome this one revises (same report); each outcome is revised at most once. */
  revises_id: ColumnType<string | null, string | null | undefined, never>;
  /** The installer's answer this outcome was recorded on; null for the first outcome on the report. */
  answer_id: ColumnType<string | null, string | null | undefined, never>;
  created_at: CreatedAt;
}

/** The installer's answer to "corrections needed": a newer check of the project, its report, and a note. */
export interface CorrectionAnswersTable {
  id: Generated<string>;
  /** The report the inspector reviewed first: the thread lives on it. */
  report_id: string;
  /** The "corrections needed" outcome answered (one answer each). */
  review_id: string;
  check_id: string;
  /** The report issued for the answering check. */
  answer_report_id: string;
  note: string;
  created_by: string | null;
  created_at: CreatedAt;
}

/** Counters of the shared rate limiter (rate-limiter-flexible's PostgreSQL store); expire is epoch milliseconds. */
export interface RateLimitsTable {
  key: string;
  points: Generated<number>;
  expire: number | null;
}

export interface ApplianceModelsTable {
  id: Generated<string>;
  organization_id: string;
  kind: 'washer' | 'dryer' | 'washer-dryer';
  label: string;
  width_in: number;
  depth_in: number;
  height_in: number;
  front_projection_in: number | null;
  clearance_side_in: number | null;
  clearance_top_in: number | null;
  clearance_rear_in: number | null;
  clearance_front_in: number | null;
  closet_vent_top_sq_in: number | null;
  closet_vent_bottom_sq_in: number | null;
  max_exhaust_length_in: number | null;
  fuel: 'electric' | 'gas' | null;
  dryer_type: 'vented' | 'condensing' | 'heat-pump' | null;
  exhaust_cfm: number | null;
  volts: number | null;
  amps: number | null;
  is_demo: Generated<boolean>;
  created_by: string | null;
  created_at: CreatedAt;
  updated_at: Timestamp;
}

export type MailAttachmentRef = { filename: string; objectKey: string; contentType: string };

export interface MailOutboxTable {
  id: Generated<string>;
  kind: MailKind;
  to_email: string;
  reply_to: ColumnType<{ name: string; address: string } | string | null, string | null | undefined, never>;
  subject: string;
  body_text: string;
  attachments: ColumnType<MailAttachmentRef[], string | undefined, never>;
  status: ColumnType<MailStatus, MailStatus | undefined, MailStatus>;
  attempts: ColumnType<number, number | undefined, number>;
  max_attempts: number;
  last_error: string | null;
  message_id: string | null;
  next_attempt_at: ColumnType<Date, Date | string | undefined, Date | string>;
  claimed_at: ColumnType<Date | null, Date | string | null | undefined, Date | string | null>;
  sent_at: ColumnType<Date | null, Date | string | null | undefined, Date | string | null>;
  report_id: string | null;
  report_send_id: string | null;
  review_id: string | null;
  invitation_id: string | null;
  user_id: string | null;
  created_by: string | null;
  created_at: CreatedAt;
  updated_at: ColumnType<Date, Date | string | undefined, Date | string>;
}

export interface WebhookEndpointsTable {
  id: Generated<string>;
  organization_id: string;
  url: string;
  events: ColumnType<WebhookEventType[], WebhookEventType[], WebhookEventType[]>;
  secret: string;
  is_active: ColumnType<boolean, boolean | undefined, boolean>;
  secret_rotated_at: ColumnType<Date | null, never, Date | string | null>;
  created_by: string | null;
  created_at: CreatedAt;
  updated_at: Timestamp;
}

/** What was sent (endpoint, event, payload) never changes; a trigger lets only the state columns move. */
export interface WebhookDeliveriesTable {
  id: Generated<string>;
  endpoint_id: ColumnType<string, string, never>;
  event_id: ColumnType<string, string, never>;
  event_type: ColumnType<WebhookEventType, WebhookEventType, never>;
  payload: ColumnType<unknown, string, never>;
  status: ColumnType<WebhookDeliveryStatus, WebhookDeliveryStatus | undefined, WebhookDeliveryStatus>;
  attempts: ColumnType<number, number | undefined, number>;
  max_attempts: number;
  last_response_status: number | null;
  last_error: string | null;
  next_attempt_at: Timestamp;
  claimed_at: ColumnType<Date | null, Date | string | null | undefined, Date | string | null>;
  delivered_at: ColumnType<Date | null, Date | string | null | undefined, Date | string | null>;
  created_at: CreatedAt;
  updated_at: Timestamp;
}

export interface RuleSetRunsTable {
  id: Generated<string>;
  kind: RuleSetRunKind;
  jurisdiction_id: string;
  rule_set_id: string | null;
  rule_set_version: number;
  draft_revision: number | null;
  state: ColumnType<RuleSetRunState, RuleSetRunState | undefined, RuleSetRunState>;
  done_count: ColumnType<number, number | undefined, number>;
  total_count: number | null;
  result: ColumnType<unknown | null, string | null | undefined, string | null>;
  error: string | null;
  attempts: ColumnType<number, number | undefined, number>;
  claim_token: string | null;
  claimed_at: ColumnType<Date | null, Date | string | null | undefined, Date | string | null>;
  requested_by: string | null;
  created_at: CreatedAt;
  started_at: ColumnType<Date | null, Date | string | null | undefined, Date | string | null>;
  finished_at: ColumnType<Date | null, Date | string | null | undefined, Date | string | null>;
}

export interface Database {
  organizations: OrganizationsTable;
  jurisdictions: JurisdictionsTable;
  users: UsersTable;
  invitations: InvitationsTable;
  password_resets: EmailTokensTable;
  email_confirmations: EmailTokensTable;
  api_tokens: ApiTokensTable;
  sessions: SessionsTable;
  audit_log: AuditLogTable;
  rule_sets: RuleSetsTable;
  rules: RulesTable;
  citation_checks: CitationChecksTable;
  projects: ProjectsTable;
  plan_revisions: PlanRevisionsTable;
  checks: ChecksTable;
  attachments: AttachmentsTable;
  reports: ReportsTable;
  report_sends: ReportSendsTable;
  inspection_reviews: InspectionReviewsTable;
  correction_answers: CorrectionAnswersTable;
  rate_limits: RateLimitsTable;
  appliance_models: ApplianceModelsTable;
  mail_outbox: MailOutboxTable;
  webhook_endpoints: WebhookEndpointsTable;
  webhook_deliveries: WebhookDeliveriesTable;
  rule_set_runs: RuleSetRunsTable;
}

export type OrganizationRow = Selectable<OrganizationsTable>;
export type NewOrganization = Insertable<OrganizationsTable>;
export type JurisdictionRow = Selectable<JurisdictionsTable>;
export type NewJurisdiction = Insertable<JurisdictionsTable>;
export type JurisdictionUpdate = Updateable<JurisdictionsTable>;
export type UserRow = Selectable<UsersTable>;
export type NewUser = Insertable<UsersTable>;
export type UserUpdate = Updateable<UsersTable>;
export type ApiTokenRow = Selectable<ApiTokensTable>;
export type NewApiToken = Insertable<ApiTokensTable>;
export type AuditLogRow = Selectable<AuditLogTable>;
export type NewAuditLogEntry = Insertable<AuditLogTable>;
export type RuleSetRow = Selectable<RuleSetsTable>;
export type RuleRow = Selectable<RulesTable>;
export type NewRule = Insertable<RulesTable>;
export type ProjectRow = Selectable<ProjectsTable>;
export type NewProject = Insertable<ProjectsTable>;
export type ProjectUpdate = Updateable<ProjectsTable>;
export type PlanRevisionRow = Selectable<PlanRevisionsTable>;
export type CheckRow = Selectable<ChecksTable>;
