// Response shapes of the JSON API, as zod schemas: what app/api/** actually returns (lib/data's
// Kitchen, UserSummary, InvitationSummary, Company, CapturedMail and app/api/me/me-body.ts).
// They feed the OpenAPI document (lib/http/openapi.ts, which checks them against those types at
// compile time) and can check a real response in a test. Plain zod: `.meta({ id })` names a
// component for the document without extending zod, so nothing here changes other schemas.
import { z } from "zod";
import { ROLES } from "../../db/types";

const id = z.uuid();
const timestamp = z.iso.datetime({ offset: true }).meta({ description: "ISO 8601 timestamp in UTC, e.g. 2026-12-02T09:30:00.000Z." });
const role = z.enum(ROLES);

export const errorDetails = z
  .object({
    fields: z
      .record(z.string(), z.array(z.string()))
      .optional()
      .meta({ description: 'Messages per field, keyed by dotted path ("kitchenIds.0"); "_" for the body as a whole.' }),
    retryAfterSeconds: z.number().int().positive().optional().meta({ description: "With RATE_LIMITED: seconds to wait (also sent as Retry-After)." }),
  })
  .meta({ id: "ErrorDetails", description: "Present only when the code has more to say." });

export const errorResponse = z
  .object({
    error: z.object({
      code: z.string().meta({ description: "Stable machine-readable code, e.g. NOT_FOUND, VALIDATION, INVITATION_EXPIRED.", example: "NOT_FOUND" }),
      message: z.string().meta({ description: "A sentence for people; may change, never parse it.", example: "Kitchen not found." }),
      details: errorDetails.optional(),
    }),
  })
  .meta({ id: "Error", description: "The one error shape of every endpoint." });

export const validationErrorResponse = z
  .object({
    error: z.object({
      code: z.literal("VALIDATION"),
      message: z.string().meta({ example: "Some fields are not valid." }),
      details: z.object({
        fields: z
          .record(z.string(), z.array(z.string()))
          .meta({ description: "Every bad field with its messages, keyed by dotted path.", example: { code: ["Use 1 to 12 letters, digits or dashes, e.g. NORTH-1."] } }),
      }),
    }),
  })
  .meta({ id: "ValidationError", description: "422: every bad field is named, not just the first." });

export const okResponse = z.object({ ok: z.literal(true) }).meta({ id: "Ok" });

export const okMessageResponse = z
  .object({ ok: z.literal(true), message: z.string() })
  .meta({ id: "OkMessage" });

export const kitchenRefResponse = z
  .object({ id, code: z.string().meta({ example: "NORTH-1" }), name: z.string() })
  .meta({ id: "KitchenRef", description: "A kitchen named in another record." });

export const kitchenResponse = z
  .object({
    id,
    code: z.string().meta({ example: "NORTH-1" }),
    name: z.string(),
    address: z.string(),
    timeZone: z.string().nullable().meta({ description: "IANA time zone; null: the company's." }),
    archived: z.boolean(),
  })
  .meta({ id: "Kitchen" });

export const kitchenListResponse = z.object({ kitchens: z.array(kitchenResponse) }).meta({ id: "KitchenList" });

export const companyResponse = z
  .object({
    id,
    name: z.string(),
    timeZone: z.string().meta({ description: "IANA time zone, e.g. Europe/Vienna." }),
    currency: z.string().meta({ description: "ISO 4217 code.", example: "EUR" }),
  })
  .meta({ id: "Company" });

export const meResponse = z
  .object({
    id,
    email: z.string(),
    name: z.string(),
    role,
    company: z.object({ id, name: z.string() }),
    kitchens: z.array(kitchenRefResponse).meta({ description: "Kitchens the user acts in: a kitchen lead's own, everyone else's every open kitchen." }),
  })
  .meta({ id: "Me", description: "The signed-in user." });

export const signInResponse = z.object({ user: meResponse }).meta({ id: "SignInResult" });

export const userSummaryResponse = z
  .object({
    id,
    email: z.string(),
    name: z.string(),
    role,
    timeZone: z.string().nullable().meta({ description: "The user's own IANA time zone; null: the company's." }),
    disabled: z.boolean(),
    kitchens: z.array(kitchenRefResponse).meta({ description: "Assigned kitchens (what a kitchen lead may act in)." }),
    createdAt: timestamp,
  })
  .meta({ id: "UserSummary" });

export const userListResponse = z.object({ users: z.array(userSummaryResponse) }).meta({ id: "UserList" });

export const invitationSummaryResponse = z
  .object({
    id,
    email: z.string(),
    name: z.string(),
    role,
    kitchenIds: z.array(id),
    status: z.enum(["pending", "accepted", "revoked", "expired"]),
    expiresAt: timestamp,
    createdAt: timestamp,
  })
  .meta({ id: "InvitationSummary" });

export const invitationListResponse = z
  .object({ invitations: z.array(invitationSummaryResponse).meta({ description: "Newest first, at most 200." }) })
  .meta({ id: "InvitationList" });

export const capturedMailResponse = z
  .object({
    id: z.string().meta({ description: "The catcher's file name without .json." }),
    to: z.array(z.string()),
    subject: z.string(),
    receivedAt: timestamp,
    text: z.string(),
  })
  .meta({ id: "CapturedMail" });

export const capturedMailListResponse = z
  .array(capturedMailResponse)
  .meta({ id: "CapturedMailList", description: "Newest first, at most 200." });

export const openApiDocumentResponse = z
  .looseObject({
    openapi: z.string().meta({ example: "3.1.0" }),
    info: z.looseObject({ title: z.string(), version: z.string() }),
    paths: z.record(z.string(), z.unknown()),
  })
  .meta({ id: "OpenApiDocument", description: "This document (OpenAPI 3.1)." });
