import "server-only";
import { createHash } from "node:crypto";
import { db } from "../../db/client";
import type { IdempotencyKeyRow } from "../../db/types";
import { conflict, validation } from "../http/errors";

export interface StoredResponse {
  status: number;
  body: unknown;
}

interface Scope {
  companyId: string;
  userId: string;
  endpoint: string;
  key: string;
}

export const requestHash = (body: string) => createHash("sha256").update(body).digest("hex");

/**
 * Claims the key for this request. Returns the stored response when the same request was already
 * answered; throws 422 when the key was used with another body, 409 while the first is still running.
 */
export async function claimIdempotencyKey(scope: Scope, hash: string): Promise<StoredResponse | null> {
  const row = { company_id: scope.companyId, user_id: scope.userId, endpoint: scope.endpoint, key: scope.key, request_hash: hash };
  const inserted = await db()("idempotency_keys").insert(row).onConflict(["company_id", "user_id", "endpoint", "key"]).ignore().returning("key");
  if (inserted.length) return null;
  const existing: IdempotencyKeyRow = await db()("idempotency_keys")
    .where({ company_id: scope.companyId, user_id: scope.userId, endpoint: scope.endpoint, key: scope.key })
    .first();
  if (existing.request_hash !== hash) {
    throw validation({ "Idempotency-Key": ["This key was already used with a different request body."] }, "Idempotency-Key reused with a different body.");
  }
  if (existing.status_code === null) throw conflict("The first request with this Idempotency-Key is still being processed.");
  return { status: existing.status_code, body: existing.response_body };
}

export async function storeIdempotentResponse(scope: Scope, response: StoredResponse): Promise<void> {
  await db()("idempotency_keys")
    .where({ company_id: scope.companyId, user_id: scope.userId, endpoint: scope.endpoint, key: scope.key })
    .update({ status_code: response.status, response_body: JSON.stringify(response.body) });
}

/** A server error is not an answer: free the key so the client can retry. */
export async function releaseIdempotencyKey(scope: Scope): Promise<void> {
  await db()("idempotency_keys")
    .where({ company_id: scope.companyId, user_id: scope.userId, endpoint: scope.endpoint, key: scope.key })
    .delete();
}
