// TanStack Query keys and fetchers for the stock grid (client-safe: fetch only, types from the
// data layer are erased at build time). Every error answer of the API is thrown as ApiError with
// the server's code, message and per-field messages, so callers can name the line that failed.
import type { Movement } from "@/lib/data/ledger";
import type { MovementEntry } from "@/lib/data/movements";
import type { KitchenStock } from "@/lib/data/stock";
import type { StockLevel } from "@/lib/data/stock-levels";

export const stockKeys = {
  all: ["stock"] as const,
  kitchen: (code: string) => ["stock", "kitchen", code.toUpperCase()] as const,
  movements: (f: { kitchen: string; item: string; lot?: string | null }) =>
    ["movements", f.kitchen.toUpperCase(), f.item, f.lot ?? null] as const,
};

export { ApiError } from "./api";
import { apiFetch as send, jsonInit as json } from "./api";


/** GET /api/stock?kitchen=CODE */
export const fetchStock = (kitchen: string) => send<KitchenStock>(`/api/stock?kitchen=${encodeURIComponent(kitchen)}`);

export const stockQueryOptions = (kitchen: string) => ({
  queryKey: stockKeys.kitchen(kitchen),
  queryFn: () => fetchStock(kitchen),
});

export interface MovementsPage {
  movements: MovementEntry[];
  nextCursor: string | null;
}

/** GET /api/movements, newest first, one page. */
export function fetchMovements(f: { kitchen: string; item: string; lot?: string | null; cursor?: string | null; limit?: number }): Promise<MovementsPage> {
  const q = new URLSearchParams({ kitchen: f.kitchen, item: f.item, limit: String(f.limit ?? 25) });
  if (f.lot) q.set("lot", f.lot);
  if (f.cursor) q.set("cursor", f.cursor);
  return send<MovementsPage>(`/api/movements?${q}`);
}

export interface CountLine {
  /** item id or SKU */
  item: string;
  lot?: string;
  counted: string;
  unit: string;
}

export interface CountResult {
  countId: string;
  movements: Movement[];
}

/**
 * A fresh Idempotency-Key. crypto.randomUUID exists only in secure contexts (https, localhost); a
 * kitchen tablet on the local network over plain http still gets 122 random bits.
 */
export function newIdempotencyKey(): string {
  if (typeof crypto.randomUUID === "function") return crypto.randomUUID();
  const b = crypto.getRandomValues(new Uint8Array(16));
  b[6] = (b[6]! & 0x0f) | 0x40;
  b[8] = (b[8]! & 0x3f) | 0x80;
  const h = [...b].map((x) => x.toString(16).padStart(2, "0")).join("");
  return `${h.slice(0, 8)}-${h.slice(8, 12)}-${h.slice(12, 16)}-${h.slice(16, 20)}-${h.slice(20)}`;
}

/** POST /api/counts: every line together, all or nothing; replay-safe under one Idempotency-Key. */
export const postCount = (body: { kitchen: string; lines: CountLine[]; note?: string }, idempotencyKey: string) =>
  send<CountResult>("/api/counts", json("POST", body, { "idempotency-key": idempotencyKey }));

export interface StockLevelInput {
  kitchen: string;
  item: string;
  parLevel: string | null;
  reorderPoint: string | null;
}

export type { StockLevel } from "@/lib/data/stock-levels";

/** PUT /api/stock-levels (values in the item's stock unit). */
export const putStockLevel = (body: StockLevelInput) => send<StockLevel>("/api/stock-levels", json("PUT", body));
