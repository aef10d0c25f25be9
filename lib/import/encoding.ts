// Which character encoding a CSV file is in, and its text as a stream. Spreadsheets save CSV as
// UTF-8 (with or without a byte-order mark), as UTF-16 with a mark ("Unicode text"), or in the
// Windows code page (Excel's plain "CSV" on a western-European Windows: Windows-1252). The rule:
// a mark decides; else a file that is valid UTF-8 throughout is UTF-8; else it is Windows-1252
// (which also reads ISO-8859-1 text the same for every printable character).
import { createReadStream } from "node:fs";
import { Transform } from "node:stream";

export type CsvEncoding = "utf-8" | "windows-1252" | "utf-16le" | "utf-16be";

export interface DetectedEncoding {
  encoding: CsvEncoding;
  /** The file starts with a byte-order mark (dropped from the text). */
  bom: boolean;
}

/** Reads the whole file once (streamed; UTF-8 validation runs at well over 100 MB/s). */
export async function detectEncoding(filePath: string): Promise<DetectedEncoding> {
  const utf8 = new TextDecoder("utf-8", { fatal: true });
  let first = true;
  let valid = true;
  for await (const chunk of createReadStream(filePath, { highWaterMark: 256 * 1024 }) as AsyncIterable<Buffer>) {
    if (first) {
      first = false;
      if (chunk[0] === 0xff && chunk[1] === 0xfe) return { encoding: "utf-16le", bom: true };
      if (chunk[0] === 0xfe && chunk[1] === 0xff) return { encoding: "utf-16be", bom: true };
      if (chunk[0] === 0xef && chunk[1] === 0xbb && chunk[2] === 0xbf) return { encoding: "utf-8", bom: true };
    }
    try {
      utf8.decode(chunk, { stream: true });
    } catch {
      valid = false;
      break;
    }
  }
  if (valid) {
    try {
      utf8.decode(); // a sequence cut off at the end of the file
    } catch {
      valid = false;
    }
  }
  return { encoding: valid ? "utf-8" : "windows-1252", bom: false };
}

/** Bytes in, text out (strings, object mode), the byte-order mark dropped. */
export function decodeStream(encoding: CsvEncoding): Transform {
  const decoder = new TextDecoder(encoding); // not fatal: a stray byte after a UTF-8 mark shows as U+FFFD
  return new Transform({
    readableObjectMode: true,
    transform(chunk: Buffer, _enc, done) {
      const text = decoder.decode(chunk, { stream: true });
      done(null, text === "" ? undefined : text);
    },
    flush(done) {
      const rest = decoder.decode();
      if (rest) this.push(rest);
      done();
    },
  });
}

/** The first `maxChars` characters of the file's text (fewer if the file is shorter), and whether that is all of it. */
export async function readTextHead(filePath: string, encoding: CsvEncoding, maxChars: number): Promise<{ text: string; complete: boolean }> {
  const source = createReadStream(filePath, { highWaterMark: 64 * 1024 });
  const decoded = source.pipe(decodeStream(encoding));
  let text = "";
  try {
    for await (const chunk of decoded as AsyncIterable<string>) {
      text += chunk;
      if (text.length > maxChars) return { text: text.slice(0, maxChars), complete: false };
    }
    return { text, complete: true };
  } finally {
    source.destroy();
    decoded.destroy();
  }
}
