// The OpenAPI 3.1 document of app/api, generated from the same zod schemas the routes parse with
// (lib/validation/*) and the response schemas in lib/validation/responses.ts. Served at
// GET /api/openapi.json and rendered for admins at /settings/api.
//
// The route files are not touched: request schemas are documented through clones named with
// zod's own `.meta({ id })`, so zod is not extended and the originals stay exactly as parsed.
// What the route wrapper adds to every endpoint (401 without a session, 403 cross-site, 413/415/
// 400/422 around the body, Idempotency-Key) is derived here from each entry's flags, which
// tests/unit/openapi.test.ts checks against the `route({...})` options in each route file.
import "server-only";
import {
  OpenAPIRegistry,
  OpenApiGeneratorV31,
  type ResponseConfig,
  type RouteConfig,
} from "@asteasolutions/zod-to-openapi";
import { z } from "zod";
import type { meBody } from "../../app/api/me/me-body";
import { SESSION_COOKIE } from "../auth/session";
import type { CapturedMail } from "../data/captured-mail";
import type { Company } from "../data/companies";
import type { InvitationSummary } from "../data/invitations";
import type { Kitchen } from "../data/kitchens";
import type { UserSummary } from "../data/users";
import { invitationAcceptInput, passwordResetConfirmInput, passwordResetRequestInput, signInInput } from "../validation/auth";
import { companyUpdateInput, invitationCreateInput, kitchenCreateInput, kitchenUpdateInput, userUpdateInput } from "../validation/company";
import {
  capturedMailListResponse, companyResponse, errorResponse, invitationListResponse, invitationSummaryResponse, kitchenListResponse,
  kitchenResponse, meResponse, okMessageResponse, okResponse, openApiDocumentResponse, signInResponse, userListResponse,
  userSummaryResponse, validationErrorResponse,
} from "../validation/responses";
import { DEFAULT_MAX_BODY_BYTES } from "./route";

export const OPENAPI_VERSION = "3.1.0";
export const API_VERSION = "0.1.0";
export const SECURITY_SCHEME = "session";

// ---------------------------------------------------------------------------------------------
// Response schemas must stay what the routes return: a drift fails `tsc`, not a client.
type Same<A, B> = [A] extends [B] ? ([B] extends [A] ? true : false) : false;
type Assert<T extends true> = T;
export type ResponseShapesMatch = [
  Assert<Same<z.infer<typeof kitchenResponse>, Kitchen>>,
  Assert<Same<z.infer<typeof companyResponse>, Company>>,
  Assert<Same<z.infer<typeof userSummaryResponse>, UserSummary>>,
  Assert<Same<z.infer<typeof invitationSummaryResponse>, InvitationSummary>>,
  Assert<Same<z.infer<typeof capturedMailListResponse>, CapturedMail[]>>,
  Assert<Same<z.infer<typeof meResponse>, ReturnType<typeof meBody>>>,
];

// ---------------------------------------------------------------------------------------------
// Request bodies: named clones of the routes' own schemas, with notes a reader needs.

type FieldNotes = Record<string, { description?: string; format?: string; example?: unknown }>;

/**
 * A clone of `schema` registered as a component, each noted field wrapped with its note. The
 * clone keeps the original's checks (refinements included); the original is never modified.
 */
function requestBody(refId: string, schema: z.ZodObject, notes: FieldNotes = {}): z.ZodType {
  const def = schema._zod.def;
  const shape: Record<string, z.ZodType> = { ...def.shape };
  for (const [key, note] of Object.entries(notes)) {
    const field = shape[key];
    if (!field) throw new Error(`OpenAPI notes name ${refId}.${key}, which the schema does not have.`);
    shape[key] = field.meta(note);
  }
  return schema.clone({ ...def, shape } as typeof def).meta({ id: refId });
}

const EMAIL = { format: "email", description: "Trimmed and lower-cased.", example: "cook@example.com" };
const TIME_ZONE = { description: "An IANA time zone name.", example: "Europe/Vienna" };
const LINK_TOKEN = { description: "The token from the e-mailed link." };
const KITCHEN_IDS = { description: "Kitchens of your company (a kitchen lead acts only in these)." };

const bodies = {
  signIn: requestBody("SignInInput", signInInput, { email: EMAIL }),
  passwordResetRequest: requestBody("PasswordResetRequestInput", passwordResetRequestInput, { email: EMAIL }),
  passwordResetConfirm: requestBody("PasswordResetConfirmInput", passwordResetConfirmInput, { token: LINK_TOKEN }),
  invitationAccept: requestBody("InvitationAcceptInput", invitationAcceptInput, {
    token: LINK_TOKEN,
    name: { description: "Overrides the name the admin typed in the invitation." },
  }),
  companyUpdate: requestBody("CompanyUpdateInput", companyUpdateInput, {
    timeZone: TIME_ZONE,
    currency: { description: "ISO 4217 code, upper-cased.", example: "EUR" },
  }),
  kitchenCreate: requestBody("KitchenCreateInput", kitchenCreateInput, {
    code: { description: "Unique in the company; upper-cased.", example: "NORTH-1" },
    timeZone: { ...TIME_ZONE, description: "An IANA time zone name; null: the company's." },
  }),
  kitchenUpdate: requestBody("KitchenUpdateInput", kitchenUpdateInput, {
    code: { description: "Unique in the company; upper-cased.", example: "NORTH-1" },
    timeZone: { ...TIME_ZONE, description: "An IANA time zone name; null: the company's." },
    archived: { description: "true hides the kitchen from pickers; false brings it back." },
  }),
  invitationCreate: requestBody("InvitationCreateInput", invitationCreateInput, {
    email: EMAIL,
    kitchenIds: { description: "Kitchens of your company; a kitchen lead needs at least one." },
  }),
  userUpdate: requestBody("UserUpdateInput", userUpdateInput, {
    kitchenIds: { ...KITCHEN_IDS, description: "Replaces the user's kitchens. Kitchens of your company; a kitchen lead needs at least one." },
    disabled: { description: "true signs the user out everywhere and refuses sign-in." },
  }),
};

// ---------------------------------------------------------------------------------------------
// Errors: what the wrapper adds, plus what each endpoint's data layer can throw.

type ErrorStatus = 400 | 401 | 403 | 404 | 409 | 413 | 415 | 422 | 429 | 500;
/** [code, when it happens] */
type Cause = readonly [code: string, when: string];

const WRAPPER = {
  badJson: ["BAD_REQUEST", "The body is not valid JSON."],
  unauthenticated: ["UNAUTHENTICATED", "No valid session: the hl_session cookie is missing or expired, or the account is disabled."],
  crossSite: ["FORBIDDEN", "Sent from a browser on another site: the Origin header names another host."],
  tooLarge: ["PAYLOAD_TOO_LARGE", `The body is larger than ${DEFAULT_MAX_BODY_BYTES} bytes.`],
  mediaType: ["UNSUPPORTED_MEDIA_TYPE", "The body is not sent as application/json."],
  invalid: ["VALIDATION", "A field is missing or not valid (a JSON number where a decimal string is expected, too); details.fields names every bad field."],
  keyInvalid: ["VALIDATION", "The Idempotency-Key is longer than 200 characters, or was used before with a different body."],
  keyBusy: ["CONFLICT", "The first request with this Idempotency-Key is still being processed: retry shortly with the same key."],
  internal: ["INTERNAL", "Our side failed; the message never carries internals. Try again later."],
  internalKeyed: ["INTERNAL", "Our side failed; the Idempotency-Key is released, so a retry with the same key runs the request again."],
} as const satisfies Record<string, Cause>;

const STATUS_TITLES: Record<ErrorStatus, string> = {
  400: "Bad request",
  401: "Not signed in",
  403: "Forbidden",
  404: "Not found",
  409: "Conflict",
  413: "Payload too large",
  415: "Unsupported media type",
  422: "Validation failed",
  429: "Rate limited",
  500: "Internal error",
};

const ADMIN_ONLY = (what: string): Cause => ["FORBIDDEN", `Your role may not ${what} (admins only).`];

// ---------------------------------------------------------------------------------------------
// The endpoints. One entry per exported handler in app/api/**/route.ts.

type Method = "get" | "post" | "patch" | "delete";

export interface EndpointDoc {
  method: Method;
  /** OpenAPI form: /api/kitchens/{id} for app/api/kitchens/[id]/route.ts */
  path: string;
  operationId: string;
  tag: TagName;
  summary: string;
  description: string;
  /** false: reachable without a session (the route's `auth: false`). */
  auth: boolean;
  body?: z.ZodType;
  idempotent?: boolean;
  params?: z.ZodObject;
  query?: z.ZodObject;
  success: { status: 200 | 201 | 202; description: string; schema: z.ZodType; setsCookie?: string };
  /** What the endpoint itself (its data-layer calls) can answer, beyond the wrapper's errors. */
  errors?: Partial<Record<ErrorStatus, Cause[]>>;
}

export const TAGS = [
  { name: "Auth", description: "Signing in and out, password resets. Reachable without a session." },
  { name: "Account", description: "The signed-in user." },
  { name: "Company", description: "The company every record belongs to." },
  { name: "Kitchens", description: "The company's kitchens: where stock lives and who may act where." },
  { name: "Users", description: "People in the company, their roles and kitchens. Admins only." },
  { name: "Invitations", description: "Single-use e-mailed links that create accounts." },
  { name: "Mail catcher", description: "Local development only: e-mail caught instead of sent." },
  { name: "Reference", description: "This document." },
] as const;
type TagName = (typeof TAGS)[number]["name"];

const idParam = (what: string) =>
  z.object({
    id: z.uuid().meta({ description: `The ${what}'s id. An id that is not a UUID, or not in your company, answers 404.` }),
  });

const sessionCookieNote = (what: string) => `The ${SESSION_COOKIE} cookie (HttpOnly, SameSite=Lax, Path=/; Secure over HTTPS) ${what}.`;

export const ENDPOINTS: readonly EndpointDoc[] = [
  // Auth ----------------------------------------------------------------------------------
  {
    method: "post", path: "/api/auth/sign-in", operationId: "signIn", tag: "Auth", auth: false,
    summary: "Sign in",
    description: "Checks the e-mail and password and starts a 30-day session (extended while in use). Repeated failures for one e-mail are slowed down.",
    body: bodies.signIn,
    success: { status: 200, description: "Signed in: the user, and the session cookie.", schema: signInResponse, setsCookie: sessionCookieNote("carrying the new session") },
    errors: {
      401: [["UNAUTHENTICATED", "The e-mail or password is wrong (the same answer for an unknown e-mail or a disabled account)."]],
      429: [["RATE_LIMITED", "Too many failed sign-ins for this e-mail; details.retryAfterSeconds and Retry-After say when to try again."]],
    },
  },
  {
    method: "post", path: "/api/auth/sign-out", operationId: "signOut", tag: "Auth", auth: false,
    summary: "Sign out",
    description: "Ends the current session, if any, and clears the cookie. Safe to call when already signed out.",
    success: { status: 200, description: "Signed out.", schema: okResponse, setsCookie: sessionCookieNote("emptied, Max-Age=0") },
  },
  {
    method: "post", path: "/api/auth/password-reset", operationId: "requestPasswordReset", tag: "Auth", auth: false,
    summary: "Ask for a password reset link",
    description: "E-mails a reset link, valid for one hour, to an active account with this address. The answer is the same whether or not the address is known.",
    body: bodies.passwordResetRequest,
    success: { status: 202, description: "Accepted; a link is on its way if the account exists.", schema: okMessageResponse },
  },
  {
    method: "post", path: "/api/auth/password-reset/confirm", operationId: "confirmPasswordReset", tag: "Auth", auth: false,
    summary: "Set a new password from a reset link",
    description: "Sets the password, spends the link and signs the account out everywhere. Sign in again afterwards.",
    body: bodies.passwordResetConfirm,
    success: { status: 200, description: "Password changed.", schema: okResponse },
    errors: {
      404: [["NOT_FOUND", "No such reset link."]],
      409: [["RESET_USED", "The link has already been used."], ["RESET_EXPIRED", "The link is older than one hour."]],
    },
  },
  // Account -------------------------------------------------------------------------------
  {
    method: "get", path: "/api/me", operationId: "getMe", tag: "Account", auth: true,
    summary: "The signed-in user",
    description: "Who is signed in: role, company and the kitchens the user acts in.",
    success: { status: 200, description: "The user.", schema: meResponse },
  },
  // Company -------------------------------------------------------------------------------
  {
    method: "get", path: "/api/company", operationId: "getCompany", tag: "Company", auth: true,
    summary: "Your company",
    description: "Name, default time zone and currency of the signed-in user's company.",
    success: { status: 200, description: "The company.", schema: companyResponse },
  },
  {
    method: "patch", path: "/api/company", operationId: "updateCompany", tag: "Company", auth: true,
    summary: "Change the company",
    description: "Replaces the company's name, default time zone and currency (all three are required).",
    body: bodies.companyUpdate,
    success: { status: 200, description: "The company as saved.", schema: companyResponse },
    errors: { 403: [ADMIN_ONLY("manage the company")] },
  },
  // Kitchens ------------------------------------------------------------------------------
  {
    method: "get", path: "/api/kitchens", operationId: "listKitchens", tag: "Kitchens", auth: true,
    summary: "List kitchens",
    description: "Every kitchen of the company, by code. Everyone may read them (availability is shown across kitchens).",
    query: z.object({
      archived: z.enum(["true", "false"]).optional().meta({ description: "true includes archived kitchens." }),
    }),
    success: { status: 200, description: "The kitchens.", schema: kitchenListResponse },
  },
  {
    method: "post", path: "/api/kitchens", operationId: "createKitchen", tag: "Kitchens", auth: true, idempotent: true,
    summary: "Create a kitchen",
    description: "Adds a kitchen to the company. Send an Idempotency-Key so a retried request cannot create it twice.",
    body: bodies.kitchenCreate,
    success: { status: 201, description: "The new kitchen.", schema: kitchenResponse },
    errors: {
      403: [ADMIN_ONLY("manage kitchens")],
      409: [["CONFLICT", "A kitchen with this code already exists (details.fields.code)."]],
    },
  },
  {
    method: "get", path: "/api/kitchens/{id}", operationId: "getKitchen", tag: "Kitchens", auth: true,
    summary: "One kitchen",
    description: "A kitchen of your company.",
    params: idParam("kitchen"),
    success: { status: 200, description: "The kitchen.", schema: kitchenResponse },
    errors: { 404: [["NOT_FOUND", "No such kitchen in your company (another company's kitchen is 404 too)."]] },
  },
  {
    method: "patch", path: "/api/kitchens/{id}", operationId: "updateKitchen", tag: "Kitchens", auth: true,
    summary: "Change or archive a kitchen",
    description: "Changes only the fields sent. Archiving keeps the kitchen's history and hides it from pickers.",
    params: idParam("kitchen"),
    body: bodies.kitchenUpdate,
    success: { status: 200, description: "The kitchen as saved.", schema: kitchenResponse },
    errors: {
      403: [ADMIN_ONLY("manage kitchens")],
      404: [["NOT_FOUND", "No such kitchen in your company."]],
      409: [["CONFLICT", "Another kitchen already has this code (details.fields.code)."]],
    },
  },
  // Users ---------------------------------------------------------------------------------
  {
    method: "get", path: "/api/users", operationId: "listUsers", tag: "Users", auth: true,
    summary: "List users",
    description: "Everyone in the company, by name, with their kitchens.",
    success: { status: 200, description: "The users.", schema: userListResponse },
    errors: { 403: [ADMIN_ONLY("manage users")] },
  },
  {
    method: "get", path: "/api/users/{id}", operationId: "getUser", tag: "Users", auth: true,
    summary: "One user",
    description: "A user of your company.",
    params: idParam("user"),
    success: { status: 200, description: "The user.", schema: userSummaryResponse },
    errors: { 403: [ADMIN_ONLY("manage users")], 404: [["NOT_FOUND", "No such user in your company."]] },
  },
  {
    method: "patch", path: "/api/users/{id}", operationId: "updateUser", tag: "Users", auth: true,
    summary: "Change a user's role, kitchens or access",
    description: "Changes only the fields sent. Disabling signs the user out everywhere. A company always keeps at least one active admin.",
    params: idParam("user"),
    body: bodies.userUpdate,
    success: { status: 200, description: "The user as saved.", schema: userSummaryResponse },
    errors: {
      403: [ADMIN_ONLY("manage users")],
      404: [["NOT_FOUND", "No such user in your company."]],
      409: [
        ["CONFLICT", "You tried to remove your own admin role or disable yourself: ask another admin."],
        ["CONFLICT", "The change would leave the company without an active admin."],
      ],
      422: [
        ["VALIDATION", "A kitchenIds entry is not a kitchen of your company (details.fields[\"kitchenIds.N\"])."],
        ["VALIDATION", "A kitchen lead would be left without a kitchen (details.fields.kitchenIds)."],
      ],
    },
  },
  // Invitations ---------------------------------------------------------------------------
  {
    method: "get", path: "/api/invitations", operationId: "listInvitations", tag: "Invitations", auth: true,
    summary: "List invitations",
    description: "The company's invitations, newest first, with their status.",
    success: { status: 200, description: "The invitations.", schema: invitationListResponse },
    errors: { 403: [ADMIN_ONLY("manage users and invitations")] },
  },
  {
    method: "post", path: "/api/invitations", operationId: "createInvitation", tag: "Invitations", auth: true, idempotent: true,
    summary: "Invite someone",
    description: "E-mails a single-use link, valid for 7 days, that creates the account with this role and these kitchens. An open invitation to the same address is withdrawn. Send an Idempotency-Key so a retried request cannot send two links.",
    body: bodies.invitationCreate,
    success: { status: 201, description: "The new invitation.", schema: invitationSummaryResponse },
    errors: {
      403: [ADMIN_ONLY("manage users and invitations")],
      409: [["CONFLICT", "This e-mail already has a Hank & Lot account (details.fields.email)."]],
      422: [["VALIDATION", "A kitchenIds entry is not a kitchen of your company (details.fields[\"kitchenIds.N\"])."]],
    },
  },
  {
    method: "delete", path: "/api/invitations/{id}", operationId: "revokeInvitation", tag: "Invitations", auth: true,
    summary: "Withdraw an invitation",
    description: "The link stops working. Withdrawing twice is harmless.",
    params: idParam("invitation"),
    success: { status: 200, description: "The invitation, now revoked (or as it was, if already used).", schema: invitationSummaryResponse },
    errors: { 403: [ADMIN_ONLY("manage users and invitations")], 404: [["NOT_FOUND", "No such invitation in your company."]] },
  },
  {
    method: "post", path: "/api/invitations/accept", operationId: "acceptInvitation", tag: "Invitations", auth: false,
    summary: "Accept an invitation",
    description: "Creates the account from the link's token and signs the new user in.",
    body: bodies.invitationAccept,
    success: { status: 201, description: "Account created and signed in.", schema: okResponse, setsCookie: sessionCookieNote("carrying the new session") },
    errors: {
      404: [["NOT_FOUND", "No such invitation link."]],
      409: [
        ["INVITATION_USED", "The link has already been used."],
        ["INVITATION_REVOKED", "The invitation was withdrawn."],
        ["INVITATION_EXPIRED", "The link is older than 7 days."],
        ["CONFLICT", "The e-mail already has an account: sign in instead."],
      ],
    },
  },
  // Mail catcher --------------------------------------------------------------------------
  {
    method: "get", path: "/api/mail/captured", operationId: "listCapturedMail", tag: "Mail catcher", auth: true,
    summary: "Caught e-mail",
    description: "While the local mail catcher stands in for a mail server: the messages sent to your company's users and invitees.",
    success: { status: 200, description: "The messages.", schema: capturedMailListResponse },
    errors: {
      403: [ADMIN_ONLY("read caught mail")],
      404: [["NOT_FOUND", "The local mail catcher is not in use."]],
    },
  },
  // Reference -----------------------------------------------------------------------------
  {
    method: "get", path: "/api/openapi.json", operationId: "getOpenApiDocument", tag: "Reference", auth: true,
    summary: "This OpenAPI document",
    description: "The machine-readable reference of every endpoint, for any signed-in user.",
    success: { status: 200, description: "The document.", schema: openApiDocumentResponse },
  },
];

// ---------------------------------------------------------------------------------------------

function errorCauses(ep: EndpointDoc): Map<ErrorStatus, Cause[]> {
  const out = new Map<ErrorStatus, Cause[]>();
  const add = (status: ErrorStatus, ...causes: Cause[]) => out.set(status, [...(out.get(status) ?? []), ...causes]);
  if (ep.body) add(400, WRAPPER.badJson);
  if (ep.auth) add(401, WRAPPER.unauthenticated);
  for (const [status, causes] of Object.entries(ep.errors ?? {})) add(Number(status) as ErrorStatus, ...causes);
  if (ep.method !== "get") add(403, WRAPPER.crossSite);
  if (ep.idempotent) add(409, WRAPPER.keyBusy);
  if (ep.body) {
    add(413, WRAPPER.tooLarge);
    add(415, WRAPPER.mediaType);
    add(422, WRAPPER.invalid);
  }
  if (ep.idempotent) add(422, WRAPPER.keyInvalid);
  add(500, ep.idempotent ? WRAPPER.internalKeyed : WRAPPER.internal);
  return new Map([...out].sort(([a], [b]) => a - b));
}

function errorResponseConfig(status: ErrorStatus, causes: Cause[]): ResponseConfig {
  const lines = causes.map(([code, when]) => `- \`${code}\`: ${when}`);
  return {
    description: `${STATUS_TITLES[status]}.\n\n${lines.join("\n")}`,
    ...(status === 429
      ? { headers: { "Retry-After": { description: "Seconds to wait before trying again.", schema: { type: "integer" } } } }
      : {}),
    content: { "application/json": { schema: status === 422 ? validationErrorResponse : errorResponse } },
  };
}

const IDEMPOTENCY_HEADER = z.object({
  "Idempotency-Key": z
    .string()
    .min(1)
    .max(200)
    .optional()
    .meta({
      description: "A unique string per user action (a UUID is fine). A retry with the same key and body replays the first answer; keys are kept at least 24 hours.",
      example: "4d5e7c1a-2b1f-4c0e-9a57-0f3e8f9b6a21",
    }),
});

function buildRegistry(): OpenAPIRegistry {
  const registry = new OpenAPIRegistry();
  registry.registerComponent("securitySchemes", SECURITY_SCHEME, {
    type: "apiKey",
    in: "cookie",
    name: SESSION_COOKIE,
    description: "The session cookie set by POST /api/auth/sign-in (or by accepting an invitation).",
  });
  for (const ep of ENDPOINTS) {
    const responses: RouteConfig["responses"] = {
      [ep.success.status]: {
        description: ep.success.description,
        ...(ep.success.setsCookie
          ? { headers: { "Set-Cookie": { description: ep.success.setsCookie, schema: { type: "string" } } } }
          : {}),
        content: { "application/json": { schema: ep.success.schema } },
      },
    };
    for (const [status, causes] of errorCauses(ep)) responses[status] = errorResponseConfig(status, causes);
    registry.registerPath({
      method: ep.method,
      path: ep.path,
      operationId: ep.operationId,
      tags: [ep.tag],
      summary: ep.summary,
      description: ep.description,
      security: ep.auth ? [{ [SECURITY_SCHEME]: [] }] : [],
      request: {
        ...(ep.params ? { params: ep.params } : {}),
        ...(ep.query ? { query: ep.query } : {}),
        ...(ep.idempotent ? { headers: IDEMPOTENCY_HEADER } : {}),
        ...(ep.body ? { body: { required: true, content: { "application/json": { schema: ep.body } } } } : {}),
      },
      responses,
    });
  }
  return registry;
}

const registry = buildRegistry();

const DESCRIPTION = `JSON API of Hank & Lot: the company, its kitchens, users and invitations. Every endpoint lives under \`/api\` on the same host as the app.

## Conventions

- **Sessions.** \`POST /api/auth/sign-in\` sets the \`${SESSION_COOKIE}\` cookie (HttpOnly, SameSite=Lax); every endpoint not marked public needs it. Sessions last 30 days and are extended while in use: any answer may carry a refreshed Set-Cookie.
- **Exact quantities.** Quantities and money travel as decimal strings such as \`"12.5"\`: no exponent, at most the field's stated number of decimals. JSON numbers are refused with 422 VALIDATION, because most clients pass them through binary floating point. Answers carry decimal strings too.
- **Bodies.** \`Content-Type: application/json\`, at most ${DEFAULT_MAX_BODY_BYTES / 1024} KiB. Text fields are trimmed (passwords are kept as typed); e-mail addresses are lower-cased and codes upper-cased before they are stored.
- **Errors.** Every error is \`{"error": {"code", "message", "details"?}}\` with a fixed status per kind: 400 BAD_REQUEST (not JSON), 401 UNAUTHENTICATED, 403 FORBIDDEN, 404 NOT_FOUND, 409 CONFLICT or a domain code such as INVITATION_EXPIRED, 413 PAYLOAD_TOO_LARGE, 415 UNSUPPORTED_MEDIA_TYPE, 422 VALIDATION with \`details.fields\` (\`{"path": ["message", ...]}\`, every bad field named), 429 RATE_LIMITED with Retry-After, 500 INTERNAL. Branch on \`code\`; \`message\` is for people.
- **Idempotency keys.** Creating endpoints marked so take an \`Idempotency-Key\` header (at most 200 characters, e.g. a UUID per user action). A retry with the same key and the same body gets the first answer again, same status and body, without doing the work twice; keys are kept at least 24 hours, per user and endpoint. The same key with another body is 422; while the first request is still running, 409.
- **Same-site writes.** A POST, PATCH or DELETE whose \`Origin\` header names another host is refused with 403. Clients outside a browser send no Origin and are not affected.
- **Tenancy.** Every record belongs to one company. Another company's record answers 404, exactly as if it did not exist. A record of your own company that your role may not act on, such as a kitchen outside a kitchen lead's own, answers 403.`;

/** The whole document, generated afresh (callers may keep or change it). */
export function buildOpenApiDocument() {
  return new OpenApiGeneratorV31(registry.definitions).generateDocument({
    openapi: OPENAPI_VERSION,
    info: { title: "Hank & Lot API", version: API_VERSION, description: DESCRIPTION },
    servers: [{ url: "/", description: "The app's own host." }],
    tags: TAGS.map((t) => ({ ...t })),
    security: [{ [SECURITY_SCHEME]: [] }],
  });
}

export type OpenApiDocument = ReturnType<typeof buildOpenApiDocument>;
