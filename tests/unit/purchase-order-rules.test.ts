// Purchase orders: the status rules, and the PDF/CSV the supplier receives. The PDF is read back
// with pdfjs-dist (Mozilla's PDF reader, an outside implementation) and the CSV with papaparse,
// so the documents are checked by something other than the code that wrote them.
import Papa from "papaparse";
import { getDocument } from "pdfjs-dist/legacy/build/pdf.mjs";
import { describe, expect, it } from "vitest";
import { orderCsv, orderPdf, type OrderDocument } from "@/lib/purchasing/order-documents";
import { OrderStepError, assertStep, outstanding, statusAfterReceipt } from "@/lib/purchasing/order-status";

describe("order steps", () => {
  it("follows draft -> approved -> sent, and refuses steps out of order with a sentence", () => {
    expect(() => assertStep("approve", "draft")).not.toThrow();
    expect(() => assertStep("send", "approved")).not.toThrow();
    expect(() => assertStep("send", "draft")).toThrow(/An order that is draft cannot be sent/);
    expect(() => assertStep("approve", "sent")).toThrow(OrderStepError);
    expect(() => assertStep("edit", "approved")).toThrow(/cannot be changed/);
    expect(() => assertStep("close_short", "partly_received")).not.toThrow();
    expect(() => assertStep("close_short", "draft")).toThrow(/cannot be closed short/);
  });

  it("cancels before anything arrives, never after", () => {
    expect(() => assertStep("cancel", "sent", false)).not.toThrow();
    expect(() => assertStep("cancel", "sent", true)).toThrow(/close it short instead/);
    expect(() => assertStep("cancel", "partly_received")).toThrow(/close it short instead/);
    expect(() => assertStep("cancel", "received")).toThrow(/cannot be cancelled/);
    expect(() => assertStep("cancel", "closed_short")).toThrow(OrderStepError);
  });

  it("is received when every line has what it ordered (over-delivery counts as complete)", () => {
    expect(statusAfterReceipt([{ ordered: "10", received: "10" }, { ordered: "5", received: "6" }])).toBe("received");
    expect(statusAfterReceipt([{ ordered: "10", received: "9.999" }, { ordered: "5", received: "5" }])).toBe("partly_received");
    expect(outstanding({ ordered: "10", received: "9.25" }).toString()).toBe("0.75");
    expect(outstanding({ ordered: "10", received: "12" }).toString()).toBe("0");
  });
});

const doc: OrderDocument = {
  number: "PO-2026-0042",
  companyName: "Quillmoor Provisions Co.",
  supplierName: "Alder Spice Co",
  supplierContact: "Rowan Vale",
  supplierEmail: "orders@alder.test",
  deliverTo: { name: "Quillmoor Yard", address: "4 Tannery Row\nQuillmoor" },
  orderedOn: "2026-12-02",
  deliverBy: "2026-12-09",
  currency: "USD",
  lines: [
    { lineNo: 1, sku: "HOG-32-35", description: "Hog casings 32-35 mm, salted", packLabel: "bundle of 5 hanks", packs: "2", packPrice: "189.50", lineTotal: "379.00" },
    { lineNo: 2, sku: "=HYPERLINK(\"x\")", description: "Cure #1 (6.25 % NaNO₂) → sealed", packLabel: "5 kg pail", packs: "1", packPrice: "31.20", lineTotal: "31.20" },
  ],
  total: "410.20",
  notes: "Deliver before 10:00.\nKeep cure apart from salt.",
  approvedBy: "Mara Holt",
};

async function pdfText(bytes: Uint8Array): Promise<string> {
  const pdf = await getDocument({ data: bytes, useSystemFonts: false, isEvalSupported: false, verbosity: 0 }).promise;
  let out = "";
  for (let p = 1; p <= pdf.numPages; p++) {
    const content = await (await pdf.getPage(p)).getTextContent();
    out += content.items.map((i) => ("str" in i ? i.str : "")).join(" ") + "\n";
  }
  return out;
}

describe("order documents", () => {
  it("the PDF reads back (pdfjs-dist) with the number, supplier, lines and total; unencodable characters become ?", async () => {
    const bytes = await orderPdf(doc);
    expect(Buffer.from(bytes.subarray(0, 5)).toString()).toBe("%PDF-");
    const text = await pdfText(bytes);
    for (const s of ["Purchase order", "PO-2026-0042", "Alder Spice Co", "Quillmoor Yard", "HOG-32-35", "bundle of 5 hanks", "379.00", "410.20 USD", "Approved by Mara Holt", "Keep cure apart from salt."]) {
      expect(text).toContain(s);
    }
    expect(text).toMatch(/NaNO\? \) \? sealed|NaNO\?\) \? sealed/);
  });

  it("the same order gives the same PDF bytes", async () => {
    expect(Buffer.from(await orderPdf(doc)).equals(Buffer.from(await orderPdf(doc)))).toBe(true);
  });

  it("a long order runs onto more pages", async () => {
    const many = { ...doc, lines: Array.from({ length: 120 }, (_, i) => ({ ...doc.lines[0]!, lineNo: i + 1 })) };
    const pdf = await getDocument({ data: await orderPdf(many), verbosity: 0 }).promise;
    expect(pdf.numPages).toBeGreaterThan(1);
    expect(await pdfText(await orderPdf(many))).toContain("120");
  });

  it("the CSV parses back (papaparse) line for line, with formula-like text neutralised", () => {
    const parsed = Papa.parse<Record<string, string>>(orderCsv(doc), { header: true, skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    expect(parsed.data).toHaveLength(2);
    expect(parsed.data[0]).toMatchObject({ order_number: "PO-2026-0042", line: "1", supplier_sku: "HOG-32-35", packs: "2", pack_price: "189.50", line_total: "379.00", currency: "USD", deliver_by: "2026-12-09" });
    expect(parsed.data[1]!.supplier_sku).toBe("'=HYPERLINK(\"x\")");
  });
});
