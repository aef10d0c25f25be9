// One error shape for every API response: {"error":{"code","message","details"?}}.
// Throw these anywhere below a route; lib/http/route.ts maps them to responses.
import { z } from "zod";

export class AppError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details?: unknown,
  ) {
    super(message);
    this.name = "AppError";
  }
}

export const badRequest = (message = "The request body is not valid JSON.") => new AppError(400, "BAD_REQUEST", message);
export const unauthenticated = (message = "Sign in first.") => new AppError(401, "UNAUTHENTICATED", message);
export const forbidden = (message = "You are not allowed to do this.") => new AppError(403, "FORBIDDEN", message);
export const notFound = (what = "Record") => new AppError(404, "NOT_FOUND", `${what} not found.`);
export const conflict = (message: string, code = "CONFLICT", details?: unknown) => new AppError(409, code, message, details);
export const payloadTooLarge = (limitBytes: number) =>
  new AppError(413, "PAYLOAD_TOO_LARGE", `The request body is larger than ${limitBytes} bytes.`);
export const unsupportedMediaType = (expected = "application/json") =>
  new AppError(415, "UNSUPPORTED_MEDIA_TYPE", `Send the body as ${expected}.`);
/** A service the request needs (the job queue's Redis) is not answering; trying later may work. */
export const serviceUnavailable = (message: string, code = "SERVICE_UNAVAILABLE") => new AppError(503, code, message);
export const rateLimited = (message = "Too many attempts. Try again later.", retryAfterSeconds?: number) =>
  new AppError(429, "RATE_LIMITED", message, retryAfterSeconds ? { retryAfterSeconds } : undefined);

/** Field errors keyed by dotted path ("lines.3.quantity"), so every bad field is named. */
export function fieldErrors(error: z.ZodError): Record<string, string[]> {
  const out: Record<string, string[]> = {};
  for (const issue of error.issues) {
    const key = issue.path.length ? issue.path.map(String).join(".") : "_";
    (out[key] ??= []).push(issue.message);
  }
  return out;
}

export const validation = (fields: Record<string, string[]>, message = "Some fields are not valid.") =>
  new AppError(422, "VALIDATION", message, { fields });

export function errorBody(e: AppError) {
  return { error: { code: e.code, message: e.message, ...(e.details === undefined ? {} : { details: e.details }) } };
}
