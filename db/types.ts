// Row types as stored (snake_case). lib/data maps them to camelCase objects for callers.
import type { Salt } from "../lib/cure/limits";

export const ROLES = ["admin", "manager", "buyer", "kitchen_lead", "accountant"] as const;
export type Role = (typeof ROLES)[number];

export interface CompanyRow {
  id: string;
  name: string;
  time_zone: string;
  currency: string;
  /** the first day of the planning week */
  week_start: "monday" | "sunday" | "saturday";
  /** NUMERIC(20,4), the company's currency: buyers approve purchase orders up to it */
  approval_threshold: string;
  /** NUMERIC(6,2): deliveries flag a price further than this percent from the ordered one */
  receiving_price_tolerance_pct: string;
  /** the least remaining life of a delivered lot, in days, per category (0: no check) */
  short_dated_days_cure: number;
  short_dated_days_casing: number;
  short_dated_days_spice: number;
  short_dated_days_ingredient: number;
  /** the stand-in scanners type for GS on case labels (1-8 characters); null: none */
  scan_separator: string | null;
  expiry_windows: unknown;
  cost_formula: "fifo" | "average";
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

export interface OutboxAttachmentRow {
  id: string;
  outbox_email_id: string;
  position: number;
  filename: string;
  content_type: string;
  content: Buffer;
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

export const ITEM_CATEGORIES = ["casing", "cure", "spice", "ingredient"] as const;
export type ItemCategory = (typeof ITEM_CATEGORIES)[number];
export const STOCK_UNITS = ["g", "m", "ml", "pc"] as const;
export type StockUnit = (typeof STOCK_UNITS)[number];
export const CASING_KINDS = ["natural_hog", "natural_sheep", "natural_beef", "collagen", "fibrous", "cellulose"] as const;
export const PUT_UPS = ["hank", "beef_set", "tubed_strand", "stick", "box"] as const;
export const CASING_STORAGE = ["salted", "brine", "dry"] as const;
export const MOVEMENT_KINDS = ["receipt", "transfer", "use", "waste", "adjustment", "count"] as const;
export type MovementKind = (typeof MOVEMENT_KINDS)[number];
export const DATE_KINDS = ["use_by", "best_before"] as const;
export type DateKind = (typeof DATE_KINDS)[number];

/** NUMERIC columns come back from pg as strings. */
export interface ItemRow {
  id: string;
  company_id: string;
  sku: string;
  name: string;
  category: ItemCategory;
  stock_unit: StockUnit;
  track_lots: boolean;
  track_dates: boolean;
  casing_kind: (typeof CASING_KINDS)[number] | null;
  calibre_min_mm: string | null;
  calibre_max_mm: string | null;
  put_up: (typeof PUT_UPS)[number] | null;
  put_up_metres: string | null;
  capacity_kg_per_put_up: string | null;
  storage: (typeof CASING_STORAGE)[number] | null;
  nitrite_fraction: string | null;
  nitrate_fraction: string | null;
  /** cures: which salt the label names (sodium unless it says potassium); null for other items */
  nitrite_salt: Salt | null;
  nitrate_salt: Salt | null;
  form: string | null;
  density_g_per_ml: string | null;
  archived_at: Date | null;
  created_at: Date;
  updated_at: Date;
}

export interface ItemPackRow {
  id: string;
  company_id: string;
  item_id: string;
  name: string;
  quantity: string;
  unit: string;
  stock_quantity: string;
}

export interface LotRow {
  id: string;
  company_id: string;
  item_id: string;
  code: string;
  supplier_id: string | null;
  supplier_name: string | null;
  received_on: string; // yyyy-mm-dd
  date: string | null;
  date_kind: DateKind | null;
  unit_cost: string;
  created_at: Date;
}

export interface StockBalanceRow {
  company_id: string;
  kitchen_id: string;
  item_id: string;
  lot_id: string;
  on_hand: string;
  reserved: string;
  updated_at: Date;
}

export interface StockMovementRow {
  id: string;
  company_id: string;
  posting_id: string;
  kind: MovementKind;
  kitchen_id: string;
  item_id: string;
  lot_id: string;
  delta: string;
  counted: string | null;
  entered_quantity: string | null;
  entered_unit: string | null;
  unit_cost: string;
  reason: string | null;
  other_kitchen_id: string | null;
  reverses_id: string | null;
  user_id: string | null;
  occurred_at: Date;
  recorded_at: Date;
  /** production: the batch the stock was used for */
  batch_id: string | null;
}

export interface SupplierRow {
  id: string;
  company_id: string;
  name: string;
  contact_name: string;
  order_email: string | null;
  phone: string;
  lead_time_days: number;
  /** NUMERIC(20,4), the company's currency; null: no minimum */
  min_order_value: string | null;
  notes: string;
  active: boolean;
  created_at: Date;
  updated_at: Date;
}

export interface SupplierItemRow {
  id: string;
  company_id: string;
  supplier_id: string;
  /** our stock item */
  item_id: string;
  /** the supplier's code */
  sku: string;
  description: string;
  pack_label: string;
  /** the pack as entered: pack_quantity of pack_unit */
  pack_quantity: string;
  pack_unit: string;
  /** one pack in the item's stock unit, NUMERIC(30,12) */
  pack_size_stock: string;
  /** GTIN-8/12/13/14 padded to 14 digits */
  gtin14: string | null;
  active: boolean;
  created_at: Date;
  updated_at: Date;
}

export interface UploadRow {
  id: string;
  company_id: string;
  /** price_list | delivery_note (lib/uploads/kinds.ts) */
  kind: string;
  sha256: string;
  /** BIGINT: a string from pg */
  size: string;
  filename: string;
  media_type: string;
  created_by: string | null;
  created_at: Date;
}

export interface SupplierItemPriceRow {
  id: string;
  company_id: string;
  supplier_item_id: string;
  /** NUMERIC(20,4), the company's currency, per pack */
  pack_price: string;
  /** yyyy-mm-dd */
  effective_from: string;
  price_list_import_id: string | null;
  /** the description as the price list wrote it (text, never evaluated) */
  listed_description: string | null;
  created_by: string | null;
  created_at: Date;
}

export interface PriceListImportRow {
  id: string;
  company_id: string;
  supplier_id: string;
  upload_id: string;
  /** CsvMapping (lib/validation/imports.ts) */
  mapping: unknown;
  /** yyyy-mm-dd: for rows without a date of their own */
  effective_from: string;
  rows: number;
  priced: number;
  raised: number;
  lowered: number;
  unchanged: number;
  first_prices: number;
  skipped: number;
  warning_count: number;
  /** the first 100 warnings: [{row, column, field?, message}] */
  warnings: unknown;
  applied_by: string | null;
  applied_at: Date;
}

export interface SupplierImportMappingRow {
  company_id: string;
  supplier_id: string;
  /** price_list | delivery_note */
  kind: string;
  mapping: unknown;
  updated_by: string | null;
  updated_at: Date;
}
