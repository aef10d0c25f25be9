// Uploads, server only (a browser imports file-types.ts and kinds.ts directly): streamed multipart
// reading with size and type checks (multipart.ts), content-addressed storage under the state
// folder (storage.ts), file types (file-types.ts), upload kinds (kinds.ts).
// See DEVELOPERS.md, "Uploads and CSV imports".
export { readMultipart, MAX_UPLOAD_BYTES } from "./multipart";
export type { MultipartResult, ReadMultipartOptions, StoredFile } from "./multipart";
export { DOCUMENT_FILE_TYPES, FILE_TYPES, IMPORT_FILE_TYPES, sniffFileType } from "./file-types";
export type { FileType } from "./file-types";
export { UPLOAD_KINDS, UPLOAD_KIND_NAMES } from "./kinds";
export type { UploadKind } from "./kinds";
export { storedPath, uploadsRoot } from "./storage";
