import { purchaseOrderFile } from "@/lib/data/purchase-orders";
import { idParam, route } from "@/lib/http/route";

/** The order as the supplier gets it, as a download. */
export const GET = route({}, async ({ user, params }) => {
  const file = await purchaseOrderFile(user, idParam(params, "Purchase order"), "pdf");
  return new Response(Buffer.from(file.content), {
    headers: { "content-type": file.contentType, "content-disposition": `attachment; filename="${file.filename}"`, "cache-control": "private, no-store" },
  });
});
