// Uploaded files: who sent which file for what. The bytes are on disk (lib/uploads/storage.ts);
// the row is unique per (company, kind, sha256), so the same file sent twice for the same purpose
// is recognised (`duplicate: true`) instead of being imported twice.
//
// A route that takes a file calls `receiveUpload(user, req, kind)`: the permission is checked
// BEFORE a byte is read (nobody without it can fill the disk), then the body is streamed to disk
// (lib/uploads/multipart.ts) and the upload recorded.
import "server-only";
import type { z } from "zod";
import { db } from "../../db/client";
import type { UploadRow } from "../../db/types";
import { assertCan } from "../auth/assert";
import type { CurrentUser } from "../auth/current-user";
import { notFound } from "../http/errors";
import { FILE_TYPES, type FileType } from "../uploads/file-types";
import { UPLOAD_KINDS, type UploadKind } from "../uploads/kinds";
import { readMultipart, type ReadMultipartOptions, type StoredFile } from "../uploads/multipart";
import { storedPath } from "../uploads/storage";

export interface Upload {
  id: string;
  kind: UploadKind;
  sha256: string;
  size: number;
  filename: string;
  mediaType: string;
  createdBy: string | null;
  createdAt: string;
}

export interface RecordedUpload {
  upload: Upload;
  /** The same bytes were already sent for this purpose (the earlier row is returned). */
  duplicate: boolean;
}

const toUpload = (r: UploadRow): Upload => ({
  id: r.id, kind: r.kind as UploadKind, sha256: r.sha256, size: Number(r.size), filename: r.filename, mediaType: r.media_type,
  createdBy: r.created_by, createdAt: r.created_at.toISOString(),
});

export function assertCanUpload(actor: CurrentUser, kind: UploadKind): void {
  assertCan(actor, UPLOAD_KINDS[kind].action);
}

/** Records a file readMultipart stored for this actor's company. */
export async function recordUpload(actor: CurrentUser, kind: UploadKind, file: StoredFile): Promise<RecordedUpload> {
  assertCanUpload(actor, kind);
  if (file.companyId !== actor.companyId) throw new Error("recordUpload: the file was stored for another company");
  const inserted: UploadRow[] = await db()("uploads")
    .insert({ company_id: actor.companyId, kind, sha256: file.sha256, size: file.size, filename: file.filename, media_type: file.mediaType, created_by: actor.id })
    .onConflict(["company_id", "kind", "sha256"]).ignore()
    .returning("*");
  if (inserted[0]) return { upload: toUpload(inserted[0]), duplicate: false };
  const existing: UploadRow = await db()("uploads").where({ company_id: actor.companyId, kind, sha256: file.sha256 }).first();
  return { upload: toUpload(existing), duplicate: true };
}

/**
 * The whole upload step of a route: permission first, then the streamed body (one file, the
 * kind's file types unless `allowed` narrows them, 25 MB unless `maxBytes` says otherwise), then
 * the record. Throws 403 / 413 / 415 / 422 as AppErrors the route wrapper maps.
 */
export async function receiveUpload<F extends z.ZodType | undefined = undefined>(
  actor: CurrentUser,
  req: Request,
  kind: UploadKind,
  options: Omit<ReadMultipartOptions<F>, "companyId" | "allowed" | "maxFiles" | "minFiles"> & { allowed?: readonly FileType[] } = {},
): Promise<RecordedUpload & { fields: F extends z.ZodType ? z.infer<F> : Record<string, string> }> {
  assertCanUpload(actor, kind);
  const allowed = (options.allowed ?? UPLOAD_KINDS[kind].allowed).filter((t) => (UPLOAD_KINDS[kind].allowed as readonly FileType[]).includes(t));
  const { fields, files } = await readMultipart(req, { ...options, companyId: actor.companyId, allowed, maxFiles: 1, minFiles: 1 });
  return { ...(await recordUpload(actor, kind, files[0]!)), fields };
}

/** One upload of the actor's company (404 otherwise), for someone who may send that kind. */
export async function getUpload(actor: CurrentUser, id: string): Promise<Upload> {
  const row: UploadRow | undefined = /^[0-9a-f-]{36}$/i.test(id) ? await db()("uploads").where({ company_id: actor.companyId, id }).first() : undefined;
  if (!row) throw notFound("Upload");
  assertCanUpload(actor, row.kind as UploadKind);
  return toUpload(row);
}

/** Where an upload's bytes are on disk (server only; never sent to a client). */
export function uploadFilePath(companyId: string, upload: Pick<Upload, "sha256" | "mediaType">): string {
  const type = (Object.keys(FILE_TYPES) as FileType[]).find((t) => FILE_TYPES[t].mediaType === upload.mediaType);
  if (!type) throw new Error(`No file type for ${upload.mediaType}`);
  return storedPath(companyId, upload.sha256, type);
}
