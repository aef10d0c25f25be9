// multipart/form-data bodies for upload tests, built as a pull stream so a test can see how much
// of the body the server read before it answered (a 30 MB file is generated as it is pulled,
// never held in memory).

export interface FilePart {
  name: string;
  filename: string;
  contentType?: string;
  /** The file's bytes, or a head repeated up to `size` bytes. */
  content: Uint8Array | { head: Uint8Array; fill: Uint8Array; size: number };
}
export interface FieldPart {
  name: string;
  value: string;
}
export type Part = FilePart | FieldPart;

export interface MultipartBody {
  contentType: string;
  /** The whole body's length (for a Content-Length header, when a test sends one). */
  length: number;
  stream(): ReadableStream<Uint8Array>;
  /** Bytes handed to the reader so far (of the last stream). */
  pulled(): number;
}

const enc = new TextEncoder();

function* fileBytes(c: FilePart["content"], chunk: number): Generator<Uint8Array> {
  if (c instanceof Uint8Array) {
    for (let i = 0; i < c.length; i += chunk) yield c.subarray(i, i + chunk);
    return;
  }
  yield c.head;
  let left = c.size - c.head.length;
  const block = new Uint8Array(Math.max(chunk, c.fill.length));
  for (let i = 0; i < block.length; i++) block[i] = c.fill[i % c.fill.length]!;
  while (left > 0) {
    const n = Math.min(left, chunk);
    yield block.subarray(0, n);
    left -= n;
  }
}

export function multipart(parts: Part[], chunk = 64 * 1024): MultipartBody {
  const boundary = `----hl-test-${Math.random().toString(16).slice(2)}`;
  const pieces = (): Generator<Uint8Array> => (function* () {
    for (const p of parts) {
      if ("value" in p) {
        yield enc.encode(`--${boundary}\r\nContent-Disposition: form-data; name="${p.name}"\r\n\r\n${p.value}\r\n`);
      } else {
        yield enc.encode(`--${boundary}\r\nContent-Disposition: form-data; name="${p.name}"; filename="${p.filename}"\r\nContent-Type: ${p.contentType ?? "application/octet-stream"}\r\n\r\n`);
        yield* fileBytes(p.content, chunk);
        yield enc.encode("\r\n");
      }
    }
    yield enc.encode(`--${boundary}--\r\n`);
  })();
  let length = 0;
  for (const b of pieces()) length += b.length;
  let pulled = 0;
  return {
    contentType: `multipart/form-data; boundary=${boundary}`,
    length,
    pulled: () => pulled,
    stream() {
      pulled = 0;
      const it = pieces();
      return new ReadableStream<Uint8Array>({
        pull(controller) {
          const { value, done } = it.next();
          if (done) return controller.close();
          pulled += value.length;
          controller.enqueue(value.slice()); // a copy: the fill block is reused
        },
      }, { highWaterMark: 0 });
    },
  };
}

export const bytes = (s: string) => enc.encode(s);
