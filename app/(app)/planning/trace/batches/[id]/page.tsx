// A batch back, for a recall (EU 178/2002 Art. 18, one step back): every lot the batch used, with
// its supplier, the supplier's lot code, the receipt and use-by or best-before date, and how much.
// Printable, with the API's CSV.
import { ClipboardList } from "lucide-react";
import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { CureCaution } from "@/components/cure/cure-caution";
import { CureMarker } from "@/components/cure/cure-marker";
import { StatusBadge } from "@/components/planning/batch-badges";
import { dayPlain, momentText } from "@/components/planning/dates";
import { gramsText, quantityText } from "@/components/planning/quantities";
import { Fact, PrintedLine, PrintPage, ShipmentsNote, TraceToolbar } from "@/components/planning/trace-parts";
import { PageHeader } from "@/components/shell/page-header";
import { DataTable, RowHeader, TBody, Td, Th, THead } from "@/components/ui/data-table";
import { canSomewhere } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import type { BatchStatus } from "@/lib/data/batches";
import { traceBatch, type BatchTrace } from "@/lib/data/trace";
import { AppError } from "@/lib/http/errors";
import { traceCsvUrl } from "@/lib/queries/planning";
import { traceContext, UUID } from "../../_server/context";

export const metadata: Metadata = { title: "Batch trace" };
export const dynamic = "force-dynamic";

const DATE_KIND: Record<string, string> = { use_by: "use by", best_before: "best before" };

export default async function BatchTracePage({ params }: { params: Promise<{ id: string }> }) {
  const user = await requireUser();
  if (!canSomewhere(user, "planning.read")) notFound();
  const { id } = await params;
  if (!UUID.test(id)) notFound();
  let trace: BatchTrace;
  try {
    trace = await traceBatch(user, id);
  } catch (e) {
    // another company's batch, or one not made yet: nothing to trace
    if (e instanceof AppError && e.status === 404) notFound();
    throw e;
  }
  const ctx = await traceContext(user);
  const { batch } = trace;
  const rows = trace.lots.map((l) => {
    const known = ctx.itemBySku(l.item.sku);
    const item = { id: known?.id ?? l.item.sku, unit: (known?.stockUnit ?? l.item.unit) as "g" | "m" | "ml" | "pc", category: known?.category ?? "ingredient" };
    return { ...l, line: item, untracked: known ? !known.trackLots : false };
  });
  const anyCure = rows.some((r) => r.line.category === "cure");

  return (
    <div className="space-y-6 print:space-y-4">
      <PrintPage />
      <TraceToolbar csvHref={traceCsvUrl("batches", batch.id)} csvName={`batch-${batch.batchCode}-trace.csv`}>
        <Link href={`/planning/batches/${batch.id}`} className="btn-quiet">
          <ClipboardList aria-hidden className="h-5 w-5" /> Batch sheet
        </Link>
      </TraceToolbar>
      <div className="[&>header]:mb-0">
        <PageHeader
          title={`Batch ${batch.batchCode}`}
          description={`Backward trace: every lot that went into this batch of ${batch.recipe.name}, with its supplier, for a recall.`}
        />
      </div>
      <ShipmentsNote note={trace.note} />
      {anyCure ? <CureCaution /> : null}

      <dl className="grid grid-cols-2 gap-3 md:grid-cols-4 print:grid-cols-4">
        <Fact label="Recipe">
          {batch.recipe.name}
          <span className="block text-sm font-normal text-brine">{batch.recipe.code} · version {batch.recipe.version}</span>
        </Fact>
        <Fact label="Kitchen">{ctx.kitchen(batch.kitchen)}</Fact>
        <Fact label="Made">
          <span className="num">{momentText(batch.producedAt, user.timeZone)}</span>
          <span className="mt-1 block"><StatusBadge status={batch.status as BatchStatus} /></span>
        </Fact>
        <Fact label="Meat block (actual)"><span className="num">{gramsText(batch.actualMeatBlockG, user.unitSystem)}</span></Fact>
      </dl>

      <section aria-labelledby="lots-heading" className="space-y-2">
        <h2 id="lots-heading" className="text-xl font-semibold">
          Lots used <span className="font-sans text-base font-normal text-brine">· {rows.length} {rows.length === 1 ? "lot" : "lots"}</span>
        </h2>
        {rows.length ? (
          <DataTable caption={`Lots used by batch ${batch.batchCode}`}>
            <THead>
              <Th>Item</Th>
              <Th>Lot</Th>
              <Th>Supplier</Th>
              <Th>Received</Th>
              <Th>Date</Th>
              <Th numeric>Quantity used</Th>
            </THead>
            <TBody>
              {rows.map((l) => (
                <tr key={l.lotId} className="break-inside-avoid align-top">
                  <RowHeader className="align-top">
                    <span className="flex flex-wrap items-center gap-2">{l.item.sku}{l.line.category === "cure" ? <CureMarker /> : null}</span>
                    <span className="block text-sm font-normal text-brine">{l.item.name}</span>
                  </RowHeader>
                  <Td className="align-top">
                    <Link href={`/planning/trace/lots/${l.lotId}`} className="num whitespace-nowrap font-semibold text-paprika underline-offset-2 hover:underline print:text-pepper">{l.code}</Link>
                    {l.untracked ? <span className="block text-sm text-brine">receipt code: item not tracked by lot</span> : null}
                  </Td>
                  <Td className="align-top">{l.supplier ?? <span className="text-brine">Not recorded</span>}</Td>
                  <Td className="num align-top whitespace-nowrap text-sm">{dayPlain(l.receivedOn)}</Td>
                  <Td className="align-top whitespace-nowrap text-sm">
                    {l.date ? <>{DATE_KIND[l.dateKind ?? ""] ?? "dated"} <span className="num">{dayPlain(l.date)}</span></> : <span className="text-brine">Undated</span>}
                  </Td>
                  <Td numeric className="align-top whitespace-nowrap font-semibold">{quantityText(l.quantity, l.line, ctx.units, user.unitSystem)}</Td>
                </tr>
              ))}
            </TBody>
          </DataTable>
        ) : (
          <p className="panel px-4 py-3 text-brine">This batch used no stock from any lot.</p>
        )}
        <p className="text-sm text-brine">
          The lot is the supplier&rsquo;s lot code as received; for items not tracked by lot, the code Hank &amp; Lot gave the receipt. Quantities in your {user.unitSystem === "us" ? "US" : "metric"} units{anyCure ? ", cure in grams as weighed" : ""}.
        </p>
      </section>

      <PrintedLine printedAt={ctx.printedAt} printedBy={user.name} />
    </div>
  );
}
