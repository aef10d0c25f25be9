// The purchase order as the supplier receives it: a PDF to read and a CSV to load into their
// system, both made from one OrderDocument. pdf-lib draws with the PDF standard Helvetica, so no
// font is fetched or shipped; characters Helvetica cannot encode become "?".
import { PDFDocument, StandardFonts, rgb, type PDFFont, type PDFPage } from "pdf-lib";
import { toCsv } from "../csv";

export interface OrderDocumentLine {
  lineNo: number;
  sku: string;
  description: string;
  packLabel: string;
  /** packs ordered, a plain decimal string */
  packs: string;
  /** price of one pack, in the order's currency, as shown (e.g. "12.50") */
  packPrice: string;
  lineTotal: string;
}

export interface OrderDocument {
  number: string;
  companyName: string;
  supplierName: string;
  supplierContact: string | null;
  supplierEmail: string | null;
  deliverTo: { name: string; address: string };
  orderedOn: string;
  /** requested delivery date, or null */
  deliverBy: string | null;
  currency: string;
  lines: OrderDocumentLine[];
  total: string;
  notes: string | null;
  approvedBy: string | null;
}

export const ORDER_CSV_COLUMNS = ["order_number", "line", "supplier_sku", "description", "pack", "packs", "pack_price", "line_total", "currency", "deliver_to", "deliver_by"] as const;

export function orderCsv(doc: OrderDocument): string {
  return toCsv(
    ORDER_CSV_COLUMNS,
    doc.lines.map((l) => [doc.number, l.lineNo, l.sku, l.description, l.packLabel, l.packs, l.packPrice, l.lineTotal, doc.currency, doc.deliverTo.name, doc.deliverBy ?? ""]),
  );
}

const PAGE = { width: 595.28, height: 841.89, margin: 48 }; // A4 in points
const INK = rgb(0.13, 0.12, 0.11);
const MUTED = rgb(0.42, 0.39, 0.36);
const RULE = rgb(0.8, 0.77, 0.73);

/** Replaces what the font cannot encode, so a supplier's "µ" or "→" never stops an order going out. */
function encodable(font: PDFFont, text: string): string {
  const supported = new Set(font.getCharacterSet());
  let out = "";
  for (const ch of text.replace(/[\r\n\t]+/g, " ")) out += supported.has(ch.codePointAt(0)!) ? ch : "?";
  return out;
}

/** Cuts text to fit `width` points, ending with "..." when it was cut. */
function fit(font: PDFFont, text: string, size: number, width: number): string {
  let t = encodable(font, text);
  if (font.widthOfTextAtSize(t, size) <= width) return t;
  while (t.length > 0 && font.widthOfTextAtSize(`${t}...`, size) > width) t = t.slice(0, -1);
  return `${t}...`;
}

export async function orderPdf(doc: OrderDocument): Promise<Uint8Array> {
  const pdf = await PDFDocument.create();
  pdf.setTitle(`Purchase order ${doc.number}`);
  pdf.setAuthor(doc.companyName);
  pdf.setCreator("Hank & Lot");
  // a fixed date, so the same order gives the same bytes
  pdf.setCreationDate(new Date(`${doc.orderedOn}T00:00:00Z`));
  pdf.setModificationDate(new Date(`${doc.orderedOn}T00:00:00Z`));
  const regular = await pdf.embedFont(StandardFonts.Helvetica);
  const bold = await pdf.embedFont(StandardFonts.HelveticaBold);

  // columns: line, SKU, description, pack, packs, price, total (x positions, right-aligned numbers)
  const cols = { line: 48, sku: 66, desc: 140, pack: 296, packsRight: 405, priceRight: 470, totalRight: 547 };
  let page: PDFPage = pdf.addPage([PAGE.width, PAGE.height]);
  let y = PAGE.height - PAGE.margin;

  const text = (s: string, x: number, size = 9, font = regular, color = INK) => page.drawText(encodable(font, s), { x, y, size, font, color });
  const right = (s: string, xRight: number, size = 9, font = regular) => {
    const t = encodable(font, s);
    page.drawText(t, { x: xRight - font.widthOfTextAtSize(t, size), y, size, font, color: INK });
  };

  const header = () => {
    text("Purchase order", PAGE.margin, 18, bold);
    right(doc.number, PAGE.width - PAGE.margin, 14, bold);
    y -= 22;
    text(doc.companyName, PAGE.margin, 10, regular, MUTED);
    y -= 26;
  };
  const tableHeader = () => {
    text("#", cols.line, 8, bold, MUTED);
    text("Supplier SKU", cols.sku, 8, bold, MUTED);
    text("Description", cols.desc, 8, bold, MUTED);
    text("Pack", cols.pack, 8, bold, MUTED);
    right("Packs", cols.packsRight, 8, bold);
    right("Pack price", cols.priceRight, 8, bold);
    right(`Total (${doc.currency})`, cols.totalRight, 8, bold);
    y -= 6;
    page.drawLine({ start: { x: PAGE.margin, y }, end: { x: PAGE.width - PAGE.margin, y }, thickness: 0.6, color: RULE });
    y -= 12;
  };

  header();
  const block = (label: string, lines: string[], x: number, top: number) => {
    let yy = top;
    page.drawText(label, { x, y: yy, size: 8, font: bold, color: MUTED });
    yy -= 12;
    for (const l of lines) {
      page.drawText(fit(regular, l, 10, 240), { x, y: yy, size: 10, font: regular, color: INK });
      yy -= 13;
    }
    return yy;
  };
  const top = y;
  const leftEnd = block("To", [doc.supplierName, doc.supplierContact ?? "", doc.supplierEmail ?? ""].filter(Boolean), PAGE.margin, top);
  const rightEnd = block(
    "Deliver to",
    [doc.deliverTo.name, ...doc.deliverTo.address.split(/\r?\n/).filter(Boolean), `Ordered ${doc.orderedOn}`, doc.deliverBy ? `Needed by ${doc.deliverBy}` : ""].filter(Boolean),
    PAGE.width / 2,
    top,
  );
  y = Math.min(leftEnd, rightEnd) - 14;
  tableHeader();

  for (const l of doc.lines) {
    if (y < PAGE.margin + 60) {
      page = pdf.addPage([PAGE.width, PAGE.height]);
      y = PAGE.height - PAGE.margin;
      header();
      tableHeader();
    }
    text(String(l.lineNo), cols.line);
    page.drawText(fit(regular, l.sku, 9, cols.desc - cols.sku - 6), { x: cols.sku, y, size: 9, font: regular, color: INK });
    page.drawText(fit(regular, l.description, 9, cols.pack - cols.desc - 6), { x: cols.desc, y, size: 9, font: regular, color: INK });
    page.drawText(fit(regular, l.packLabel, 9, cols.packsRight - cols.pack - 24), { x: cols.pack, y, size: 9, font: regular, color: INK });
    right(l.packs, cols.packsRight);
    right(l.packPrice, cols.priceRight);
    right(l.lineTotal, cols.totalRight);
    y -= 14;
  }
  page.drawLine({ start: { x: PAGE.margin, y: y + 8 }, end: { x: PAGE.width - PAGE.margin, y: y + 8 }, thickness: 0.6, color: RULE });
  y -= 6;
  text("Order total", cols.priceRight - 80, 10, bold);
  right(`${doc.total} ${doc.currency}`, cols.totalRight, 10, bold);
  y -= 24;
  if (doc.notes) {
    text("Notes", PAGE.margin, 8, bold, MUTED);
    y -= 12;
    for (const para of doc.notes.split(/\r?\n/).slice(0, 8)) {
      page.drawText(fit(regular, para, 9, PAGE.width - 2 * PAGE.margin), { x: PAGE.margin, y, size: 9, font: regular, color: INK });
      y -= 12;
    }
  }
  if (doc.approvedBy) {
    y -= 8;
    text(`Approved by ${doc.approvedBy}`, PAGE.margin, 9, regular, MUTED);
  }
  return pdf.save({ useObjectStreams: false });
}
