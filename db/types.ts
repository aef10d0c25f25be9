// Row types as stored (snake_case). lib/data maps them to camelCase objects for callers.
export const ROLES = ["admin", "manager", "buyer", "kitchen_lead", "accountant"] as const;
export type Role = (typeof ROLES)[number];

export interface CompanyRow {
  id: string;
  name: string;
  time_zone: string;
  currency: string;
  created_at: Date;
}

export interface KitchenRow {
  id: string;
  company_id: string;
  code: string;
  name: string;
  address: string;
  time_zone: string | null;
  archived_at: Date | null;
  created_at: Date;
}

export interface UserRow {
  id: string;
  company_id: string;
  email: string;
  name: string;
  role: Role;
  password_hash: string | null;
  time_zone: string | null;
  unit_system: "metric" | "us";
  disabled_at: Date | null;
  created_at: Date;
}

export interface UserKitchenRow {
  company_id: string;
  user_id: string;
  kitchen_id: string;
}

export interface InvitationRow {
  id: string;
  company_id: string;
  email: string;
  name: string;
  role: Role;
  kitchen_ids: string[];
  token_hash: string;
  invited_by: string | null;
  expires_at: Date;
  accepted_at: Date | null;
  revoked_at: Date | null;
  created_at: Date;
}

export interface PasswordResetRow {
  id: string;
  company_id: string;
  user_id: string;
  token_hash: string;
  expires_at: Date;
  used_at: Date | null;
  created_at: Date;
}

export interface OutboxEmailRow {
  id: string;
  company_id: string | null;
  to_addresses: string[];
  subject: string;
  text_body: string;
  html_body: string | null;
  status: "pending" | "sent" | "failed";
  attempts: number;
  last_error: string | null;
  created_at: Date;
  sent_at: Date | null;
}

export interface IdempotencyKeyRow {
  company_id: string;
  user_id: string;
  endpoint: string;
  key: string;
  request_hash: string;
  status_code: number | null;
  response_body: unknown;
  created_at: Date;
}
