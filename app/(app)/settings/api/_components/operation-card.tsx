// One endpoint: method, path, who may call it, what to send and what comes back.
import { KeyRound, Lock, LockOpen } from "lucide-react";
import { Fragment } from "react";
import { DocText } from "./doc-text";
import { FieldsTable } from "./fields-table";
import type { Method, OperationView, ResponseView } from "./reference-model";

const METHOD_TONES: Record<Method, string> = {
  get: "border-brine-line bg-brine-soft text-pepper-soft",
  post: "border-paprika/25 bg-paprika-soft text-paprika-hover",
  put: "border-amber/25 bg-amber-soft text-amber",
  patch: "border-amber/25 bg-amber-soft text-amber",
  delete: "border-ember/25 bg-ember-soft text-ember",
};

export function MethodBadge({ method }: { method: Method }) {
  return (
    <span className={`inline-flex w-[64px] shrink-0 justify-center rounded border px-1.5 py-0.5 font-mono text-xs font-bold uppercase ${METHOD_TONES[method]}`}>
      {method}
    </span>
  );
}

/** The path with its {params} marked; long paths may wrap after a slash, never inside a word. */
export function PathText({ path, small }: { path: string; small?: boolean }) {
  return (
    <code className={`break-words font-mono font-semibold text-pepper ${small ? "text-[13px]" : "text-[15px]"}`}>
      {path.split(/(\/)/g).map((segment, i) =>
        segment === "/" ? (
          <Fragment key={i}>/<wbr /></Fragment>
        ) : segment.startsWith("{") ? (
          <span key={i} className="text-paprika">{segment}</span>
        ) : (
          <Fragment key={i}>{segment}</Fragment>
        ),
      )}
    </code>
  );
}

function StatusCode({ status }: { status: string }) {
  const tone = status.startsWith("2")
    ? "border-herb/25 bg-herb-soft text-herb"
    : status.startsWith("5")
      ? "border-ember/25 bg-ember-soft text-ember"
      : "border-amber/25 bg-amber-soft text-amber";
  return <span className={`inline-flex h-fit w-[48px] shrink-0 justify-center self-start rounded border py-0.5 font-mono text-sm font-bold ${tone}`}>{status}</span>;
}

function SchemaLink({ name }: { name: string }) {
  return (
    <a href={`#schema-${name}`} className="font-mono text-[13px] font-semibold normal-case tracking-normal text-paprika underline-offset-2 hover:underline">{name}</a>
  );
}

/** The shared error schema is said once above the list; only other bodies are named per row. */
const SHARED_ERROR = "Error";

function ResponseRow({ r }: { r: ResponseView }) {
  return (
    <li className="flex gap-3 py-2">
      <StatusCode status={r.status} />
      <div className="min-w-0 flex-1 text-sm">
        <DocText text={r.description} className="text-pepper-soft" />
        {r.schemaName && r.schemaName !== SHARED_ERROR ? <p className="mt-1 text-brine">Body: <SchemaLink name={r.schemaName} /></p> : null}
        {r.headers.map((h) => (
          <p key={h.name} className="mt-1 text-brine">
            Header <code className="font-mono text-[13px] text-pepper-soft">{h.name}</code>: {h.description}
          </p>
        ))}
      </div>
    </li>
  );
}

export function OperationCard({ op }: { op: OperationView }) {
  return (
    <article id={`op-${op.id}`} className="panel scroll-mt-6 p-5" aria-labelledby={`op-${op.id}-title`}>
      <div className="flex flex-wrap items-center gap-x-3 gap-y-2">
        <MethodBadge method={op.method} />
        <PathText path={op.path} />
        <div className="ml-auto flex flex-wrap gap-2 text-sm">
          {op.auth === "session" ? (
            <span className="inline-flex items-center gap-1 rounded-full border border-brine-line bg-brine-soft px-2.5 py-0.5 font-semibold text-pepper-soft">
              <Lock aria-hidden className="h-3.5 w-3.5" /> Signed in
            </span>
          ) : (
            <span className="inline-flex items-center gap-1 rounded-full border border-brine-line bg-white px-2.5 py-0.5 font-semibold text-pepper-soft">
              <LockOpen aria-hidden className="h-3.5 w-3.5" /> Public
            </span>
          )}
          {op.idempotent ? (
            <span className="inline-flex items-center gap-1 rounded-full border border-brine-line bg-white px-2.5 py-0.5 font-semibold text-pepper-soft">
              <KeyRound aria-hidden className="h-3.5 w-3.5" /> Idempotency-Key
            </span>
          ) : null}
        </div>
      </div>
      <h3 id={`op-${op.id}-title`} className="mt-3 text-lg font-semibold">{op.summary}</h3>
      {op.description ? <DocText text={op.description} className="mt-1 max-w-3xl text-brine" /> : null}
      <p className="mt-1 text-sm text-brine">
        {op.auth === "session" ? "Needs the hl_session cookie." : "No session needed."}
      </p>

      {op.parameters.length ? (
        <section className="mt-4">
          <h4 className="mb-1 text-sm font-semibold uppercase tracking-wide text-brine">Parameters</h4>
          <FieldsTable fields={op.parameters} location caption={`Parameters of ${op.method.toUpperCase()} ${op.path}`} />
        </section>
      ) : null}

      {op.body ? (
        <section className="mt-4">
          <h4 className="mb-1 text-sm font-semibold uppercase tracking-wide text-brine">
            Request body{op.body.schemaName ? <> · <SchemaLink name={op.body.schemaName} /></> : null}
            <span className="font-normal normal-case tracking-normal"> · application/json</span>
          </h4>
          <FieldsTable fields={op.body.fields} caption={`Request body of ${op.method.toUpperCase()} ${op.path}`} />
        </section>
      ) : null}

      <section className="mt-4">
        <h4 className="text-sm font-semibold uppercase tracking-wide text-brine">Responses</h4>
        <ul className="divide-y divide-salt-edge">
          {op.success.map((r) => <ResponseRow key={r.status} r={r} />)}
        </ul>
        {op.errors.length ? (
          <details className="group mt-1 rounded-md border border-salt-edge">
            <summary className="flex min-h-touch cursor-pointer items-center gap-2 px-3 text-sm font-semibold text-pepper hover:bg-salt">
              <span>Errors</span>
              <span className="font-mono font-normal text-brine">{op.errors.map((r) => r.status).join(" · ")}</span>
              <span className="ml-auto font-normal text-brine group-open:hidden">Show</span>
              <span className="ml-auto hidden font-normal text-brine group-open:inline">Hide</span>
            </summary>
            <p className="border-t border-salt-edge px-3 pt-2 text-sm text-brine">
              Bodies are <SchemaLink name={SHARED_ERROR} /> unless named: branch on <code className="font-mono text-[13px]">error.code</code>.
            </p>
            <ul className="divide-y divide-salt-edge px-3">
              {op.errors.map((r) => <ResponseRow key={r.status} r={r} />)}
            </ul>
          </details>
        ) : null}
      </section>
    </article>
  );
}
