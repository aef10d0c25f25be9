// The one route wrapper. Every app/api handler is `export const POST = route({...}, handler)`:
// authentication, the cross-site check on writes, body limits, JSON and zod parsing,
// Idempotency-Key replay and the error shape all happen here, the same way for every endpoint.
import "server-only";
import { NextResponse, type NextRequest } from "next/server";
import type { z } from "zod";
import type { CurrentUser } from "../auth/current-user";
import { isHttps, serializeCookie, sessionCookie, SESSION_COOKIE, validateSession } from "../auth/session";
import { claimIdempotencyKey, releaseIdempotencyKey, requestHash, storeIdempotentResponse } from "../data/idempotency";
import {
  AppError, badRequest, errorBody, fieldErrors, forbidden, notFound, payloadTooLarge, unauthenticated, unsupportedMediaType, validation,
} from "./errors";

export const DEFAULT_MAX_BODY_BYTES = 256 * 1024;

type Params = Record<string, string | string[] | undefined>;

interface Options<S extends z.ZodType | undefined, A extends boolean> {
  /** false: reachable without a session (sign-in, invitation, reset). Default true. */
  auth?: A;
  /** zod schema for the JSON body; without one the body is ignored. */
  body?: S;
  /** Honour an Idempotency-Key header (posting endpoints). */
  idempotent?: boolean;
  maxBodyBytes?: number;
}

export interface RouteContext<B, U> {
  req: NextRequest;
  params: Params;
  body: B;
  user: U;
}

/** A handler's answer when it needs a status other than 200 or extra cookies. */
export class Reply {
  constructor(
    readonly status: number,
    readonly body: unknown,
    readonly cookies: string[] = [],
  ) {}
}

const WRITE_METHODS = new Set(["POST", "PUT", "PATCH", "DELETE"]);

function assertSameSite(req: NextRequest) {
  const origin = req.headers.get("origin");
  if (!origin) return; // non-browser clients send none
  let originHost: string;
  try {
    originHost = new URL(origin).host;
  } catch {
    throw forbidden("Cross-site request refused.");
  }
  const host = req.headers.get("x-forwarded-host") ?? req.headers.get("host");
  if (originHost !== host) throw forbidden("Cross-site request refused.");
}

async function readBody(req: NextRequest, limit: number): Promise<string> {
  const declared = Number(req.headers.get("content-length") ?? "0");
  if (declared > limit) throw payloadTooLarge(limit);
  if (!req.body) return "";
  const reader = req.body.getReader();
  const chunks: Uint8Array[] = [];
  let size = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    size += value.byteLength;
    if (size > limit) {
      await reader.cancel();
      throw payloadTooLarge(limit);
    }
    chunks.push(value);
  }
  return Buffer.concat(chunks).toString("utf8");
}

function parseJson(text: string): unknown {
  try {
    return JSON.parse(text === "" ? "{}" : text);
  } catch {
    throw badRequest();
  }
}

export function json(body: unknown, status = 200, cookies: string[] = []): NextResponse {
  const res = NextResponse.json(body, { status });
  for (const c of cookies) res.headers.append("set-cookie", c);
  return res;
}

function errorResponse(e: unknown, req: NextRequest): NextResponse {
  if (e instanceof AppError) {
    const res = json(errorBody(e), e.status);
    const retry = (e.details as { retryAfterSeconds?: number } | undefined)?.retryAfterSeconds;
    if (e.status === 429 && retry) res.headers.set("retry-after", String(retry));
    return res;
  }
  console.error(`[api] ${req.method} ${req.nextUrl.pathname} failed:`, e);
  return json({ error: { code: "INTERNAL", message: "Something went wrong on our side. Try again; if it keeps failing, tell your admin." } }, 500);
}

export function route<S extends z.ZodType | undefined = undefined, A extends boolean = true>(
  options: Options<S, A>,
  handler: (ctx: RouteContext<S extends z.ZodType ? z.infer<S> : undefined, A extends false ? CurrentUser | null : CurrentUser>) => Promise<unknown>,
) {
  return async (req: NextRequest, segment: { params: Promise<Params> }): Promise<NextResponse> => {
    const cookies: string[] = [];
    let idemScope: Parameters<typeof storeIdempotentResponse>[0] | null = null;
    try {
      if (WRITE_METHODS.has(req.method)) assertSameSite(req);

      let user: CurrentUser | null = null;
      const sessionId = req.cookies.get(SESSION_COOKIE)?.value;
      if (sessionId) {
        const result = await validateSession(sessionId);
        if (result) {
          user = result.user;
          if (result.refreshed) cookies.push(serializeCookie(sessionCookie(result.session, isHttps(req.headers, req.url))));
        }
      }
      if (options.auth !== false && !user) throw unauthenticated();

      let body: unknown = undefined;
      let raw = "";
      if (options.body) {
        const type = req.headers.get("content-type") ?? "";
        if (!type.toLowerCase().startsWith("application/json")) throw unsupportedMediaType();
        raw = await readBody(req, options.maxBodyBytes ?? DEFAULT_MAX_BODY_BYTES);
        const parsed = options.body.safeParse(parseJson(raw));
        if (!parsed.success) throw validation(fieldErrors(parsed.error));
        body = parsed.data;
      }

      const key = req.headers.get("idempotency-key");
      if (options.idempotent && key && user) {
        if (key.length > 200) throw validation({ "Idempotency-Key": ["At most 200 characters."] });
        idemScope = { companyId: user.companyId, userId: user.id, endpoint: `${req.method} ${req.nextUrl.pathname}`, key };
        const replay = await claimIdempotencyKey(idemScope, requestHash(raw));
        if (replay) {
          idemScope = null;
          return json(replay.body, replay.status, cookies);
        }
      }

      const result = await handler({
        req,
        params: await segment.params,
        body: body as never,
        user: user as never,
      });
      if (result instanceof Response) {
        // a finished response (a CSV download): passed through as it is
        for (const c of cookies) result.headers.append("set-cookie", c);
        return result as NextResponse;
      }
      const reply = result instanceof Reply ? result : new Reply(200, result ?? { ok: true });
      if (idemScope) await storeIdempotentResponse(idemScope, { status: reply.status, body: reply.body });
      return json(reply.body, reply.status, [...cookies, ...reply.cookies]);
    } catch (e) {
      if (idemScope) {
        if (e instanceof AppError && e.status < 500) await storeIdempotentResponse(idemScope, { status: e.status, body: errorBody(e) });
        else await releaseIdempotencyKey(idemScope).catch(() => {});
      }
      return errorResponse(e, req);
    }
  };
}

/** The [id] segment that may also be a code or SKU (items, recipes); the data layer resolves it. */
export function refParam(params: Params, what: string): string {
  const ref = params.id;
  if (typeof ref !== "string" || ref.length === 0 || ref.length > 100) throw notFound(what);
  return ref;
}

/** The [id] segment as a uuid; anything else cannot name a record, so it is 404 like a missing one. */
export function idParam(params: Params, what: string): string {
  const id = params.id;
  if (typeof id !== "string" || !/^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i.test(id)) throw notFound(what);
  return id;
}
