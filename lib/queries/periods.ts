// The periods page's calls to the API (client-safe: fetch only; the data layer's types are erased
// at build time).
import type { Period, PeriodList } from "@/lib/data/periods";
import { apiFetch, jsonInit } from "./api";
import { newIdempotencyKey } from "./stock";

export type { Period, PeriodEvent, PeriodList } from "@/lib/data/periods";

export const periodKeys = { list: ["periods", "list"] as const };

/** GET /api/periods (the current month and the eleven before it, or back to the next to close) */
export const fetchPeriods = () => apiFetch<PeriodList>("/api/periods");

/** POST /api/periods/:month/close. One Idempotency-Key per press. */
export const closePeriod = (month: string) =>
  apiFetch<Period>(`/api/periods/${encodeURIComponent(month)}/close`, { method: "POST", headers: { "idempotency-key": newIdempotencyKey() } });

/** POST /api/periods/:month/reopen {reason} (admins). */
export const reopenPeriod = (month: string, reason: string) =>
  apiFetch<Period>(`/api/periods/${encodeURIComponent(month)}/reopen`, jsonInit("POST", { reason }, { "idempotency-key": newIdempotencyKey() }));
