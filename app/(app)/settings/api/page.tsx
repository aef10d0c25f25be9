import { FileJson } from "lucide-react";
import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { PageHeader } from "@/components/shell/page-header";
import { can } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { buildOpenApiDocument } from "@/lib/http/openapi";
import { DocText } from "./_components/doc-text";
import { FieldsTable, TypeName } from "./_components/fields-table";
import { MethodBadge, OperationCard, PathText } from "./_components/operation-card";
import { referenceView } from "./_components/reference-model";

export const metadata: Metadata = { title: "API reference" };
export const dynamic = "force-dynamic";

export default async function Page() {
  const user = await requireUser();
  if (!can(user, "api.readReference")) notFound();
  const view = referenceView(buildOpenApiDocument());
  const [intro, ...rest] = view.description.split(/\n{2,}/);

  return (
    <>
      <PageHeader
        title="API reference"
        description={`${view.title} ${view.version}: every endpoint, generated from the schemas the server checks requests with.`}
        actions={
          <a href="/api/openapi.json" className="btn-quiet" target="_blank" rel="noopener">
            <FileJson aria-hidden className="h-5 w-5" />
            openapi.json
          </a>
        }
      />

      <div className="grid gap-6 xl:grid-cols-[minmax(0,1fr)_280px]">
        <div className="min-w-0 space-y-6">
          <section className="panel p-5" aria-labelledby="conventions">
            <h2 id="conventions" className="sr-only">Conventions</h2>
            {intro ? <DocText text={intro} className="max-w-3xl text-pepper-soft" /> : null}
            <DocText text={rest.join("\n\n")} className="mt-3 max-w-3xl text-pepper-soft" />
            <p className="mt-4 text-sm text-brine">
              OpenAPI {view.openapi}. Load <a href="/api/openapi.json" className="font-semibold text-paprika underline-offset-2 hover:underline">/api/openapi.json</a> (signed in) into any OpenAPI tool to generate a client.
            </p>
          </section>

          <nav className="panel p-5 xl:hidden" aria-label="Endpoints">
            <Contents tags={view.tags} />
          </nav>

          {view.tags.map((tag) => (
            <section key={tag.slug} id={`tag-${tag.slug}`} className="scroll-mt-6 space-y-3" aria-labelledby={`tag-${tag.slug}-title`}>
              <div>
                <h2 id={`tag-${tag.slug}-title`} className="text-2xl font-semibold">{tag.name}</h2>
                {tag.description ? <p className="text-brine">{tag.description}</p> : null}
              </div>
              {tag.operations.map((op) => <OperationCard key={op.id} op={op} />)}
            </section>
          ))}

          <section id="schemas" className="scroll-mt-6 space-y-3" aria-labelledby="schemas-title">
            <div>
              <h2 id="schemas-title" className="text-2xl font-semibold">Schemas</h2>
              <p className="text-brine">The bodies sent and received, by name.</p>
            </div>
            {view.schemas.map((s) => (
              <article key={s.name} id={`schema-${s.name}`} className="panel scroll-mt-6 p-5" aria-labelledby={`schema-${s.name}-title`}>
                <h3 id={`schema-${s.name}-title`} className="font-mono text-base font-semibold">{s.name}</h3>
                {s.description ? <p className="mt-1 text-brine">{s.description}</p> : null}
                {s.fields.length ? (
                  <div className="mt-3"><FieldsTable fields={s.fields} caption={`Fields of ${s.name}`} /></div>
                ) : (
                  <p className="mt-2 text-sm text-brine">Type: <TypeName type={s.type} schema={s.ref} /></p>
                )}
              </article>
            ))}
          </section>
        </div>

        <aside className="hidden xl:block">
          <nav className="panel sticky top-6 max-h-[calc(100vh-3rem)] overflow-y-auto p-4" aria-label="Endpoints">
            <Contents tags={view.tags} />
          </nav>
        </aside>
      </div>
    </>
  );
}

function Contents({ tags }: { tags: ReturnType<typeof referenceView>["tags"] }) {
  return (
    <>
      <h2 className="text-base font-semibold">Endpoints</h2>
      <ul className="mt-2 grid gap-x-6 gap-y-3 sm:grid-cols-2 xl:grid-cols-1">
        {tags.map((tag) => (
          <li key={tag.slug}>
            <a href={`#tag-${tag.slug}`} className="text-sm font-semibold text-pepper hover:underline">{tag.name}</a>
            <ul className="mt-1 space-y-0.5">
              {tag.operations.map((op) => (
                <li key={op.id}>
                  <a href={`#op-${op.id}`} className="flex min-h-touch items-center gap-2 rounded px-1 text-sm hover:bg-salt-deep">
                    <MethodBadge method={op.method} />
                    <span className="min-w-0"><PathText path={op.path} small /></span>
                  </a>
                </li>
              ))}
            </ul>
          </li>
        ))}
      </ul>
      <a href="#schemas" className="mt-3 inline-block text-sm font-semibold text-pepper hover:underline">Schemas</a>
    </>
  );
}
