// The little markdown the OpenAPI document's descriptions use: "## " headings, "- " bullets,
// paragraphs, **bold** and `code`. Anything else shows as plain text (never as HTML).
import { Fragment } from "react";

function Inline({ text }: { text: string }) {
  const parts = text.split(/(\*\*[^*]+\*\*|`[^`]+`)/g);
  return (
    <>
      {parts.map((part, i) =>
        part.startsWith("**") && part.endsWith("**") && part.length > 4 ? (
          <strong key={i} className="font-semibold text-pepper">{part.slice(2, -2)}</strong>
        ) : part.startsWith("`") && part.endsWith("`") && part.length > 2 ? (
          <code key={i} className="rounded bg-salt-deep px-1 font-mono text-[0.9em] text-pepper">{part.slice(1, -1)}</code>
        ) : (
          <Fragment key={i}>{part}</Fragment>
        ),
      )}
    </>
  );
}

type Block = { kind: "h"; text: string } | { kind: "p"; text: string } | { kind: "ul"; items: string[] };

function blocks(text: string): Block[] {
  const out: Block[] = [];
  for (const chunk of text.split(/\n{2,}/)) {
    const lines = chunk.split("\n").filter((l) => l.trim() !== "");
    if (lines.length === 0) continue;
    if (lines.length === 1 && lines[0]!.startsWith("## ")) out.push({ kind: "h", text: lines[0]!.slice(3) });
    else if (lines.every((l) => l.startsWith("- "))) out.push({ kind: "ul", items: lines.map((l) => l.slice(2)) });
    else out.push({ kind: "p", text: lines.join(" ") });
  }
  return out;
}

export function DocText({ text, className }: { text: string; className?: string }) {
  return (
    <div className={className}>
      {blocks(text).map((b, i) =>
        b.kind === "h" ? (
          <h3 key={i} className="mt-4 text-lg font-semibold first:mt-0">{b.text}</h3>
        ) : b.kind === "ul" ? (
          <ul key={i} className="mt-2 list-disc space-y-1.5 pl-5 first:mt-0">
            {b.items.map((item, j) => <li key={j}><Inline text={item} /></li>)}
          </ul>
        ) : (
          <p key={i} className="mt-2 first:mt-0"><Inline text={b.text} /></p>
        ),
      )}
    </div>
  );
}
