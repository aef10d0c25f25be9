// A lot forward, for a recall (EU 178/2002 Art. 18, one step forward inside the business): who
// supplied it and when it came in, how it moved between kitchens, the batches that used it (with
// their batch codes and how much each took) and what is left where. Printable, with the API's CSV.
import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { CureCaution } from "@/components/cure/cure-caution";
import { CureMarker } from "@/components/cure/cure-marker";
import { StatusBadge } from "@/components/planning/batch-badges";
import { dayPlain, momentText } from "@/components/planning/dates";
import { quantityText, signedQuantityText } from "@/components/planning/quantities";
import { Fact, PrintedLine, PrintPage, ShipmentsNote, TraceToolbar } from "@/components/planning/trace-parts";
import { PageHeader } from "@/components/shell/page-header";
import { DataTable, RowHeader, TBody, Td, Th, THead } from "@/components/ui/data-table";
import { canSomewhere } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import type { BatchStatus } from "@/lib/data/batches";
import { traceLot, type LotTrace } from "@/lib/data/trace";
import { AppError } from "@/lib/http/errors";
import { traceCsvUrl } from "@/lib/queries/planning";
import { traceContext, UUID } from "../../_server/context";

export const metadata: Metadata = { title: "Lot trace" };
export const dynamic = "force-dynamic";

const DATE_KIND: Record<string, string> = { use_by: "Use by", best_before: "Best before" };

function movementWords(m: LotTrace["movements"][number], kitchen: (code: string) => string): string {
  switch (m.kind) {
    case "receipt":
      return "Received";
    case "transfer":
      return m.quantity.startsWith("-") ? `Transferred to ${m.otherKitchen ? kitchen(m.otherKitchen) : "another kitchen"}` : `Transferred in from ${m.otherKitchen ? kitchen(m.otherKitchen) : "another kitchen"}`;
    case "use":
      return m.batchCode ? `Used in batch ${m.batchCode}` : "Used";
    case "waste":
      return "Wasted";
    default:
      return m.kind;
  }
}

export default async function LotTracePage({ params }: { params: Promise<{ id: string }> }) {
  const user = await requireUser();
  if (!canSomewhere(user, "planning.read")) notFound();
  const { id } = await params;
  if (!UUID.test(id)) notFound();
  let trace: LotTrace;
  try {
    trace = await traceLot(user, id);
  } catch (e) {
    if (e instanceof AppError && e.status === 404) notFound();
    throw e;
  }
  const ctx = await traceContext(user);
  const { lot } = trace;
  const known = ctx.itemById(lot.item.id);
  const item = { id: lot.item.id, unit: (known?.stockUnit ?? lot.item.unit) as "g" | "m" | "ml" | "pc", category: known?.category ?? "ingredient" };
  const q = (v: string) => quantityText(v, item, ctx.units, user.unitSystem);
  const cure = item.category === "cure";
  const used = trace.batches.length;

  return (
    <div className="space-y-6 print:space-y-4">
      <PrintPage />
      <TraceToolbar csvHref={traceCsvUrl("lots", lot.id)} csvName={`lot-${lot.code}-trace.csv`} />
      <div className="[&>header]:mb-0">
        <PageHeader
          title={`Lot ${lot.code}`}
          description={`Forward trace: where this lot of ${lot.item.sku} · ${lot.item.name} went, for a recall.`}
        />
      </div>
      <ShipmentsNote note={trace.note} />
      {cure ? <CureCaution /> : null}

      <dl className="grid grid-cols-2 gap-3 md:grid-cols-4 print:grid-cols-4">
        <Fact label="Item">
          <span className="flex flex-wrap items-center gap-2">{lot.item.sku}{cure ? <CureMarker /> : null}</span>
          <span className="block text-sm font-normal text-brine">{lot.item.name}</span>
        </Fact>
        <Fact label="Supplier">
          {lot.supplier ?? <span className="font-normal text-brine">Not recorded</span>}
          <span className="block text-sm font-normal text-brine">Supplier&rsquo;s lot code {lot.code}</span>
        </Fact>
        <Fact label="Received">
          <span className="num">{dayPlain(lot.receivedOn)}</span>
          {lot.date ? <span className="block text-sm font-normal text-brine">{DATE_KIND[lot.dateKind ?? ""] ?? "Dated"} <span className="num">{dayPlain(lot.date)}</span></span> : null}
        </Fact>
        <Fact label="Left now">
          {trace.onHand.length ? (
            <ul>
              {trace.onHand.map((h) => (
                <li key={h.kitchen}><span className="num">{q(h.quantity)}</span> <span className="text-sm font-normal text-brine">in {ctx.kitchen(h.kitchen)}</span></li>
              ))}
            </ul>
          ) : (
            <span className="font-normal text-brine">None left in your kitchens</span>
          )}
        </Fact>
      </dl>

      <section aria-labelledby="batches-heading" className="space-y-2 break-inside-avoid">
        <h2 id="batches-heading" className="text-xl font-semibold">
          Batches that used it <span className="font-sans text-base font-normal text-brine">· {used} {used === 1 ? "batch" : "batches"}</span>
        </h2>
        {used ? (
          <DataTable caption={`Batches that used lot ${lot.code}`}>
            <THead>
              <Th>Batch code</Th>
              <Th>Recipe</Th>
              <Th>Kitchen</Th>
              <Th>Made</Th>
              <Th numeric>Quantity used</Th>
              <Th>Status</Th>
            </THead>
            <TBody>
              {trace.batches.map((b) => (
                <tr key={b.batchId} className="break-inside-avoid">
                  <RowHeader>
                    <Link href={`/planning/trace/batches/${b.batchId}`} className="num whitespace-nowrap text-paprika underline-offset-2 hover:underline print:text-pepper">{b.batchCode}</Link>
                  </RowHeader>
                  <Td>
                    {b.recipe.name}
                    <span className="block text-sm text-brine">{b.recipe.code} · version {b.recipe.version}</span>
                  </Td>
                  <Td className="text-sm">{ctx.kitchen(b.kitchen)}</Td>
                  <Td className="num whitespace-nowrap text-sm">{momentText(b.producedAt, user.timeZone)}</Td>
                  <Td numeric className="whitespace-nowrap font-semibold">{q(b.quantity)}</Td>
                  <Td><StatusBadge status={b.status as BatchStatus} /></Td>
                </tr>
              ))}
            </TBody>
          </DataTable>
        ) : (
          <p className="panel px-4 py-3 text-brine">No batch has used this lot yet.</p>
        )}
      </section>

      <section aria-labelledby="movements-heading" className="space-y-2">
        <h2 id="movements-heading" className="text-xl font-semibold">Received, moved and used</h2>
        {trace.movements.length ? (
          <DataTable caption={`Movements of lot ${lot.code}`}>
            <THead>
              <Th>When</Th>
              <Th>What</Th>
              <Th>Kitchen</Th>
              <Th numeric>Quantity</Th>
            </THead>
            <TBody>
              {trace.movements.map((m, i) => (
                <tr key={i} className="break-inside-avoid">
                  <Td className="num whitespace-nowrap text-sm">{momentText(m.occurredAt, user.timeZone)}</Td>
                  <RowHeader className="font-normal">{movementWords(m, ctx.kitchen)}{m.kind === "receipt" && lot.supplier ? <span className="text-brine"> from {lot.supplier}</span> : null}</RowHeader>
                  <Td className="text-sm">{ctx.kitchen(m.kitchen)}</Td>
                  <Td numeric className="whitespace-nowrap">{signedQuantityText(m.quantity, item, ctx.units, user.unitSystem)}</Td>
                </tr>
              ))}
            </TBody>
          </DataTable>
        ) : (
          <p className="panel px-4 py-3 text-brine">No movements of this lot in the kitchens you can see.</p>
        )}
        <p className="text-sm text-brine">Counts and adjustments are not listed; what is left is the balance now. Quantities in your {user.unitSystem === "us" ? "US" : "metric"} units{cure ? ", cure in grams" : ""}.</p>
      </section>

      <PrintedLine printedAt={ctx.printedAt} printedBy={user.name} />
    </div>
  );
}
