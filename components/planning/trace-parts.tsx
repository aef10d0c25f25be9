// Pieces shared by the traceability pages (a lot forward, a batch back): the toolbar with Print and
// the CSV download, the note that shipments to customers are outside Hank & Lot, and the line a
// printed copy carries. Server-safe except the print button.
import { ArrowLeft, Download, Info } from "lucide-react";
import Link from "next/link";
import type { ReactNode } from "react";
import { PrintButton } from "./print-button";

export function TraceToolbar({ csvHref, csvName, children }: { csvHref: string; csvName: string; children?: ReactNode }) {
  return (
    <div className="flex flex-wrap items-center justify-between gap-3 print:hidden">
      <Link href="/planning/trace" className="btn-quiet">
        <ArrowLeft aria-hidden className="h-5 w-5" /> Traceability
      </Link>
      <div className="flex flex-wrap gap-2">
        {children}
        <a href={csvHref} download={csvName} className="btn-quiet">
          <Download aria-hidden className="h-5 w-5" /> Download CSV
        </a>
        <PrintButton />
      </div>
    </div>
  );
}

/** The API's note: what left the business is not recorded here, follow the batch codes onward. */
export function ShipmentsNote({ note }: { note: string }) {
  return (
    <aside aria-label="Shipments" className="flex items-start gap-2 rounded-md border border-brine-line bg-brine-soft px-4 py-3 text-pepper break-inside-avoid">
      <Info aria-hidden className="mt-0.5 h-5 w-5 shrink-0 text-brine" />
      <p><strong className="font-semibold">Not in this report: shipments to customers. </strong>{note}</p>
    </aside>
  );
}

export function PrintedLine({ printedAt, printedBy }: { printedAt: string; printedBy: string }) {
  return (
    <p className="hidden text-sm text-pepper-soft print:block">
      Printed {printedAt} by {printedBy} from Hank &amp; Lot. Checked by: ______________________
    </p>
  );
}

/** A4 with room at the edges; the shell's rail and header are print:hidden already. */
export function PrintPage() {
  return <style>{"@media print { @page { size: A4; margin: 12mm; } }"}</style>;
}

export function Fact({ label, children }: { label: string; children: ReactNode }) {
  return (
    <div className="panel px-4 py-3 print:rounded-none print:border-pepper/40">
      <dt className="text-sm text-brine">{label}</dt>
      <dd className="mt-0.5 font-semibold">{children}</dd>
    </div>
  );
}
