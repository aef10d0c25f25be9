// The reorder page's calls to the API (client-safe: fetch only; the data layer's types are erased
// at build time). Errors are thrown as ApiError with the server's per-field messages
// (422 details.fields, e.g. "lines.2.packs" naming the request's own line).
import type { PurchaseOrder } from "@/lib/data/purchase-orders";
import type { ReorderSuggestions } from "@/lib/data/reorder-suggestions";
import { apiFetch, jsonInit } from "./api";

export { ApiError } from "./api";
export { newIdempotencyKey } from "./stock";
export type { KitchenReorder, ReorderLine, ReorderOffer, ReorderSupplierGroup, ReorderUnsourced } from "@/lib/data/reorder-suggestions";

export interface ReorderOrdersBody {
  kitchen: string;
  lines: { supplierItemId: string; packs: string; packPrice?: string }[];
}

/** GET /api/reorder-suggestions?kitchen=ID or code. */
export const fetchReorderSuggestions = (kitchen: string) =>
  apiFetch<ReorderSuggestions>(`/api/reorder-suggestions?${new URLSearchParams({ kitchen })}`);

/** POST /api/reorder-suggestions/orders: one draft per supplier. One Idempotency-Key per click, kept for a retry. */
export const createReorderOrders = (body: ReorderOrdersBody, idempotencyKey: string) =>
  apiFetch<{ orders: PurchaseOrder[] }>("/api/reorder-suggestions/orders", jsonInit("POST", body, { "idempotency-key": idempotencyKey }));
