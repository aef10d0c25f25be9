// What an importer wants from each row: a list of target fields with their kind. A consumer (the
// price-list import, the delivery import) declares its fields once with defineImportFields; the
// engine reads each mapped cell into the field's kind and names the cell in every error.
// Pure and client-safe (the mapping screen lists the fields and their synonyms).

export type ImportFieldType = "text" | "decimal" | "integer" | "date";

export interface ImportField<K extends string = string> {
  key: K;
  /** How the mapping screen names the field ("Unit price"). */
  label: string;
  type: ImportFieldType;
  /** A row without it is an error (default false: an empty cell reads as null). */
  required?: boolean;
  /** Header names that propose this column on first use; compared without case, spaces, accents or punctuation. */
  synonyms?: readonly string[];
  /** decimal and integer: negative numbers allowed (default false). */
  signed?: boolean;
  /** text: at most this many characters (default 500). */
  maxLength?: number;
}

export function defineImportFields<const K extends string>(fields: readonly ImportField<K>[]): readonly ImportField<K>[] {
  const seen = new Set<string>();
  for (const f of fields) {
    if (seen.has(f.key)) throw new Error(`Import field ${f.key} is defined twice`);
    seen.add(f.key);
  }
  return fields;
}

/** One row as the consumer receives it: every field's value as text (decimals "1234.5", dates "2026-12-02"), null when empty. */
export type ImportRow<K extends string> = { [P in K]: string | null };
