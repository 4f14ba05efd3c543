import type { ColumnType, Generated, Insertable, Selectable, Updateable } from 'kysely';

type Timestamp = ColumnType<Date, Date | string | undefined, Date | string>;
type CreatedAt = ColumnType<Date, Date | string | undefined, never>;
type Json<T> = ColumnType<T, string, string>;

export type Role = 'installer' | 'inspector' | 'admin';
export type PlumbingFamily = 'IPC' | 'UPC' | 'IRC';

export interface OrganizationsTable {
  id: Generated<string>;
  name: string;
  license_number: string | null;
  is_demo: Generated<boolean>;
  created_at: CreatedAt;
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
  is_demo: Generated<boolean>;
  created_at: CreatedAt;
  updated_at: Timestamp;
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
}

export interface SignInThrottleTable {
  email: string;
  failures: Generated<number>;
  window_started_at: Timestamp;
  locked_until: Timestamp | null;
}

export interface AuditLogTable {
  id: Generated<number>;
  at: CreatedAt;
  actor_user_id: string | null;
  action: string;
  entity_type: string;
  entity_id: string | null;
  details: Json<Record<string, unknown>>;
}

export interface Database {
  organizations: OrganizationsTable;
  jurisdictions: JurisdictionsTable;
  users: UsersTable;
  api_tokens: ApiTokensTable;
  sign_in_throttle: SignInThrottleTable;
  audit_log: AuditLogTable;
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
