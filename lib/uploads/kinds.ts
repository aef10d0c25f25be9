// What an upload is for: which permission sending one needs and which file types it may be.
// Pure. A new kind needs an entry here and in the uploads_kind check (a migration).
import type { Action } from "../auth/permissions";
import { DOCUMENT_FILE_TYPES, IMPORT_FILE_TYPES, type FileType } from "./file-types";

export const UPLOAD_KINDS = {
  /** A supplier's price list, imported from CSV. */
  price_list: { action: "purchasing.manage", allowed: IMPORT_FILE_TYPES },
  /** A delivery note: its lines as CSV, or the paper note as a scan or photo. */
  delivery_note: { action: "stock.receive", allowed: [...IMPORT_FILE_TYPES, ...DOCUMENT_FILE_TYPES] },
} as const satisfies Record<string, { action: Action; allowed: readonly FileType[] }>;

export type UploadKind = keyof typeof UPLOAD_KINDS;
export const UPLOAD_KIND_NAMES = Object.keys(UPLOAD_KINDS) as UploadKind[];
