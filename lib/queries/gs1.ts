// Reading a GS1 case label from the browser (client-safe: fetch only; the types are erased at
// build time). POST /api/gs1/parse writes nothing, so no Idempotency-Key.
import type { Gs1Label } from "@/lib/gs1/parse";
import type { Gs1ParseInput } from "@/lib/validation/gs1";
import { apiFetch, jsonInit } from "./api";

export { ApiError } from "./api";
export type { Gs1Label } from "@/lib/gs1/parse";

/** POST /api/gs1/parse: what a scan says, or ApiError 422 naming the AI and what is wrong. */
export const parseGs1Scan = (body: Gs1ParseInput) => apiFetch<Gs1Label>("/api/gs1/parse", jsonInit("POST", body));
