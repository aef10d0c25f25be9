// First use of a file layout: propose which column holds each target field from the header names
// (without case, spaces, accents or punctuation: "Unit Price (€)" finds "unit price"), so the
// person only confirms. Pure and client-safe.
import type { ImportField } from "./fields";

/** "Prix unitaire (€)" -> "prixunitaire"; "Größe" -> "grosse"; "N°" -> "no". */
export function normalizeHeader(s: string): string {
  return s
    .normalize("NFKD")
    .replace(/[\u0300-\u036f]/g, "")
    .replace(/ß/g, "ss")
    .replace(/°/g, "o")
    .toLowerCase()
    .replace(/[^a-z0-9]/g, "");
}

export interface MappingProposal<K extends string> {
  /** Ready to save as CsvMapping.columns (by header, or by number where the header is blank or repeated). */
  columns: Partial<Record<K, { header: string } | { column: number }>>;
  matched: { field: K; header: string; column: number }[];
  /** Required fields no column was found for. */
  missingRequired: K[];
  /** Headers no field took (the screen offers them). */
  unusedHeaders: string[];
  /** Said when nothing matched at all: the file is probably not what the person meant to send. */
  problem: string | null;
}

export function proposeMapping<K extends string>(headers: readonly string[], fields: readonly ImportField<K>[]): MappingProposal<K> {
  const norm = headers.map(normalizeHeader);
  const counts = new Map<string, number>();
  for (const h of headers) counts.set(h.trim(), (counts.get(h.trim()) ?? 0) + 1);
  const names = (f: ImportField<K>) => [...new Set([f.key, f.label, ...(f.synonyms ?? [])].map(normalizeHeader).filter((n) => n !== ""))];

  const taken = new Set<number>();
  const chosen = new Map<K, number>();
  // 1. exact names, in the order the fields are declared
  for (const f of fields) {
    const i = norm.findIndex((h, j) => !taken.has(j) && h !== "" && names(f).includes(h));
    if (i >= 0) {
      chosen.set(f.key, i);
      taken.add(i);
    }
  }
  // 2. a header that contains a name ("Price EUR" contains "price"): longest name first
  const candidates: { key: K; column: number; length: number }[] = [];
  for (const f of fields) {
    if (chosen.has(f.key)) continue;
    norm.forEach((h, j) => {
      if (taken.has(j) || h === "") return;
      const best = Math.max(0, ...names(f).filter((n) => n.length >= 3 && h.includes(n)).map((n) => n.length));
      if (best > 0) candidates.push({ key: f.key, column: j, length: best });
    });
  }
  candidates.sort((a, b) => b.length - a.length || a.column - b.column);
  for (const c of candidates) {
    if (chosen.has(c.key) || taken.has(c.column)) continue;
    chosen.set(c.key, c.column);
    taken.add(c.column);
  }

  const columns: MappingProposal<K>["columns"] = {};
  const matched: MappingProposal<K>["matched"] = [];
  for (const f of fields) {
    const i = chosen.get(f.key);
    if (i === undefined) continue;
    const header = headers[i]!.trim();
    columns[f.key] = header !== "" && counts.get(header) === 1 ? { header } : { column: i + 1 };
    matched.push({ field: f.key, header, column: i + 1 });
  }
  const missingRequired = fields.filter((f) => f.required && !chosen.has(f.key)).map((f) => f.key);
  const unusedHeaders = headers.filter((h, j) => !taken.has(j) && h.trim() !== "").map((h) => h.trim());
  const listed = (xs: readonly string[]) => xs.map((x) => `"${x}"`).join(", ");
  const problem = matched.length === 0
    ? `No matching columns: none of this file's columns (${listed(headers.filter((h) => h.trim() !== "")) || "none"}) looks like ${listed(fields.map((f) => f.label))}. Check that this is the right file, or choose the columns by hand.`
    : null;
  return { columns, matched, missingRequired, unusedHeaders, problem };
}
