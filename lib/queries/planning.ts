// TanStack Query keys, fetchers and writes for planning: recipes, batch plans, reservations,
// production, holds, the lot and batch traces and the casing calculator (client-safe: fetch only; the types from the data layer are erased at build
// time). Every error answer is thrown as ApiError with the server's code, message, per-field
// messages (422 details.fields, e.g. "lines.2.rate") and details (409 SHORTAGE details.lines).
// Writes take the caller's Idempotency-Key: one key per user action, kept for a retry after a lost
// answer, a new one for the next action.
import type { Batch, ReserveAllResult } from "@/lib/data/batches";
import type { CasingCalculation } from "@/lib/data/casing-calculation";
import type { Item } from "@/lib/data/items";
import type { Recipe, RecipeSummary } from "@/lib/data/recipes";
import type { BatchTrace, LotTrace } from "@/lib/data/trace";
import type { TransferRequest } from "@/lib/data/transfer-requests";
import type { BatchCreateInput, BatchProduceInput } from "@/lib/validation/batches";
import type { CasingCalculationInput } from "@/lib/validation/casing";
import type { RecipeCreateInput, RecipeVersionInput } from "@/lib/validation/recipes";
import { apiFetch, jsonInit } from "./api";

export { ApiError } from "./api";
export { newIdempotencyKey } from "./stock";
export type { Batch, BatchLine, BatchStatus, Production, ReserveAllResult, ReserveOutcome } from "@/lib/data/batches";
export type { BatchTrace, LotTrace } from "@/lib/data/trace";
export type { CasingCalculation } from "@/lib/data/casing-calculation";
export type { Item } from "@/lib/data/items";
export type { Recipe, RecipeLine, RecipeSummary, RecipeVersion } from "@/lib/data/recipes";

export const planningKeys = {
  all: ["planning"] as const,
  batches: () => ["planning", "batches"] as const,
  week: (kitchen: string, from: string, to: string) => ["planning", "batches", kitchen.toUpperCase(), from, to] as const,
  batch: (id: string) => ["planning", "batch", id] as const,
  recipes: () => ["planning", "recipes"] as const,
  recipe: (ref: string, version?: number) => ["planning", "recipe", ref, version ?? "current"] as const,
  items: () => ["items", "all"] as const,
  lotTrace: (id: string) => ["planning", "trace", "lot", id] as const,
  batchTrace: (id: string) => ["planning", "trace", "batch", id] as const,
};

/** What the request bodies look like on the way out (the schemas' input side: defaults optional). */
export type BatchCreateBody = Omit<BatchCreateInput, "note"> & { note?: string };
export type BatchProduceBody = Omit<BatchProduceInput, "lines" | "note"> & Partial<Pick<BatchProduceInput, "lines" | "note">>;
export type RecipeCreateBody = Omit<RecipeCreateInput, "lines" | "processNotes" | "changeNote"> & Partial<Pick<RecipeCreateInput, "lines" | "processNotes" | "changeNote">>;
export type RecipeVersionBody = Omit<RecipeVersionInput, "lines" | "processNotes" | "changeNote"> & Partial<Pick<RecipeVersionInput, "lines" | "processNotes" | "changeNote">>;

/** The lines a 409 SHORTAGE named (details.lines), empty for any other error. */
export function shortLinesOf(e: unknown): ReserveAllResult["batches"][number]["short"] {
  const lines = (e as { details?: { lines?: unknown } } | null)?.details?.lines;
  return Array.isArray(lines) ? (lines as ReserveAllResult["batches"][number]["short"]) : [];
}

const post = <T>(url: string, body: unknown, idempotencyKey?: string) =>
  apiFetch<T>(url, jsonInit("POST", body ?? {}, idempotencyKey ? { "idempotency-key": idempotencyKey } : {}));

// ---------------------------------------------------------------------------------------------
// Reading

/** GET /api/batches?kitchen=CODE&from=YYYY-MM-DD&to=YYYY-MM-DD (both days included). */
export const fetchWeek = (kitchen: string, from: string, to: string) =>
  apiFetch<{ batches: Batch[] }>(`/api/batches?${new URLSearchParams({ kitchen, from, to })}`).then((r) => r.batches);

export const weekQueryOptions = (kitchen: string, from: string, to: string) => ({
  queryKey: planningKeys.week(kitchen, from, to),
  queryFn: () => fetchWeek(kitchen, from, to),
});

/** GET /api/batches/:id */
export const fetchBatch = (id: string) => apiFetch<Batch>(`/api/batches/${encodeURIComponent(id)}`);

export const batchQueryOptions = (id: string) => ({ queryKey: planningKeys.batch(id), queryFn: () => fetchBatch(id) });

/** GET /api/batches?status=produced (or on_hold): made batches, for picking one to trace. */
export const fetchBatchesByStatus = (status: "produced" | "on_hold") =>
  apiFetch<{ batches: Batch[] }>(`/api/batches?${new URLSearchParams({ status })}`).then((r) => r.batches);

/** GET /api/trace/lots/:id: a lot forward (receipt, transfers, the batches that used it, what is left where). */
export const fetchLotTrace = (id: string) => apiFetch<LotTrace>(`/api/trace/lots/${encodeURIComponent(id)}`);

export const lotTraceQueryOptions = (id: string) => ({ queryKey: planningKeys.lotTrace(id), queryFn: () => fetchLotTrace(id) });

/** GET /api/trace/batches/:id: a produced batch back to every lot it used. */
export const fetchBatchTrace = (id: string) => apiFetch<BatchTrace>(`/api/trace/batches/${encodeURIComponent(id)}`);

export const batchTraceQueryOptions = (id: string) => ({ queryKey: planningKeys.batchTrace(id), queryFn: () => fetchBatchTrace(id) });

/** The CSV of a trace, for a recall (a plain link: the browser downloads it with the session cookie). */
export const traceCsvUrl = (kind: "lots" | "batches", id: string) => `/api/trace/${kind}/${encodeURIComponent(id)}?format=csv`;

/** GET /api/recipes (the current version's class of each). */
export const fetchRecipes = () => apiFetch<{ recipes: RecipeSummary[] }>("/api/recipes").then((r) => r.recipes);

export const recipesQueryOptions = () => ({ queryKey: planningKeys.recipes(), queryFn: fetchRecipes });

/** GET /api/recipes/:idOrCode(?version=N) */
export const fetchRecipe = (ref: string, version?: number) =>
  apiFetch<Recipe>(`/api/recipes/${encodeURIComponent(ref)}${version ? `?version=${version}` : ""}`);

export const recipeQueryOptions = (ref: string, version?: number) => ({
  queryKey: planningKeys.recipe(ref, version),
  queryFn: () => fetchRecipe(ref, version),
});

/** GET /api/items: the catalogue (the recipe form's item picker, casing choices, units to show). */
export const fetchItems = () => apiFetch<{ items: Item[] }>("/api/items").then((r) => r.items);

export const itemsQueryOptions = () => ({ queryKey: planningKeys.items(), queryFn: fetchItems, staleTime: 60_000 });

// ---------------------------------------------------------------------------------------------
// Writing

/** POST /api/batches: the plan with its bill of materials (201); a cure over a statutory maximum is 422. */
export const planBatch = (body: BatchCreateBody, idempotencyKey: string) => post<Batch>("/api/batches", body, idempotencyKey);

/** POST /api/batches/:id/reserve: all or nothing (409 SHORTAGE, details.lines). */
export const reserveBatch = (id: string, idempotencyKey: string) => post<Batch>(`/api/batches/${encodeURIComponent(id)}/reserve`, undefined, idempotencyKey);

/** POST /api/batches/:id/release: the lots go back to available; the batch stays planned. */
export const releaseBatch = (id: string, idempotencyKey: string) => post<Batch>(`/api/batches/${encodeURIComponent(id)}/release`, undefined, idempotencyKey);

/** POST /api/batches/:id/cancel: releases what it held and cancels the plan. */
export const cancelBatch = (id: string, idempotencyKey: string) => post<Batch>(`/api/batches/${encodeURIComponent(id)}/cancel`, undefined, idempotencyKey);

/**
 * POST /api/batches/:id/produce: what was made (actual meat block, per line what was weighed and from
 * which lots). The batch comes back produced, or on_hold when the actual cure is over a statutory
 * maximum. 409 NOT_PRODUCIBLE / INSUFFICIENT_STOCK / LOT_EXPIRED; 422 names lines.N.quantity, lines.N.lots...
 */
export const produceBatch = (id: string, body: BatchProduceBody, idempotencyKey: string) =>
  post<Batch>(`/api/batches/${encodeURIComponent(id)}/produce`, body, idempotencyKey);

/** POST /api/batches/:id/release-hold: a manager's reason (the corrective action taken); the batch becomes produced. */
export const releaseHold = (id: string, reason: string, idempotencyKey: string) =>
  post<Batch>(`/api/batches/${encodeURIComponent(id)}/release-hold`, { reason }, idempotencyKey);

/** POST /api/batches/reserve-all: every planned batch of a kitchen between two days, each all or nothing; per batch reserved now, already reserved, short or skipped. */
export const reserveAll = (body: { kitchen: string; from: string; to: string }, idempotencyKey: string) =>
  post<ReserveAllResult>("/api/batches/reserve-all", body, idempotencyKey);

/**
 * POST /api/transfer-requests for a batch's shortage: asks the suggested kitchen for the item, for
 * the batch's kitchen. 409 ALREADY_REQUESTED while one for the batch and item is open.
 */
export const requestBatchTransfer = (
  body: { batch: string; fromKitchen: string; toKitchen: string; item: string; quantity: string; unit: string; note?: string },
  idempotencyKey: string,
) => post<TransferRequest>("/api/transfer-requests", body, idempotencyKey);

/** POST /api/recipes: a new recipe and its version 1. */
export const createRecipe = (body: RecipeCreateBody, idempotencyKey: string) => post<Recipe>("/api/recipes", body, idempotencyKey);

/** POST /api/recipes/:id/versions: a new version, which becomes the current one. */
export const addRecipeVersion = (ref: string, body: RecipeVersionBody, idempotencyKey: string) =>
  post<Recipe>(`/api/recipes/${encodeURIComponent(ref)}/versions`, body, idempotencyKey);

/** POST /api/calculations/casing: computes only, writes nothing. */
export const calculateCasing = (body: CasingCalculationInput) => post<CasingCalculation>("/api/calculations/casing", body);
