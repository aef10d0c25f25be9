import { buildOpenApiDocument } from "@/lib/http/openapi";
import { route } from "@/lib/http/route";

/** The OpenAPI 3.1 document of every endpoint, for any signed-in user. */
export const GET = route({}, async () => buildOpenApiDocument());
