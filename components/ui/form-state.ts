// The value a form's server action returns (expected errors are values, never throws), and the
// two mappers every action uses: zod issues and AppError details -> errors named per field.
import { z } from "zod";
import { AppError } from "@/lib/http/errors";

export type FieldErrors = Record<string, string[] | undefined>;

export interface FormState<V = Record<string, string | string[] | boolean | undefined>> {
  /** Set when the action did what was asked. */
  ok?: boolean;
  /** One sentence for the whole form (a conflict, a refusal, a success note). */
  message?: string;
  fieldErrors?: FieldErrors;
  /** What was sent, so a rejected form keeps the person's input. */
  values?: V;
}

/** Errors keyed by top-level field ("lines.3.qty" -> "lines"), first message first. */
function byField(fields: Record<string, string[] | undefined>): FieldErrors {
  const out: Record<string, string[]> = {};
  for (const [path, messages] of Object.entries(fields)) {
    const key = path.split(".")[0] ?? path;
    (out[key] ??= []).push(...(messages ?? []));
  }
  return out;
}

export function zodErrors(error: z.ZodError): FieldErrors {
  const flat = z.flattenError(error);
  const fields: FieldErrors = { ...(flat.fieldErrors as FieldErrors) };
  if (flat.formErrors.length) fields._ = flat.formErrors;
  return fields;
}

/**
 * An AppError as form state; null for anything else (the caller rethrows: unexpected errors are
 * not the person's to fix). A 422's generic sentence is dropped when its fields say more.
 */
export function appErrorState(e: unknown): FormState | null {
  if (!(e instanceof AppError)) return null;
  const fields = (e.details as { fields?: Record<string, string[]> } | undefined)?.fields;
  const fieldErrors = fields ? byField(fields) : undefined;
  return { message: fieldErrors && e.status === 422 ? undefined : e.message, fieldErrors };
}
