// Traceability: find a lot by its code (forward: which batches used it) or a batch by its batch
// code (back: which lots went in), for a recall. A plain GET form, so a search is a link that can be
// shared or kept. Without a search: the batches made most recently and the lots received most
// recently. Lots are found among receipts (every lot starts with one), batches among those made.
import { Search } from "lucide-react";
import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { StatusBadge } from "@/components/planning/batch-badges";
import { momentText } from "@/components/planning/dates";
import { PageHeader } from "@/components/shell/page-header";
import { DataTable, RowHeader, TBody, Td, Th, THead } from "@/components/ui/data-table";
import { EmptyState } from "@/components/ui/empty-state";
import { canSomewhere } from "@/lib/auth/permissions";
import type { CurrentUser } from "@/lib/auth/current-user";
import { requireUser } from "@/lib/auth/session";
import { listBatches, type Batch } from "@/lib/data/batches";
import { listMovements } from "@/lib/data/movements";

export const metadata: Metadata = { title: "Traceability" };
export const dynamic = "force-dynamic";

const RECENT = 12;
/** receipts read per search page, and how many pages at most (a small kitchen's whole history) */
const PAGE = 1000;
const MAX_PAGES = 5;

interface FoundLot {
  lotId: string;
  code: string;
  item: { sku: string; name: string };
  kitchen: string;
  receivedAt: string;
}

/** Distinct lots from the receipts, newest first; with `match`, only codes containing it. */
async function receivedLots(user: CurrentUser, match: string | null, want: number): Promise<{ lots: FoundLot[]; complete: boolean }> {
  const seen = new Map<string, FoundLot>();
  let cursor: string | undefined;
  for (let page = 0; page < (match ? MAX_PAGES : 1); page++) {
    const { movements, nextCursor } = await listMovements(user, { kind: "receipt", limit: match ? PAGE : 100, format: "json", cursor });
    for (const m of movements) {
      if (seen.has(m.lot.id)) continue;
      if (match && !m.lot.code.toLowerCase().includes(match)) continue;
      seen.set(m.lot.id, { lotId: m.lot.id, code: m.lot.code, item: { sku: m.item.sku, name: m.item.name }, kitchen: m.kitchen.code, receivedAt: m.occurredAt });
    }
    if (!nextCursor || seen.size >= want) return { lots: [...seen.values()].slice(0, want), complete: !nextCursor };
    cursor = nextCursor;
  }
  return { lots: [...seen.values()].slice(0, want), complete: false };
}

export default async function TracePage({ searchParams }: { searchParams: Promise<{ q?: string | string[] }> }) {
  const user = await requireUser();
  if (!canSomewhere(user, "planning.read")) notFound();
  const raw = (await searchParams).q;
  const q = (typeof raw === "string" ? raw : "").trim().slice(0, 80);
  const match = q ? q.toLowerCase() : null;

  const [produced, held] = await Promise.all([listBatches(user, { status: "produced" }), listBatches(user, { status: "on_hold" })]);
  const made = [...produced, ...held]
    .filter((b): b is Batch & { production: NonNullable<Batch["production"]> } => b.production !== null)
    .sort((a, b) => b.production.producedAt.localeCompare(a.production.producedAt));
  const batches = (match ? made.filter((b) => b.production.batchCode.toLowerCase().includes(match)) : made).slice(0, match ? 50 : RECENT);
  const found = canSomewhere(user, "stock.read") ? await receivedLots(user, match, match ? 50 : RECENT) : { lots: [], complete: true };

  return (
    <div className="space-y-6">
      <div className="[&>header]:mb-0">
        <PageHeader
          title="Traceability"
          description="For a recall: a lot forward to the batches that used it, or a batch back to every lot that went in. Each trace prints and downloads as CSV."
        />
      </div>

      <form method="get" action="/planning/trace" role="search" aria-label="Find a lot or batch" className="panel flex flex-wrap items-end gap-3 px-4 py-4">
        <div className="min-w-[16rem] flex-1">
          <label htmlFor="trace-q" className="field-label">Lot code or batch code</label>
          <input id="trace-q" name="q" type="search" defaultValue={q} className="field-input" autoComplete="off" aria-describedby="trace-q-hint" />
          <p id="trace-q-hint" className="mt-1 text-sm text-brine">Part of a code is enough, e.g. the supplier&rsquo;s lot number or the recipe code and day of a batch.</p>
        </div>
        <button type="submit" className="btn-primary mb-7">
          <Search aria-hidden className="h-5 w-5" /> Find
        </button>
        {q ? <Link href="/planning/trace" className="btn-quiet mb-7">Clear</Link> : null}
      </form>

      {match && batches.length === 0 && found.lots.length === 0 ? (
        <EmptyState title={`No lot or batch code contains “${q}”`}>
          <p>Check the code on the label or the delivery note. Lots are found from their receipts; batches once production is recorded on the batch sheet.</p>
        </EmptyState>
      ) : null}

      {!match || found.lots.length ? (
        <section aria-labelledby="lots-heading" className="space-y-2">
          <h2 id="lots-heading" className="text-xl font-semibold">{match ? "Lots" : "Lots received lately"}</h2>
          {found.lots.length ? (
            <DataTable caption={match ? `Lots whose code contains ${q}` : "Lots received lately"}>
              <THead>
                <Th>Lot</Th>
                <Th>Item</Th>
                <Th>Received</Th>
                <Th>Into</Th>
              </THead>
              <TBody>
                {found.lots.map((l) => (
                  <tr key={l.lotId}>
                    <RowHeader>
                      <Link href={`/planning/trace/lots/${l.lotId}`} className="num whitespace-nowrap text-paprika underline-offset-2 hover:underline print:text-pepper">{l.code}</Link>
                    </RowHeader>
                    <Td>{l.item.sku}<span className="block text-sm text-brine">{l.item.name}</span></Td>
                    <Td className="num whitespace-nowrap text-sm">{momentText(l.receivedAt, user.timeZone)}</Td>
                    <Td className="text-sm">{l.kitchen}</Td>
                  </tr>
                ))}
              </TBody>
            </DataTable>
          ) : (
            <p className="panel px-4 py-3 text-brine">Nothing has been received yet: lots start with a receipt under Stock.</p>
          )}
          {match && !found.complete ? <p className="text-sm text-brine">Only the latest {PAGE * MAX_PAGES} receipts were searched: type more of the code to narrow it.</p> : null}
        </section>
      ) : null}

      {!match || batches.length ? (
        <section aria-labelledby="batches-heading" className="space-y-2">
          <h2 id="batches-heading" className="text-xl font-semibold">{match ? "Batches" : "Batches made lately"}</h2>
          {batches.length ? (
            <DataTable caption={match ? `Batches whose code contains ${q}` : "Batches made lately"}>
              <THead>
                <Th>Batch code</Th>
                <Th>Recipe</Th>
                <Th>Kitchen</Th>
                <Th>Made</Th>
                <Th>Status</Th>
              </THead>
              <TBody>
                {batches.map((b) => (
                  <tr key={b.id}>
                    <RowHeader>
                      <Link href={`/planning/trace/batches/${b.id}`} className="num whitespace-nowrap text-paprika underline-offset-2 hover:underline print:text-pepper">{b.production.batchCode}</Link>
                    </RowHeader>
                    <Td>{b.recipe.name}<span className="block text-sm text-brine">{b.recipe.code} · version {b.recipe.version}</span></Td>
                    <Td className="text-sm">{b.kitchen.name}</Td>
                    <Td className="num whitespace-nowrap text-sm">{momentText(b.production.producedAt, user.timeZone)}</Td>
                    <Td><StatusBadge status={b.status} /></Td>
                  </tr>
                ))}
              </TBody>
            </DataTable>
          ) : (
            <p className="panel px-4 py-3 text-brine">No batch has been made yet: record production on a batch sheet to give it a batch code.</p>
          )}
        </section>
      ) : null}
    </div>
  );
}
