// The mark of a curing salt: the trade's pink, an icon AND the word, so it never rests on colour
// alone. The cure colour is used for nothing else.
import { TriangleAlert } from "lucide-react";

export function CureMarker({ className = "" }: { className?: string }) {
  return (
    <span
      className={`inline-flex items-center gap-1 whitespace-nowrap rounded-full border border-cure-edge bg-cure-soft px-2.5 py-0.5 text-sm font-semibold text-cure ${className}`}
    >
      <TriangleAlert aria-hidden className="h-3.5 w-3.5" />
      Cure
    </span>
  );
}
