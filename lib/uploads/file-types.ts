// The file types an upload may be, told apart by the file's own first bytes as well as its name.
// A client's Content-Type is never trusted: the stored media type is the one the bytes show.
// Pure (no I/O): the browser's file picker can use FILE_TYPES for its `accept` list.

export const FILE_TYPES = {
  csv: { label: "CSV or text", mediaType: "text/csv", extensions: ["csv", "txt", "tsv"] },
  pdf: { label: "PDF", mediaType: "application/pdf", extensions: ["pdf"] },
  jpeg: { label: "JPEG image", mediaType: "image/jpeg", extensions: ["jpg", "jpeg"] },
  png: { label: "PNG image", mediaType: "image/png", extensions: ["png"] },
  heic: { label: "HEIC image", mediaType: "image/heic", extensions: ["heic", "heif"] },
  webp: { label: "WebP image", mediaType: "image/webp", extensions: ["webp"] },
} as const;

export type FileType = keyof typeof FILE_TYPES;

/** Files for CSV imports (price lists, delivery lines). */
export const IMPORT_FILE_TYPES: readonly FileType[] = ["csv"];
/** A delivery note as a document: a scan or a photo. */
export const DOCUMENT_FILE_TYPES: readonly FileType[] = ["pdf", "jpeg", "png", "heic", "webp"];

/** How many leading bytes `sniffFileType` looks at (enough for every signature and a text check). */
export const SNIFF_BYTES = 8192;

// Formats people send by mistake, named so the answer can say what the file really is.
const FOREIGN: { test: (b: Uint8Array) => boolean; label: string; hint?: string }[] = [
  { test: (b) => startsWith(b, [0x50, 0x4b, 0x03, 0x04]), label: "a spreadsheet workbook or ZIP archive (.xlsx, .zip)", hint: "save the sheet as CSV first" },
  { test: (b) => startsWith(b, [0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1]), label: "an old-style Office file (.xls, .doc)", hint: "save the sheet as CSV first" },
  { test: (b) => startsWith(b, [0x47, 0x49, 0x46, 0x38]), label: "a GIF image" },
  { test: (b) => startsWith(b, [0x1f, 0x8b]), label: "a gzip archive" },
  { test: (b) => ascii(b, 4, 8) === "ftyp" && ["avif", "avis"].includes(ascii(b, 8, 12)), label: "an AVIF image" },
  { test: (b) => startsWith(b, [0x7f, 0x45, 0x4c, 0x46]) || startsWith(b, [0x4d, 0x5a]), label: "a program" },
];

const HEIF_BRANDS = new Set(["heic", "heix", "hevc", "hevx", "heim", "heis", "mif1", "msf1"]);

function startsWith(b: Uint8Array, sig: number[], at = 0): boolean {
  if (b.length < at + sig.length) return false;
  return sig.every((v, i) => b[at + i] === v);
}

function ascii(b: Uint8Array, from: number, to: number): string {
  return b.length < to ? "" : String.fromCharCode(...b.subarray(from, to));
}

function findAscii(b: Uint8Array, needle: string, within: number): boolean {
  const codes = [...needle].map((c) => c.charCodeAt(0));
  const end = Math.min(b.length, within) - codes.length;
  for (let i = 0; i <= end; i++) if (startsWith(b, codes, i)) return true;
  return false;
}

/**
 * Text as a CSV import can read it: UTF-8, UTF-16 with its byte-order mark, or a single-byte code
 * page such as Windows-1252. NUL bytes and most C0 controls never occur in such text.
 */
function looksLikeText(b: Uint8Array, complete: boolean): boolean {
  if (startsWith(b, [0xff, 0xfe]) || startsWith(b, [0xfe, 0xff])) return b.length % 2 === 0 || !complete;
  let controls = 0;
  for (const v of b) {
    if (v === 0) return false;
    if (v < 0x20 && v !== 0x09 && v !== 0x0a && v !== 0x0d && v !== 0x0c) controls++;
  }
  return controls <= b.length / 100;
}

/**
 * What the leading bytes say the file is, among `candidates`, or a description of what it is
 * instead. `complete` is true when `head` holds the whole file (a short file).
 */
export function sniffFileType(head: Uint8Array, candidates: readonly FileType[], complete: boolean): { type: FileType } | { type: null; actual: string; hint?: string } {
  const b = head;
  if (startsWith(b, [0x25, 0x50, 0x44, 0x46, 0x2d]) || findAscii(b, "%PDF-", 1024)) return match("pdf", candidates, "a PDF document");
  if (startsWith(b, [0xff, 0xd8, 0xff])) return match("jpeg", candidates, "a JPEG image");
  if (startsWith(b, [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a])) return match("png", candidates, "a PNG image");
  if (ascii(b, 0, 4) === "RIFF" && ascii(b, 8, 12) === "WEBP") return match("webp", candidates, "a WebP image");
  if (ascii(b, 4, 8) === "ftyp" && HEIF_BRANDS.has(ascii(b, 8, 12))) return match("heic", candidates, "a HEIC image");
  for (const f of FOREIGN) if (f.test(b)) return { type: null, actual: f.label, hint: f.hint };
  if (b.length === 0) return { type: null, actual: "an empty file" };
  if (looksLikeText(b, complete)) return match("csv", candidates, "a text file");
  return { type: null, actual: "a binary file of an unknown kind" };
}

function match(type: FileType, candidates: readonly FileType[], actual: string) {
  return candidates.includes(type) ? { type } : { type: null, actual };
}

/** The file type a name's extension claims, or null. */
export function typeOfExtension(filename: string): FileType | null {
  const ext = extensionOf(filename);
  if (!ext) return null;
  for (const [type, info] of Object.entries(FILE_TYPES)) if ((info.extensions as readonly string[]).includes(ext)) return type as FileType;
  return null;
}

export function extensionOf(filename: string): string {
  const m = /\.([A-Za-z0-9]{1,8})$/.exec(filename);
  return m ? m[1]!.toLowerCase() : "";
}

/** "CSV or text (.csv, .txt, .tsv), PDF (.pdf)" */
export function describeTypes(types: readonly FileType[]): string {
  return types.map((t) => `${FILE_TYPES[t].label} (${FILE_TYPES[t].extensions.map((e) => `.${e}`).join(", ")})`).join(", ");
}

/** A file name as sent, reduced to its last path part, without control characters, at most 255 characters. */
export function cleanFilename(name: string | undefined): string {
  const last = (name ?? "").split(/[\\/]/).pop() ?? "";
  const clean = last.replace(/[\u0000-\u001f\u007f]/g, "").trim();
  return clean.length > 255 ? clean.slice(clean.length - 255) : clean;
}
