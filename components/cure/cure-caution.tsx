// The caution shown wherever cure is (trade-facts §9): nitrite is toxic in overdose, cure is kept
// labelled and apart, and the product's limits are planning defaults under local rules.
// The text lives in lib/cure (the cure calculator's API returns it too).
import { TriangleAlert } from "lucide-react";
import { CURE_CAUTION } from "@/lib/cure/caution";

export { CURE_CAUTION };

export function CureCaution({ className = "" }: { className?: string }) {
  return (
    <aside
      aria-label="Cure caution"
      className={`flex items-start gap-2 rounded-md border border-cure-edge bg-cure-soft px-3 py-2 text-sm text-pepper ${className}`}
    >
      <TriangleAlert aria-hidden className="mt-0.5 h-4 w-4 shrink-0 text-cure" />
      <p>
        <strong className="font-semibold text-cure">Cure caution. </strong>
        {CURE_CAUTION}
      </p>
    </aside>
  );
}
