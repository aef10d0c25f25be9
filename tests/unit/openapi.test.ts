// The OpenAPI document against the route files themselves: every exported handler is documented
// with its method and path, and what each route's `route({...})` options say (auth, body,
// idempotent) is what the document says. No database: the document is built from schemas only.
import { readdirSync, readFileSync } from "node:fs";
import { join, relative, sep } from "node:path";
import { Validator } from "@seriousme/openapi-schema-validator";
import { describe, expect, it } from "vitest";
import { z } from "zod";
import { buildOpenApiDocument, SECURITY_SCHEME } from "@/lib/http/openapi";
import * as companySchemas from "@/lib/validation/company";

const ROOT = join(__dirname, "..", "..");
const API_DIR = join(ROOT, "app", "api");
const HTTP_METHODS = ["GET", "POST", "PUT", "PATCH", "DELETE", "HEAD", "OPTIONS"] as const;

interface RouteExport {
  file: string;
  method: string;
  path: string;
  /** The text of the options object passed to route(...), or null when not wrapped. */
  options: string | null;
}

function routeFiles(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
    const full = join(dir, e.name);
    if (e.isDirectory()) return routeFiles(full);
    return /^route\.(ts|tsx|js)$/.test(e.name) ? [full] : [];
  });
}

/** app/api/kitchens/[id]/route.ts -> /api/kitchens/{id}; route groups vanish. */
function apiPath(file: string): string {
  const segments = relative(join(ROOT, "app"), file).split(sep).slice(0, -1);
  return `/${segments
    .filter((s) => !/^\(.*\)$/.test(s))
    .map((s) => s.replace(/^\[\[?(?:\.\.\.)?([^\]]+)\]\]?$/, "{$1}"))
    .join("/")}`;
}

/** The balanced {...} starting at `start` (an opening brace). */
function objectText(source: string, start: number): string {
  let depth = 0;
  for (let i = start; i < source.length; i++) {
    if (source[i] === "{") depth++;
    else if (source[i] === "}" && --depth === 0) return source.slice(start, i + 1);
  }
  throw new Error("unbalanced braces");
}

function routeExports(): RouteExport[] {
  return routeFiles(API_DIR).flatMap((file) => {
    const source = readFileSync(file, "utf8");
    const found: RouteExport[] = [];
    const re = /export\s+(?:const|(?:async\s+)?function)\s+([A-Z]+)\b(\s*=\s*route\(\s*)?/g;
    for (const m of source.matchAll(re)) {
      if (!(HTTP_METHODS as readonly string[]).includes(m[1]!)) continue;
      const options = m[2] ? objectText(source, m.index! + m[0].length) : null;
      found.push({ file: relative(ROOT, file), method: m[1]!, path: apiPath(file), options });
    }
    return found;
  });
}

const doc = buildOpenApiDocument();
const routes = routeExports();
type Operation = NonNullable<NonNullable<typeof doc.paths>[string]["get"]>;
const schemas = doc.components?.schemas ?? {};

function operation(path: string, method: string): Operation | undefined {
  const item = doc.paths?.[path] as Record<string, Operation> | undefined;
  return item?.[method.toLowerCase()];
}

function refOf(schema: unknown): string | undefined {
  return typeof schema === "object" && schema !== null && "$ref" in schema ? String((schema as { $ref: string }).$ref) : undefined;
}

/** A deep copy, as the validator's plain-record type (it may annotate what it is given). */
const asSpec = (d: typeof doc): Record<string, unknown> => JSON.parse(JSON.stringify(d)) as Record<string, unknown>;

// every module of lib/validation (vite's glob import), so a new module needs no edit here
const validationModules = import.meta.glob<Record<string, unknown>>("../../lib/validation/*.ts", { eager: true });
const requestSchemas: Record<string, unknown> = Object.assign({}, ...Object.values(validationModules));

describe("route discovery", () => {
  it("finds the route files and their handlers", () => {
    expect(routes.length).toBeGreaterThanOrEqual(15);
    expect(routes).toContainEqual(expect.objectContaining({ method: "PATCH", path: "/api/kitchens/{id}" }));
    expect(routes).toContainEqual(expect.objectContaining({ method: "GET", path: "/api/openapi.json" }));
    for (const r of routes) expect(r.options, `${r.file} ${r.method} goes through route()`).not.toBeNull();
  });
});

describe("every endpoint is documented", () => {
  it.each(routes.map((r) => [`${r.method} ${r.path}`, r] as const))("%s", (_, r) => {
    const op = operation(r.path, r.method);
    expect(op, `${r.method} ${r.path} (${r.file}) is missing from the document`).toBeDefined();
    expect(op!.summary).toBeTruthy();
    expect(op!.tags?.length).toBe(1);
    expect(op!.responses?.["500"]).toBeDefined();
  });

  it("documents nothing that has no handler", () => {
    const handled = new Set(routes.map((r) => `${r.method} ${r.path}`));
    for (const [path, item] of Object.entries(doc.paths ?? {})) {
      for (const method of Object.keys(item)) {
        if (!["get", "post", "put", "patch", "delete"].includes(method)) continue;
        expect(handled.has(`${method.toUpperCase()} ${path}`), `${method.toUpperCase()} ${path} is documented but has no handler`).toBe(true);
      }
    }
  });

  it("gives every operation a unique operationId", () => {
    const ids = routes.map((r) => operation(r.path, r.method)?.operationId);
    expect(ids.every(Boolean)).toBe(true);
    expect(new Set(ids).size).toBe(ids.length);
  });
});

describe("what route() enforces is what the document says", () => {
  it.each(routes.map((r) => [`${r.method} ${r.path}`, r] as const))("%s", (_, r) => {
    const op = operation(r.path, r.method)!;
    const options = r.options ?? "";
    const isPublic = /\bauth:\s*false\b/.test(options);
    const bodyName = /\bbody:\s*([A-Za-z0-9_]+)/.exec(options)?.[1];
    const idempotent = /\bidempotent:\s*true\b/.test(options);

    // authentication
    expect(op.security).toEqual(isPublic ? [] : [{ [SECURITY_SCHEME]: [] }]);
    if (isPublic) expect(op.responses?.["401"]?.description ?? "").not.toMatch(/No valid session/);
    else expect(op.responses?.["401"]).toBeDefined();

    // request body: a named component with the same fields as the schema the route parses with
    if (bodyName) {
      const content = (op.requestBody as { content?: Record<string, { schema?: unknown }> } | undefined)?.content;
      const ref = refOf(content?.["application/json"]?.schema);
      expect(ref, `${r.method} ${r.path}: body should $ref a component`).toMatch(/^#\/components\/schemas\//);
      const component = schemas[ref!.split("/").pop()!] as { properties?: Record<string, unknown> } | undefined;
      expect(component).toBeDefined();
      const zodSchema = requestSchemas[bodyName];
      expect(zodSchema, `${bodyName} is exported from a lib/validation module`).toBeInstanceOf(z.ZodObject);
      expect(Object.keys(component!.properties ?? {}).sort()).toEqual(Object.keys((zodSchema as z.ZodObject).shape).sort());
      for (const status of ["400", "413", "415", "422"]) expect(op.responses?.[status], `${status} on ${r.method} ${r.path}`).toBeDefined();
    } else {
      // no body schema in route(): nothing to send, or a multipart upload the route streams itself
      const content = (op.requestBody as { content?: Record<string, unknown> } | undefined)?.content;
      if (op.requestBody !== undefined) expect(Object.keys(content ?? {}), `${r.method} ${r.path}`).toEqual(["multipart/form-data"]);
      if (r.method === "POST" && /\breceive(?:Upload|PriceList)\(/.test(readFileSync(join(ROOT, r.file), "utf8"))) expect(content?.["multipart/form-data"], `${r.method} ${r.path} takes a file`).toBeDefined();
    }

    // Idempotency-Key
    const header = (op.parameters ?? []).find((p) => "name" in p && p.in === "header" && p.name === "Idempotency-Key");
    if (idempotent) {
      expect(header, `${r.method} ${r.path} takes an Idempotency-Key`).toBeDefined();
      expect(header).toMatchObject({ required: false, schema: { type: "string", maxLength: 200 } });
    } else {
      expect(header).toBeUndefined();
    }

    // writes may be refused cross-site
    if (r.method !== "GET") expect(op.responses?.["403"]?.description).toMatch(/Origin/);
  });

  it("takes an Idempotency-Key on POST /api/kitchens and POST /api/invitations", () => {
    for (const path of ["/api/kitchens", "/api/invitations"]) {
      const names = (operation(path, "POST")?.parameters ?? []).map((p) => ("name" in p ? `${p.in}:${p.name}` : ""));
      expect(names).toContain("header:Idempotency-Key");
    }
  });

  it("gives every POST and PATCH with a body a referenced schema", () => {
    const writes = routes.filter((r) => (r.method === "POST" || r.method === "PATCH") && /\bbody:/.test(r.options ?? ""));
    expect(writes.length).toBeGreaterThanOrEqual(9);
    for (const r of writes) {
      const content = (operation(r.path, r.method)?.requestBody as { content: Record<string, { schema: unknown }> }).content;
      expect(refOf(content["application/json"]?.schema)).toBeDefined();
    }
  });

  it("documents path parameters for every {param} in a path", () => {
    for (const r of routes) {
      const params = [...r.path.matchAll(/\{([^}]+)\}/g)].map((m) => m[1]);
      const documented = (operation(r.path, r.method)?.parameters ?? []).filter((p) => "in" in p && p.in === "path").map((p) => ("name" in p ? p.name : ""));
      expect(documented.sort()).toEqual(params.sort());
    }
  });
});

describe("the document", () => {
  it("is a valid OpenAPI 3.1 document", async () => {
    const validator = new Validator();
    const result = await validator.validate(asSpec(doc));
    expect(result.errors).toBeUndefined();
    expect(result.valid).toBe(true);
    expect(validator.version).toBe("3.1");
  });

  it("is checked by a validator that does reject a broken document", async () => {
    const broken = asSpec(doc);
    delete broken.info;
    const result = await new Validator().validate(broken);
    expect(result.valid).toBe(false);
  });

  it("has every $ref resolve to a component", () => {
    const refs: string[] = [];
    const walk = (v: unknown) => {
      if (Array.isArray(v)) v.forEach(walk);
      else if (v && typeof v === "object") {
        for (const [k, x] of Object.entries(v)) {
          if (k === "$ref" && typeof x === "string") refs.push(x);
          else walk(x);
        }
      }
    };
    walk(doc);
    expect(refs.length).toBeGreaterThan(20);
    for (const ref of refs) {
      const [, kind, name] = /^#\/components\/([^/]+)\/(.+)$/.exec(ref) ?? [];
      expect((doc.components as Record<string, Record<string, unknown>>)[kind!]?.[name!], ref).toBeDefined();
    }
  });

  it("states the conventions in info", () => {
    expect(doc.openapi).toBe("3.1.0");
    expect(doc.info.title).toBe("Hank & Lot API");
    expect(doc.info.version).toBe("0.1.0");
    const text = doc.info.description ?? "";
    expect(text).toMatch(/decimal strings/);
    expect(text).toMatch(/JSON numbers are refused with 422/);
    expect(text).toMatch(/"error": \{"code", "message", "details"\?\}/);
    expect(text).toMatch(/at least 24 hours/);
    expect(text).toMatch(/Origin/);
    expect(text).toMatch(/Another company's record answers 404/);
    expect(text).toMatch(/answers 403/);
  });

  it("describes the session cookie and every error with the shared error shape", () => {
    expect(doc.components?.securitySchemes?.[SECURITY_SCHEME]).toMatchObject({ type: "apiKey", in: "cookie", name: "hl_session" });
    for (const r of routes) {
      const responses = operation(r.path, r.method)!.responses as Record<string, { content?: Record<string, { schema?: unknown }> }>;
      for (const [status, response] of Object.entries(responses)) {
        // a download (an order's PDF or CSV) answers its own media type, with a named schema too
        const download = Number(status) < 400 && !response.content?.["application/json"] ? Object.values(response.content ?? {})[0] : undefined;
        const ref = refOf(download ? download.schema : response.content?.["application/json"]?.schema);
        expect(ref, `${r.method} ${r.path} ${status}`).toBeDefined();
        if (Number(status) >= 400) {
          expect(ref).toBe(status === "422" ? "#/components/schemas/ValidationError" : "#/components/schemas/Error");
        }
      }
    }
  });

  it("leaves the request schemas the routes parse with untouched", () => {
    const { kitchenCreateInput, invitationCreateInput } = companySchemas;
    expect(z.globalRegistry.get(kitchenCreateInput)).toBeUndefined();
    expect("openapi" in kitchenCreateInput).toBe(false);
    expect(kitchenCreateInput.parse({ code: " north-1 ", name: "North" })).toEqual({ code: "NORTH-1", name: "North", address: "", timeZone: null });
    // the refinement still runs on the original
    expect(invitationCreateInput.safeParse({ email: "a@b.test", name: "A", role: "kitchen_lead" }).success).toBe(false);
  });

  it("is generated afresh each time", () => {
    const a = buildOpenApiDocument();
    (a.info as { title: string }).title = "changed";
    expect(buildOpenApiDocument().info.title).toBe("Hank & Lot API");
  });
});
