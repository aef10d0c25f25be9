// Turns the OpenAPI document into what the reference page shows: endpoints grouped by tag, each
// field as name, type, required and constraints. Reads only the document, so the page cannot say
// anything /api/openapi.json does not.
import type { OpenApiDocument } from "@/lib/http/openapi";

type PathItem = NonNullable<OpenApiDocument["paths"]>[string];
type Operation = NonNullable<PathItem["get"]>;
type SchemaOrRef = NonNullable<NonNullable<OpenApiDocument["components"]>["schemas"]>[string];
type Schema = Exclude<SchemaOrRef, { $ref: string }>;
type ParameterOrRef = NonNullable<Operation["parameters"]>[number];
// ResponsesObject's index signature is `any`: name the parts the page reads.
interface ResponseOrRef {
  $ref?: string;
  description: string;
  headers?: Record<string, { description?: string; $ref?: string }>;
  content?: { [type: string]: { schema?: SchemaOrRef } };
}
type RequestBodyOrRef = NonNullable<Operation["requestBody"]>;

export const METHODS = ["get", "post", "put", "patch", "delete"] as const;
export type Method = (typeof METHODS)[number];

export interface FieldView {
  name: string;
  type: string;
  /** Component name when the type is a named schema (or an array of one), for a link. */
  ref?: string;
  required: boolean;
  constraints: string[];
  description?: string;
}

export interface ResponseView {
  status: string;
  description: string;
  schemaName?: string;
  headers: { name: string; description: string }[];
}

export interface OperationView {
  id: string;
  method: Method;
  path: string;
  summary: string;
  description?: string;
  auth: "session" | "public";
  idempotent: boolean;
  parameters: (FieldView & { in: string })[];
  body?: { schemaName?: string; fields: FieldView[] };
  success: ResponseView[];
  errors: ResponseView[];
}

export interface TagView {
  name: string;
  slug: string;
  description?: string;
  operations: OperationView[];
}

export interface SchemaView {
  name: string;
  description?: string;
  type: string;
  ref?: string;
  fields: FieldView[];
}

export interface ReferenceView {
  title: string;
  version: string;
  openapi: string;
  description: string;
  tags: TagView[];
  schemas: SchemaView[];
}

const isRef = (s: unknown): s is { $ref: string } => typeof s === "object" && s !== null && "$ref" in s;
export const refName = (ref: string) => ref.slice(ref.lastIndexOf("/") + 1);
export const slug = (s: string) => s.toLowerCase().replace(/[^a-z0-9]+/g, "-").replace(/^-|-$/g, "");

function literal(v: unknown): string {
  return typeof v === "string" ? `"${v}"` : JSON.stringify(v);
}

/** A short type for people: "string (uuid)", "array of Kitchen", "string or null", "{ [key]: array of string }". */
export function typeOf(s: SchemaOrRef | undefined): { label: string; ref?: string } {
  if (!s) return { label: "any" };
  if (isRef(s)) return { label: refName(s.$ref), ref: refName(s.$ref) };
  if (s.enum && s.enum.length === 1) return { label: literal(s.enum[0]) };
  const types = Array.isArray(s.type) ? s.type : s.type ? [s.type] : [];
  const nonNull = types.filter((t) => t !== "null");
  const nullable = types.includes("null");
  let label: string;
  let ref: string | undefined;
  if (nonNull.length === 1 && nonNull[0] === "array") {
    const inner = typeOf(s.items);
    label = `array of ${inner.label}`;
    ref = inner.ref;
  } else if (nonNull.length === 1 && nonNull[0] === "object" && !s.properties && s.additionalProperties && typeof s.additionalProperties === "object") {
    const inner = typeOf(s.additionalProperties);
    label = Object.keys(s.additionalProperties).length ? `{ [key]: ${inner.label} }` : "object";
    ref = inner.ref;
  } else {
    label = nonNull.join(" | ") || "any";
    if (s.format) label += ` (${s.format})`;
  }
  return { label: nullable ? `${label} or null` : label, ref };
}

function plural(n: number, one: string, many = `${one}s`) {
  return `${n} ${n === 1 ? one : many}`;
}

/** Constraints a client must meet, in words. */
export function constraintsOf(s: SchemaOrRef | undefined): string[] {
  if (!s || isRef(s)) return [];
  const out: string[] = [];
  if (s.enum && s.enum.length > 1) out.push(`one of ${s.enum.map(literal).join(", ")}`);
  if (s.minLength !== undefined && s.maxLength !== undefined) out.push(`${s.minLength}–${s.maxLength} characters`);
  else if (s.minLength !== undefined) out.push(`at least ${plural(s.minLength, "character")}`);
  else if (s.maxLength !== undefined) out.push(`at most ${plural(s.maxLength, "character")}`);
  if (s.pattern) out.push(`matches ${s.pattern}`);
  if (s.minimum !== undefined) out.push(`≥ ${s.minimum}`);
  if (s.exclusiveMinimum !== undefined) out.push(`> ${s.exclusiveMinimum}`);
  if (s.maximum !== undefined) out.push(`≤ ${s.maximum}`);
  if (s.exclusiveMaximum !== undefined) out.push(`< ${s.exclusiveMaximum}`);
  if (s.minItems !== undefined) out.push(`at least ${plural(s.minItems, "item")}`);
  if (s.maxItems !== undefined) out.push(`at most ${plural(s.maxItems, "item")}`);
  if (s.items && !isRef(s.items)) out.push(...constraintsOf(s.items).map((c) => `each ${c}`));
  if (s.default !== undefined) out.push(`default ${literal(s.default)}`);
  return out;
}

/** The fields of an object schema; inline objects are flattened to dotted names. */
export function fieldsOf(schema: SchemaOrRef | undefined, schemas: Record<string, Schema>, prefix = ""): FieldView[] {
  if (!schema) return [];
  const s = isRef(schema) ? schemas[refName(schema.$ref)] : schema;
  if (!s?.properties) return [];
  const required = new Set(s.required ?? []);
  const out: FieldView[] = [];
  for (const [name, prop] of Object.entries(s.properties)) {
    const full = `${prefix}${name}`;
    const t = typeOf(prop);
    out.push({
      name: full,
      type: t.label,
      ref: t.ref,
      required: required.has(name),
      constraints: constraintsOf(prop),
      description: isRef(prop) ? undefined : prop.description,
    });
    if (!isRef(prop) && prop.properties) out.push(...fieldsOf(prop, schemas, `${full}.`));
  }
  return out;
}

function schemaNameOf(content: { [type: string]: { schema?: SchemaOrRef } } | undefined): string | undefined {
  const schema = content?.["application/json"]?.schema;
  return isRef(schema) ? refName(schema.$ref) : undefined;
}

function responseView(status: string, r: ResponseOrRef): ResponseView {
  if (r.$ref) return { status, description: refName(r.$ref), headers: [] };
  return {
    status,
    description: r.description,
    schemaName: schemaNameOf(r.content),
    headers: Object.entries(r.headers ?? {}).map(([name, h]) => ({ name, description: h.$ref ? refName(h.$ref) : (h.description ?? "") })),
  };
}

function parameterView(p: ParameterOrRef): (FieldView & { in: string }) | null {
  if (isRef(p)) return null;
  const t = typeOf(p.schema);
  return {
    name: p.name,
    in: p.in,
    type: t.label,
    ref: t.ref,
    required: p.required === true,
    constraints: constraintsOf(p.schema),
    description: p.description,
  };
}

function bodyView(b: RequestBodyOrRef | undefined, schemas: Record<string, Schema>): OperationView["body"] {
  if (!b || isRef(b)) return undefined;
  const schema = b.content["application/json"]?.schema;
  return { schemaName: schemaNameOf(b.content), fields: fieldsOf(schema, schemas) };
}

const typeRef = (s: Schema) => {
  const t = typeOf(s);
  return { type: t.label, ref: t.ref };
};

export function referenceView(doc: OpenApiDocument): ReferenceView {
  const schemas = (doc.components?.schemas ?? {}) as Record<string, Schema>;
  const defaultSecurity = doc.security ?? [];
  const byTag = new Map<string, OperationView[]>();
  for (const [path, item] of Object.entries(doc.paths ?? {})) {
    for (const method of METHODS) {
      const op = item[method];
      if (!op) continue;
      const security = op.security ?? defaultSecurity;
      const parameters = (op.parameters ?? []).map(parameterView).filter((p) => p !== null);
      const responses = Object.entries(op.responses ?? {}).map(([status, r]) => responseView(status, r as ResponseOrRef));
      const view: OperationView = {
        id: op.operationId ?? `${method}-${slug(path)}`,
        method,
        path,
        summary: op.summary ?? "",
        description: op.description,
        auth: security.length > 0 ? "session" : "public",
        idempotent: parameters.some((p) => p.in === "header" && p.name.toLowerCase() === "idempotency-key"),
        parameters,
        body: bodyView(op.requestBody, schemas),
        success: responses.filter((r) => r.status.startsWith("2")),
        errors: responses.filter((r) => !r.status.startsWith("2")),
      };
      for (const tag of op.tags?.length ? op.tags : ["Other"]) byTag.set(tag, [...(byTag.get(tag) ?? []), view]);
    }
  }
  const declared = (doc.tags ?? []).map((t) => t.name);
  const tagNames = [...declared.filter((t) => byTag.has(t)), ...[...byTag.keys()].filter((t) => !declared.includes(t))];
  return {
    title: doc.info.title,
    version: doc.info.version,
    openapi: doc.openapi,
    description: doc.info.description ?? "",
    tags: tagNames.map((name) => ({
      name,
      slug: slug(name),
      description: doc.tags?.find((t) => t.name === name)?.description,
      operations: byTag.get(name) ?? [],
    })),
    schemas: Object.entries(schemas)
      .map(([name, s]) => ({ name, description: s.description, ...typeRef(s), fields: fieldsOf(s, schemas) }))
      .sort((a, b) => a.name.localeCompare(b.name)),
  };
}
