import { createReadStream } from "node:fs";
import { Readable } from "node:stream";
import { attachDeliveryDocument, deliveryDocument } from "@/lib/data/deliveries";
import { idParam, route } from "@/lib/http/route";

/** The delivery note itself as a PDF or photo (multipart, field "file"). No `body`: the upload is streamed. */
export const POST = route({}, async ({ user, params, req }) => attachDeliveryDocument(user, idParam(params, "Delivery"), req));

/** The attached note, streamed from storage with the media type its bytes showed on upload. */
export const GET = route({}, async ({ user, params }) => {
  const file = await deliveryDocument(user, idParam(params, "Delivery"));
  // an ASCII fallback for old clients, the name as sent in filename* (RFC 6266 / RFC 8187)
  const ascii = file.filename.replace(/[^\x20-\x7e]|["\\]/g, "_") || "delivery-note";
  const body = Readable.toWeb(createReadStream(file.path)) as ReadableStream<Uint8Array>;
  return new Response(body, {
    headers: {
      "content-type": file.mediaType,
      "content-length": String(file.size),
      "content-disposition": `inline; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(file.filename)}`,
      "x-content-type-options": "nosniff",
      "cache-control": "private, no-store",
    },
  });
});
