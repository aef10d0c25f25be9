// lib/uploads/file-types: what a file is, from its first bytes. Signatures as published for each
// format: PDF "%PDF-" (ISO 32000-1 §7.5.2), JPEG FF D8 FF (JFIF/Exif SOI marker), PNG 89 50 4E 47
// 0D 0A 1A 0A (PNG spec §5.2), WebP "RIFF" .... "WEBP" (RFC 9649 §2), HEIC an ISO-BMFF "ftyp" box
// with brand heic/mif1 (ISO/IEC 23008-12), ZIP/xlsx "PK\x03\x04" (PKWARE APPNOTE 4.3.7).
import { describe, expect, it } from "vitest";
import { cleanFilename, describeTypes, DOCUMENT_FILE_TYPES, IMPORT_FILE_TYPES, sniffFileType, typeOfExtension } from "@/lib/uploads/file-types";

const b = (...parts: (string | number[])[]) =>
  Uint8Array.from(parts.flatMap((p) => (typeof p === "string" ? [...p].map((c) => c.charCodeAt(0)) : p)));
const ALL = [...IMPORT_FILE_TYPES, ...DOCUMENT_FILE_TYPES];
const pdf = b("%PDF-1.7\n%\xe2\xe3\xcf\xd3\n");
const jpeg = b([0xff, 0xd8, 0xff, 0xe0, 0, 0x10], "JFIF");
const png = b([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 0x0d], "IHDR");
const webp = b("RIFF", [0x24, 0, 0, 0], "WEBPVP8 ");
const heic = b([0, 0, 0, 0x18], "ftypheic", [0, 0, 0, 0], "mif1heic");
const xlsx = b("PK", [3, 4, 0x14, 0]);

describe("sniffFileType", () => {
  it("knows each accepted type by its signature", () => {
    expect(sniffFileType(pdf, ALL, true)).toEqual({ type: "pdf" });
    expect(sniffFileType(jpeg, ALL, true)).toEqual({ type: "jpeg" });
    expect(sniffFileType(png, ALL, true)).toEqual({ type: "png" });
    expect(sniffFileType(webp, ALL, true)).toEqual({ type: "webp" });
    expect(sniffFileType(heic, ALL, true)).toEqual({ type: "heic" });
    expect(sniffFileType(b("SKU;Preis\r\nK-1;7,85\r\n"), ALL, true)).toEqual({ type: "csv" });
  });

  it("takes Windows-1252 and UTF-16 (with its mark) as text, NUL bytes not", () => {
    expect(sniffFileType(b("Gew", [0xfc], "rz;1\n"), ["csv"], true)).toEqual({ type: "csv" });
    expect(sniffFileType(b([0xff, 0xfe], "S\0K\0U\0"), ["csv"], false)).toEqual({ type: "csv" });
    expect(sniffFileType(b("SKU", [0], "x"), ["csv"], true)).toEqual({ type: null, actual: "a binary file of an unknown kind" });
  });

  it("says what a refused file really is", () => {
    expect(sniffFileType(pdf, ["csv"], true)).toEqual({ type: null, actual: "a PDF document" });
    expect(sniffFileType(xlsx, ["csv"], true)).toEqual({ type: null, actual: "a spreadsheet workbook or ZIP archive (.xlsx, .zip)", hint: "save the sheet as CSV first" });
    expect(sniffFileType(b("GIF89a"), DOCUMENT_FILE_TYPES, true)).toEqual({ type: null, actual: "a GIF image" });
    expect(sniffFileType(b("SKU,Price\n1,2\n"), DOCUMENT_FILE_TYPES, true)).toEqual({ type: null, actual: "a text file" });
    expect(sniffFileType(new Uint8Array(0), ["csv"], true)).toEqual({ type: null, actual: "an empty file" });
  });
});

describe("names", () => {
  it("maps extensions to types, case-insensitively", () => {
    expect(typeOfExtension("Preise.CSV")).toBe("csv");
    expect(typeOfExtension("note.jpeg")).toBe("jpeg");
    expect(typeOfExtension("IMG_0001.HEIC")).toBe("heic");
    expect(typeOfExtension("prices.xlsx")).toBeNull();
    expect(typeOfExtension("no-extension")).toBeNull();
  });
  it("keeps only the last path part of a sent name, without control characters", () => {
    expect(cleanFilename("C:\\fakepath\\prices.csv")).toBe("prices.csv");
    expect(cleanFilename("../../etc/passwd")).toBe("passwd");
    expect(cleanFilename("pri\u0000ces\n.csv")).toBe("prices.csv");
    expect(cleanFilename(`${"x".repeat(300)}.csv`)).toHaveLength(255);
    expect(cleanFilename(`${"x".repeat(300)}.csv`).endsWith(".csv")).toBe(true);
  });
  it("describes the accepted types for messages", () => {
    expect(describeTypes(["csv", "pdf"])).toBe("CSV or text (.csv, .txt, .tsv), PDF (.pdf)");
  });
});
