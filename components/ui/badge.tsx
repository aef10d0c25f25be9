// A small status label: a word and an icon, the colour only as a third signal.
import type { ReactNode } from "react";

const TONES = {
  neutral: "border-brine-line bg-brine-soft text-pepper-soft",
  herb: "border-herb/25 bg-herb-soft text-herb",
  amber: "border-amber/25 bg-amber-soft text-amber",
  ember: "border-ember/25 bg-ember-soft text-ember",
} as const;

export function Badge({ tone = "neutral", icon, children }: { tone?: keyof typeof TONES; icon?: ReactNode; children: ReactNode }) {
  return (
    <span className={`inline-flex items-center gap-1 whitespace-nowrap rounded-full border px-2.5 py-0.5 text-sm font-semibold ${TONES[tone]}`}>
      {icon ? <span aria-hidden className="[&>svg]:h-3.5 [&>svg]:w-3.5">{icon}</span> : null}
      {children}
    </span>
  );
}
