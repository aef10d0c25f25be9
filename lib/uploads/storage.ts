// Where uploaded files live: outside the web root, under the runtime state folder,
// <state>/uploads/<companyId>/<sha256>.<ext>. The name is the SHA-256 of the bytes, so the same
// file sent twice is one file on disk; the `uploads` table says who sent it for what.
// Files being received go to <state>/uploads/.incoming/ first (same file system, so the final
// rename is atomic) and are moved into place only once the whole request was read and accepted.
// env: HL_STATE (.data), UPLOAD_DIR (overrides <HL_STATE>/uploads)
import "server-only";
import path from "node:path";
import { env } from "../env";
import { FILE_TYPES, type FileType } from "./file-types";

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
const SHA256 = /^[0-9a-f]{64}$/;

export function uploadsRoot(): string {
  const e = env();
  return path.resolve(e.UPLOAD_DIR ?? path.join(e.HL_STATE, "uploads"));
}

export function incomingDir(): string {
  return path.join(uploadsRoot(), ".incoming");
}

/** The stored file's absolute path. Refuses anything that is not a uuid and a hex digest (no path tricks). */
export function storedPath(companyId: string, sha256: string, type: FileType): string {
  if (!UUID.test(companyId)) throw new Error(`Not a company id: ${companyId}`);
  if (!SHA256.test(sha256)) throw new Error(`Not a SHA-256 digest: ${sha256}`);
  return path.join(uploadsRoot(), companyId.toLowerCase(), `${sha256}.${FILE_TYPES[type].extensions[0]}`);
}
