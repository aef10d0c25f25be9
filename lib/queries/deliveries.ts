// Deliveries from the browser (client-safe: fetch only). Each call answers the whole delivery.
import type { DeliveryResponse } from "@/lib/validation/deliveries";
import { apiFetch, jsonInit } from "./api";

export { ApiError } from "./api";
export type Delivery = DeliveryResponse;

/** POST /api/deliveries: the CSV and its fields as multipart (the browser sets the boundary). */
export const uploadDeliveryCsv = (form: FormData) => apiFetch<Delivery>("/api/deliveries", { method: "POST", body: form });

export const createKeyedDelivery = (body: { supplier: string; kitchen: string; order?: string; noteNumber?: string }, key: string) =>
  apiFetch<Delivery>("/api/deliveries/keyed", jsonInit("POST", { lines: [], ...body }, { "idempotency-key": key }));

export const updateDelivery = (id: string, body: { noteNumber?: string; freight?: string }) => apiFetch<Delivery>(`/api/deliveries/${id}`, jsonInit("PATCH", body));

export const addDeliveryLine = (id: string, body: Record<string, unknown>, key: string) =>
  apiFetch<Delivery>(`/api/deliveries/${id}/lines`, jsonInit("POST", body, { "idempotency-key": key }));

export const updateDeliveryLine = (id: string, lineId: string, body: { decision?: string; corrections?: Record<string, string | null> }) =>
  apiFetch<Delivery>(`/api/deliveries/${id}/lines/${lineId}`, jsonInit("PATCH", body));

export const attachDeliveryDocument = (id: string, form: FormData) => apiFetch<Delivery>(`/api/deliveries/${id}/document`, { method: "POST", body: form });

export const postDelivery = (id: string, key: string) => apiFetch<Delivery>(`/api/deliveries/${id}/post`, { method: "POST", headers: { "idempotency-key": key } });
