// Streamed multipart/form-data for route handlers: `readMultipart(req, {...})` reads the request
// body with busboy, writes each file to disk while hashing it (SHA-256), checks its name and its
// first bytes against the allowed file types, and enforces the size limit as the bytes arrive.
// Nothing is held in memory but a small head of each file, and nothing is stored unless the whole
// request is accepted: over the limit is 413 (reading stops at once), a wrong or unexpected file
// is 422 naming the field, a body that is not multipart is 415.
//
// Upload routes must stay out of the Next proxy's matcher (proxy.ts buffers at most 10 MB of a
// matched request and silently drops the rest): see DEVELOPERS.md, "Uploads and CSV imports".
import "server-only";
import Busboy from "busboy";
import { createHash, randomUUID } from "node:crypto";
import { createWriteStream, type WriteStream } from "node:fs";
import { mkdir, rename, rm } from "node:fs/promises";
import path from "node:path";
import { Readable } from "node:stream";
import type { ReadableStream as NodeWebReadableStream } from "node:stream/web";
import type { z } from "zod";
import { AppError, fieldErrors, unsupportedMediaType, validation } from "../http/errors";
import { cleanFilename, describeTypes, FILE_TYPES, sniffFileType, SNIFF_BYTES, typeOfExtension, type FileType } from "./file-types";
import { incomingDir, storedPath } from "./storage";

/** 25 MB per file. */
export const MAX_UPLOAD_BYTES = 25 * 1024 * 1024;
/** Room for the text fields and the multipart framing on top of the files. */
const FIELDS_ALLOWANCE_BYTES = 1024 * 1024;
const MAX_FIELD_BYTES = 64 * 1024;
const MAX_FIELDS = 50;

export interface StoredFile {
  /** The form field the file came in. */
  field: string;
  companyId: string;
  /** Absolute path under the uploads folder (storage.ts). */
  path: string;
  sha256: string;
  size: number;
  /** The name the sender gave it (last path part, no control characters). */
  filename: string;
  /** From the file's bytes, never from the client's Content-Type. */
  mediaType: string;
  type: FileType;
}

export interface ReadMultipartOptions<F extends z.ZodType | undefined> {
  /** Files are stored under this company's folder. */
  companyId: string;
  /** The file types accepted (by name and by content), e.g. IMPORT_FILE_TYPES or DOCUMENT_FILE_TYPES. */
  allowed: readonly FileType[];
  /** Per file; default MAX_UPLOAD_BYTES (25 MB). */
  maxBytes?: number;
  /** The form field that carries the file(s); default "file". */
  fileField?: string;
  /** Default 1. */
  maxFiles?: number;
  /** Default 1 (0: the file is optional). */
  minFiles?: number;
  /** zod schema for the text fields (an object of strings); 422 names each bad field. */
  fields?: F;
}

export interface MultipartResult<T> {
  fields: T;
  files: StoredFile[];
}

const megabytes = (n: number) => (n % (1024 * 1024) === 0 ? `${n / (1024 * 1024)} MB` : `${n.toLocaleString("en")} bytes`);

export const fileTooLarge = (field: string, filename: string, limitBytes: number) =>
  new AppError(413, "PAYLOAD_TOO_LARGE", `The file "${filename}" is larger than ${megabytes(limitBytes)}. Nothing was stored; send a smaller file.`, {
    fields: { [field]: [`Larger than ${megabytes(limitBytes)}.`] },
    limitBytes,
  });

const requestTooLarge = (limitBytes: number) =>
  new AppError(413, "PAYLOAD_TOO_LARGE", `The upload is larger than ${megabytes(limitBytes)}. Nothing was stored; send a smaller file.`, { limitBytes });

/** 422 naming the field, with the reason as the message too (the screen shows it as it is). */
const refused = (field: string, message: string) => validation({ [field]: [message] }, message);

const malformed = () => new AppError(400, "BAD_REQUEST", "The upload could not be read (the multipart body is incomplete or malformed). Nothing was stored.");

interface Receiving {
  field: string;
  filename: string;
  tempPath: string;
  hash: ReturnType<typeof createHash>;
  size: number;
  head: Buffer[];
  headBytes: number;
  type: FileType | null;
  out: WriteStream;
}

export async function readMultipart<F extends z.ZodType | undefined = undefined>(
  req: Request,
  options: ReadMultipartOptions<F>,
): Promise<MultipartResult<F extends z.ZodType ? z.infer<F> : Record<string, string>>> {
  const maxBytes = options.maxBytes ?? MAX_UPLOAD_BYTES;
  const maxFiles = options.maxFiles ?? 1;
  const minFiles = options.minFiles ?? 1;
  const fileField = options.fileField ?? "file";
  const contentType = req.headers.get("content-type") ?? "";
  if (!/^multipart\/form-data\s*;/i.test(contentType)) {
    await req.body?.cancel().catch(() => {});
    throw unsupportedMediaType("multipart/form-data");
  }
  const requestLimit = maxFiles * maxBytes + FIELDS_ALLOWANCE_BYTES;
  const declared = Number(req.headers.get("content-length") ?? "0");
  if (declared > requestLimit) {
    await req.body?.cancel().catch(() => {});
    throw requestTooLarge(maxFiles * maxBytes);
  }
  if (!req.body) throw refused(fileField, "Attach a file.");

  let bb: Busboy.Busboy;
  try {
    bb = Busboy({
      headers: { "content-type": contentType },
      defParamCharset: "utf8", // file names as browsers send them (busboy's default is latin1)
      limits: { fileSize: maxBytes, files: maxFiles, fields: MAX_FIELDS, fieldSize: MAX_FIELD_BYTES, parts: maxFiles + MAX_FIELDS },
    });
  } catch {
    await req.body.cancel().catch(() => {});
    throw malformed(); // no boundary
  }
  const input = Readable.fromWeb(req.body as unknown as NodeWebReadableStream<Uint8Array>);
  await mkdir(incomingDir(), { recursive: true });

  const receiving: Receiving[] = [];
  const finished: Promise<void>[] = [];
  const raw: Record<string, string> = {};
  let failure: unknown = null;
  let read = 0;

  const outcome = new Promise<void>((resolve, reject) => {
    const fail = (e: unknown) => {
      if (failure) return;
      failure = e;
      // stop reading: the rest of the body is never pulled from the client
      input.unpipe(bb);
      input.destroy();
      bb.removeAllListeners();
      bb.on("error", () => {});
      for (const r of receiving) r.out.destroy();
      reject(e);
    };
    input.on("data", (chunk: Buffer) => {
      read += chunk.length;
      if (read > requestLimit) fail(requestTooLarge(maxFiles * maxBytes));
    });
    input.on("error", () => fail(malformed()));

    bb.on("file", (field, stream, info) => {
      if (failure) return stream.resume();
      const filename = cleanFilename(info.filename);
      if (field !== fileField) return fail(refused(field, `Unexpected file; send the file in the field "${fileField}".`));
      if (!filename) return fail(refused(field, "The file has no name; send it with its name (e.g. prices.csv)."));
      const claimed = typeOfExtension(filename);
      if (!claimed || !options.allowed.includes(claimed)) {
        return fail(refused(field, `"${filename}" is not an accepted file: send ${describeTypes(options.allowed)}.`));
      }
      const r: Receiving = {
        field, filename, tempPath: path.join(incomingDir(), randomUUID()), hash: createHash("sha256"), size: 0, head: [], headBytes: 0, type: null,
        out: null as unknown as WriteStream,
      };
      r.out = createWriteStream(r.tempPath, { flags: "wx" });
      receiving.push(r);
      const sniff = (complete: boolean) => {
        const head = Buffer.concat(r.head);
        r.head = [];
        const found = sniffFileType(head, options.allowed, complete);
        if (found.type === null) {
          const what = `"${filename}" is ${found.actual}${found.hint ? ` (${found.hint})` : ""}`;
          return fail(refused(field, `${what}: send ${describeTypes(options.allowed)}.`));
        }
        if (found.type !== claimed) {
          return fail(refused(field, `"${filename}" is named as ${FILE_TYPES[claimed].label} but its contents are ${FILE_TYPES[found.type].label}; rename it or send the right file.`));
        }
        r.type = found.type;
      };
      stream.on("data", (chunk: Buffer) => {
        if (failure) return;
        r.size += chunk.length;
        r.hash.update(chunk);
        if (r.type === null) {
          r.head.push(chunk);
          r.headBytes += chunk.length;
          if (r.headBytes >= SNIFF_BYTES) sniff(false);
          if (failure) return;
        }
        if (!r.out.write(chunk)) {
          stream.pause();
          r.out.once("drain", () => stream.resume());
        }
      });
      stream.on("limit", () => fail(fileTooLarge(field, filename, maxBytes)));
      // settled once the temp file is closed, so clean-up never races the file's creation
      finished.push(new Promise<void>((done) => r.out.on("close", () => done())));
      r.out.on("error", (e) => fail(e));
      stream.on("end", () => {
        if (failure) return;
        if (r.type === null) sniff(true);
        if (!failure) r.out.end();
      });
    });
    bb.on("field", (name, value, info) => {
      if (failure) return;
      if (info.nameTruncated || info.valueTruncated) return fail(validation({ [name]: [`At most ${MAX_FIELD_BYTES / 1024} KB.`] }));
      if (name in raw) return fail(validation({ [name]: ["Sent twice."] }));
      raw[name] = value;
    });
    bb.on("filesLimit", () => fail(refused(fileField, maxFiles === 1 ? "Send one file at a time." : `Send at most ${maxFiles} files.`)));
    bb.on("fieldsLimit", () => fail(validation({ _: [`At most ${MAX_FIELDS} fields.`] })));
    bb.on("partsLimit", () => fail(validation({ _: [`At most ${maxFiles + MAX_FIELDS} parts.`] })));
    bb.on("error", () => fail(malformed()));
    bb.on("close", () => {
      if (!failure) resolve();
    });
    input.pipe(bb);
  });

  const cleanUp = () => Promise.all(receiving.map((r) => rm(r.tempPath, { force: true })));
  try {
    await outcome;
    await Promise.all(finished);
    if (failure) throw failure;
    if (receiving.length < minFiles) throw refused(fileField, "Attach a file.");
    let fields: unknown = raw;
    if (options.fields) {
      const parsed = options.fields.safeParse(raw);
      if (!parsed.success) throw validation(fieldErrors(parsed.error));
      fields = parsed.data;
    }
    const files: StoredFile[] = [];
    for (const r of receiving) {
      const sha256 = r.hash.digest("hex");
      const final = storedPath(options.companyId, sha256, r.type!);
      await mkdir(path.dirname(final), { recursive: true });
      await rename(r.tempPath, final); // same bytes if it was there already
      files.push({ field: r.field, companyId: options.companyId, path: final, sha256, size: r.size, filename: r.filename, mediaType: FILE_TYPES[r.type!].mediaType, type: r.type! });
    }
    return { fields: fields as never, files };
  } catch (e) {
    await Promise.allSettled(finished);
    await cleanUp();
    throw e;
  }
}
