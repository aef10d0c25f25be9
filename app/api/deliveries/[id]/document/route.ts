import { attachDeliveryDocument } from "@/lib/data/deliveries";
import { idParam, route } from "@/lib/http/route";

/** The delivery note itself as a PDF or photo (multipart, field "file"). No `body`: the upload is streamed. */
export const POST = route({}, async ({ user, params, req }) => attachDeliveryDocument(user, idParam(params, "Delivery"), req));
