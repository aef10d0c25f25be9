// Calls app/api route handlers directly with a real NextRequest: the whole route wrapper runs
// (session cookie, origin check, body limits, JSON and zod parsing, idempotency, error mapping)
// without starting a server.
// env: APP_URL (set by db/test.sh; the host the requests are addressed to)
import { NextRequest } from "next/server";

type Handler = (req: NextRequest, segment: { params: Promise<Record<string, string>> }) => Promise<Response>;

export interface CallOptions {
  method?: string;
  /** The request path, e.g. "/api/invitations" (the wrapper keys idempotency by it). */
  path: string;
  /** Sent as JSON (with content-type application/json unless contentType says otherwise). */
  body?: unknown;
  /** Sent as is, instead of body. */
  rawBody?: string;
  contentType?: string;
  /** A Cookie header value, e.g. "hl_session=...". */
  cookie?: string;
  origin?: string;
  idempotencyKey?: string;
  headers?: Record<string, string>;
  params?: Record<string, string>;
}

export interface CallResult<B = any> {
  status: number;
  body: B;
  headers: Headers;
}

export const baseUrl = () => process.env.APP_URL ?? "http://127.0.0.1:3000";

export function buildRequest(o: CallOptions): NextRequest {
  const url = new URL(o.path, baseUrl());
  const method = o.method ?? (o.body !== undefined || o.rawBody !== undefined ? "POST" : "GET");
  const payload = o.rawBody ?? (o.body !== undefined ? JSON.stringify(o.body) : undefined);
  // a server always receives Host; the wrapper compares Origin with it
  const headers = new Headers({ host: url.host });
  if (payload !== undefined) headers.set("content-type", o.contentType ?? "application/json");
  if (o.cookie) headers.set("cookie", o.cookie);
  if (o.origin) headers.set("origin", o.origin);
  if (o.idempotencyKey) headers.set("idempotency-key", o.idempotencyKey);
  for (const [k, v] of Object.entries(o.headers ?? {})) headers.set(k, v);
  return new NextRequest(url, { method, headers, body: payload });
}

export async function call<B = any>(handler: Handler, o: CallOptions): Promise<CallResult<B>> {
  const res = await handler(buildRequest(o), { params: Promise.resolve(o.params ?? {}) });
  const text = await res.text();
  return { status: res.status, body: text ? JSON.parse(text) : undefined, headers: res.headers };
}

/** "name=value" of the first Set-Cookie with that name, or undefined. */
export function cookieFrom(headers: Headers, name = "hl_session"): string | undefined {
  const c = headers.getSetCookie().find((s) => s.startsWith(`${name}=`));
  return c?.split(";")[0];
}

/** Every attribute of the named Set-Cookie, lower-cased names (httponly, samesite, secure ...). */
export function cookieAttributes(headers: Headers, name = "hl_session"): Map<string, string> {
  const c = headers.getSetCookie().find((s) => s.startsWith(`${name}=`));
  if (!c) throw new Error(`No Set-Cookie for ${name}: ${headers.getSetCookie().join(" | ")}`);
  const out = new Map<string, string>();
  for (const part of c.split(";").slice(1)) {
    const [k, ...v] = part.trim().split("=");
    out.set(k!.toLowerCase(), v.join("="));
  }
  return out;
}
