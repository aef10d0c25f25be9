// Uploads end to end: a route as a consumer writes one (route() + receiveUpload), called with a
// real streamed multipart body, directly and through a real HTTP server; files land under the
// run's state folder (HL_STATE=<TEST_STATE>, db/test.sh) and rows in `uploads`.
import { createHash } from "node:crypto";
import { existsSync, readdirSync, readFileSync } from "node:fs";
import http from "node:http";
import type { AddressInfo } from "node:net";
import path from "node:path";
import { NextRequest } from "next/server";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { z } from "zod";
import { db } from "../../db/client";
import type { UploadRow } from "../../db/types";
import { getUpload, receiveUpload, uploadFilePath } from "../../lib/data/uploads";
import { Reply, route } from "../../lib/http/route";
import { DOCUMENT_FILE_TYPES } from "../../lib/uploads/file-types";
import { incomingDir, uploadsRoot } from "../../lib/uploads/storage";
import { createCompany, type TestCompany } from "../support/factory";
import { baseUrl } from "../support/http";
import { bytes, multipart, type MultipartBody, type Part } from "../support/multipart";
import { currentUser, sessionCookieFor } from "../support/sessions";

// What a price-list or delivery route will look like (these are not app routes).
const priceListRoute = route({}, async ({ req, user }) => {
  const r = await receiveUpload(user, req, "price_list", { fields: z.object({ note: z.string().max(20, "At most 20 characters.").optional() }) });
  return new Reply(r.duplicate ? 200 : 201, r);
});
const deliveryDocumentRoute = route({}, async ({ req, user }) => new Reply(201, await receiveUpload(user, req, "delivery_note", { allowed: DOCUMENT_FILE_TYPES })));
type Handler = typeof priceListRoute;

let a: TestCompany;
let b: TestCompany;
const cookie: Record<string, string> = {};
beforeAll(async () => {
  [a, b] = await Promise.all([createCompany(), createCompany()]);
  cookie.buyer = await sessionCookieFor(a.users.buyer.id);
  cookie.lead = await sessionCookieFor(a.users.kitchen_lead.id);
  cookie.otherBuyer = await sessionCookieFor(b.users.buyer.id);
});

const CSV = "SKU;Bezeichnung;Preis\r\nK-001;Kümmel ganz;7,85\r\nP-002;Paprika edelsüß;9,10\r\n";
const csvFile = (content = CSV, filename = "preise.csv"): Part => ({ name: "file", filename, contentType: "text/csv", content: bytes(content) });
/** A CSV of `size` bytes, generated as it is read. */
const bigCsv = (size: number): Part => ({
  name: "file", filename: "big.csv", contentType: "text/csv",
  content: { head: bytes("SKU,Description,Unit price\n"), fill: bytes("A-1,Allspice whole berries,4.20\n"), size },
});

async function send(handler: Handler, body: MultipartBody, who: string, opts: { contentLength?: boolean; contentType?: string } = {}) {
  const headers = new Headers({ host: new URL(baseUrl()).host, "content-type": opts.contentType ?? body.contentType, cookie: cookie[who]! });
  if (opts.contentLength) headers.set("content-length", String(body.length));
  const req = new NextRequest(new URL("/api/uploads", baseUrl()), { method: "POST", headers, body: body.stream(), duplex: "half" } as ConstructorParameters<typeof NextRequest>[1]);
  const res = await handler(req, { params: Promise.resolve({}) });
  return { status: res.status, body: await res.json() };
}

const companyDir = (t: TestCompany) => path.join(uploadsRoot(), t.company.id);
const storedFiles = (t: TestCompany) => (existsSync(companyDir(t)) ? readdirSync(companyDir(t)).sort() : []);
const incoming = () => (existsSync(incomingDir()) ? readdirSync(incomingDir()) : []);
const rows = (t: TestCompany): Promise<UploadRow[]> => db()("uploads").where({ company_id: t.company.id }).orderBy("created_at");
const sha256 = (s: string | Uint8Array) => createHash("sha256").update(s).digest("hex");

describe("storing", () => {
  it("streams a CSV to <state>/uploads/<company>/<sha256>.csv outside the web root and records it", async () => {
    const res = await send(priceListRoute, multipart([csvFile(), { name: "note", value: "winter list" }]), "buyer");
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const digest = sha256(CSV);
    expect(res.body).toMatchObject({
      duplicate: false, fields: { note: "winter list" },
      upload: { kind: "price_list", sha256: digest, size: Buffer.byteLength(CSV), filename: "preise.csv", mediaType: "text/csv", createdBy: a.users.buyer.id },
    });
    const file = uploadFilePath(a.company.id, res.body.upload);
    expect(file).toBe(path.join(path.resolve(process.env.HL_STATE!), "uploads", a.company.id, `${digest}.csv`));
    expect(path.relative(path.resolve("public"), file).startsWith("..")).toBe(true);
    expect(readFileSync(file, "utf8")).toBe(CSV);
    expect(await rows(a)).toMatchObject([{ kind: "price_list", sha256: digest, size: String(Buffer.byteLength(CSV)), media_type: "text/csv", created_by: a.users.buyer.id }]);
    expect(incoming()).toEqual([]);
  });

  it("the same file sent twice has the same sha256 and is recognised as a duplicate (one row, one file)", async () => {
    const content = `${CSV}X-9;Piment;1,00\r\n`;
    const first = await send(priceListRoute, multipart([csvFile(content, "list-1.csv")]), "buyer");
    const second = await send(priceListRoute, multipart([csvFile(content, "list-1 (copy).csv")]), "buyer");
    expect(first.status).toBe(201);
    expect(second.status).toBe(200);
    expect(second.body.duplicate).toBe(true);
    expect(second.body.upload.sha256).toBe(first.body.upload.sha256);
    expect(second.body.upload.sha256).toBe(sha256(content));
    expect(second.body.upload.id).toBe(first.body.upload.id);
    expect(second.body.upload.filename).toBe("list-1.csv"); // the first sending is the record
    expect((await rows(a)).filter((r) => r.sha256 === sha256(content))).toHaveLength(1);
    expect(storedFiles(a).filter((f) => f.startsWith(sha256(content)))).toEqual([`${sha256(content)}.csv`]);
  });

  it("a delivery-note photo is stored with the media type its bytes show", async () => {
    const jpeg = Uint8Array.from([0xff, 0xd8, 0xff, 0xe0, 0, 0x10, 0x4a, 0x46, 0x49, 0x46, 0, 1, ...new Array(500).fill(7)]);
    const res = await send(deliveryDocumentRoute, multipart([{ name: "file", filename: "IMG_2041.JPG", contentType: "application/octet-stream", content: jpeg }]), "buyer");
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.upload).toMatchObject({ kind: "delivery_note", mediaType: "image/jpeg", sha256: sha256(jpeg), size: jpeg.length });
    expect(storedFiles(a)).toContain(`${sha256(jpeg)}.jpg`);
  });
});

describe("limits: 413, reading stops, nothing stored", () => {
  const SIZE = 30 * 1024 * 1024;

  it("a 30 MB file sent without a length is cut off at 25 MB", async () => {
    const before = { files: storedFiles(a), rows: (await rows(a)).length };
    const body = multipart([bigCsv(SIZE)]);
    const res = await send(priceListRoute, body, "buyer");
    expect(res.status).toBe(413);
    expect(res.body.error).toMatchObject({ code: "PAYLOAD_TOO_LARGE", message: 'The file "big.csv" is larger than 25 MB. Nothing was stored; send a smaller file.' });
    expect(res.body.error.details.fields).toEqual({ file: ["Larger than 25 MB."] });
    // read a little past the limit (the chunk that crossed it and what was in flight), not the rest
    expect(body.pulled()).toBeGreaterThan(25 * 1024 * 1024);
    expect(body.pulled()).toBeLessThan(26 * 1024 * 1024);
    expect(storedFiles(a)).toEqual(before.files);
    expect(incoming()).toEqual([]);
    expect((await rows(a)).length).toBe(before.rows);
  });

  it("a 30 MB body that says its length is refused before reading", async () => {
    const body = multipart([bigCsv(SIZE)]);
    const res = await send(priceListRoute, body, "buyer", { contentLength: true });
    expect(res.status).toBe(413);
    expect(res.body.error.message).toBe("The upload is larger than 25 MB. Nothing was stored; send a smaller file.");
    expect(body.pulled()).toBe(0);
  });

  it("no permission: 403 before a byte is read", async () => {
    const body = multipart([csvFile()]);
    const res = await send(priceListRoute, body, "lead"); // kitchen leads do not manage purchasing
    expect(res.status).toBe(403);
    expect(body.pulled()).toBe(0);
  });
});

describe("refused files: 422 naming the field, nothing stored", () => {
  const refuse = async (handler: Handler, part: Part, message: string | RegExp) => {
    const before = storedFiles(a);
    const res = await send(handler, multipart([part]), "buyer");
    expect(res.status, JSON.stringify(res.body)).toBe(422);
    expect(res.body.error.message).toMatch(message);
    expect(Object.keys(res.body.error.details.fields)).toEqual([part.name]);
    expect(storedFiles(a)).toEqual(before);
    expect(incoming()).toEqual([]);
  };

  it("a PDF renamed .csv", () => refuse(priceListRoute, csvFile("%PDF-1.7\n1 0 obj\n", "prices.csv"), '"prices.csv" is a PDF document: send CSV or text (.csv, .txt, .tsv).'));
  it("a workbook renamed .csv, with what to do", () =>
    refuse(priceListRoute, { name: "file", filename: "prices.csv", content: Uint8Array.from([0x50, 0x4b, 3, 4, 0x14, 0, 6, 0]) }, /is a spreadsheet workbook or ZIP archive \(\.xlsx, \.zip\) \(save the sheet as CSV first\)/));
  it("an extension the kind does not take", () => refuse(priceListRoute, csvFile(CSV, "prices.xlsx"), '"prices.xlsx" is not an accepted file: send CSV or text (.csv, .txt, .tsv).'));
  it("a PNG named .jpg", () =>
    refuse(deliveryDocumentRoute, { name: "file", filename: "note.jpg", content: Uint8Array.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 0x0d]) },
      '"note.jpg" is named as JPEG image but its contents are PNG image; rename it or send the right file.'));
  it("a CSV where a document is wanted", () => refuse(deliveryDocumentRoute, csvFile(CSV, "note.pdf"), /"note\.pdf" is a text file: send PDF/));
  it("an empty file", () => refuse(priceListRoute, csvFile("", "empty.csv"), '"empty.csv" is an empty file: send CSV or text (.csv, .txt, .tsv).'));
  it("a file in another field", () => refuse(priceListRoute, { ...csvFile(), name: "attachment" }, 'Unexpected file; send the file in the field "file".'));

  it("a text field that fails its schema; two files; no file; not multipart", async () => {
    const long = await send(priceListRoute, multipart([csvFile(), { name: "note", value: "x".repeat(21) }]), "buyer");
    expect(long.status).toBe(422);
    expect(long.body.error.details.fields).toEqual({ note: ["At most 20 characters."] });
    const two = await send(priceListRoute, multipart([csvFile(), csvFile("a,b\n1,2\n", "second.csv")]), "buyer");
    expect(two.status).toBe(422);
    expect(two.body.error.details.fields).toEqual({ file: ["Send one file at a time."] });
    const none = await send(priceListRoute, multipart([{ name: "note", value: "hi" }]), "buyer");
    expect(none.body.error.details.fields).toEqual({ file: ["Attach a file."] });
    const json = await send(priceListRoute, multipart([csvFile()]), "buyer", { contentType: "application/json" });
    expect(json.status).toBe(415);
    expect(json.body.error.message).toBe("Send the body as multipart/form-data.");
    expect(incoming()).toEqual([]);
  });
});

describe("tenancy", () => {
  it("another company's upload is not found; the file is under its own company's folder", async () => {
    const res = await send(priceListRoute, multipart([csvFile("SKU,Price\nB-1,2.00\n", "b.csv")]), "otherBuyer");
    expect(res.status).toBe(201);
    await expect(getUpload(await currentUser(a.users.buyer.id), res.body.upload.id)).rejects.toMatchObject({ status: 404 });
    expect((await getUpload(await currentUser(b.users.buyer.id), res.body.upload.id)).sha256).toBe(res.body.upload.sha256);
    expect(storedFiles(b)).toEqual([`${res.body.upload.sha256}.csv`]);
    await expect(getUpload(await currentUser(a.users.buyer.id), "not-a-uuid")).rejects.toMatchObject({ status: 404 });
  });
});

describe("through a real HTTP server", () => {
  // Hands each request to the route the way Next's Node server does (the IncomingMessage is the
  // request body), so the streamed reading and the early 413 go over a real socket.
  let server: http.Server;
  let port: number;
  beforeAll(async () => {
    server = http.createServer(async (req, res) => {
      const headers = new Headers();
      for (const [k, v] of Object.entries(req.headers)) if (typeof v === "string") headers.set(k, v);
      const request = new NextRequest(new URL(req.url!, `http://${req.headers.host}`), {
        method: req.method, headers, body: req as unknown as ReadableStream, duplex: "half",
      } as ConstructorParameters<typeof NextRequest>[1]);
      const out = await priceListRoute(request, { params: Promise.resolve({}) });
      res.writeHead(out.status, { "content-type": "application/json", connection: "close" });
      res.end(Buffer.from(await out.arrayBuffer()));
    });
    await new Promise<void>((r) => server.listen(0, "127.0.0.1", r));
    port = (server.address() as AddressInfo).port;
  });
  afterAll(() => new Promise<void>((r) => server.close(() => r())));

  /** Streams the body with backpressure and resolves with the first response (the upload may still be going). */
  function post(body: MultipartBody, who = "buyer"): Promise<{ status: number; body: any; written: number }> {
    return new Promise((resolve, reject) => {
      let written = 0;
      const req = http.request({
        host: "127.0.0.1", port, path: "/api/uploads", method: "POST",
        headers: { "content-type": body.contentType, "transfer-encoding": "chunked", cookie: cookie[who]!, host: new URL(baseUrl()).host },
      });
      req.on("response", (res) => {
        const chunks: Buffer[] = [];
        res.on("data", (c: Buffer) => chunks.push(c));
        res.on("end", () => resolve({ status: res.statusCode!, body: JSON.parse(Buffer.concat(chunks).toString()), written }));
        res.on("error", reject);
      });
      req.on("error", () => {}); // the server may close while the rest is still being sent
      const reader = body.stream().getReader();
      const pump = async (): Promise<void> => {
        for (;;) {
          const { done, value } = await reader.read();
          if (done) return void req.end();
          written += value.length;
          if (!req.write(value)) await new Promise((r) => req.once("drain", r));
          if (req.destroyed) return;
        }
      };
      pump().catch(() => {});
    });
  }

  it("a small file is stored; a 30 MB file gets 413 and nothing is stored", async () => {
    const ok = await post(multipart([csvFile("SKU,Price\nH-1,3.00\n", "http.csv")]));
    expect(ok.status).toBe(201);
    expect(ok.body.upload.sha256).toBe(sha256("SKU,Price\nH-1,3.00\n"));

    const before = storedFiles(a);
    const big = await post(multipart([bigCsv(30 * 1024 * 1024)]));
    expect(big.status).toBe(413);
    expect(big.body.error.message).toBe('The file "big.csv" is larger than 25 MB. Nothing was stored; send a smaller file.');
    expect(storedFiles(a)).toEqual(before);
    expect(incoming()).toEqual([]);
  });
});

afterAll(async () => {
  // every temp file of this file's requests is gone (the folder is shared only with this run)
  expect(incoming()).toEqual([]);
});
