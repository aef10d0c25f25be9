// A batch's status and its shortage, each as a word with an icon (colour is only the third signal).
import { Ban, CalendarClock, CheckCircle2, Lock, PauseCircle, TriangleAlert } from "lucide-react";
import { Badge } from "@/components/ui/badge";
import type { BatchStatus } from "@/lib/queries/planning";

const STATUS: Record<BatchStatus, { word: string; tone: "neutral" | "herb" | "amber" | "ember"; icon: React.ReactNode }> = {
  planned: { word: "Planned", tone: "neutral", icon: <CalendarClock /> },
  reserved: { word: "Reserved", tone: "herb", icon: <Lock /> },
  produced: { word: "Produced", tone: "neutral", icon: <CheckCircle2 /> },
  on_hold: { word: "On hold", tone: "amber", icon: <PauseCircle /> },
  cancelled: { word: "Cancelled", tone: "neutral", icon: <Ban /> },
};

export const statusWord = (s: BatchStatus) => STATUS[s].word;

export function StatusBadge({ status }: { status: BatchStatus }) {
  const s = STATUS[status];
  return <Badge tone={s.tone} icon={s.icon}>{s.word}</Badge>;
}

export const shortWords = (n: number) => `${n} ${n === 1 ? "line" : "lines"} short`;

/** "2 lines short" on an open batch; "Nothing short" on a planned batch that can be reserved. */
export function ShortageMarker({ status, shortLines }: { status: BatchStatus; shortLines: number }) {
  if (status !== "planned" && status !== "reserved") return null;
  if (shortLines > 0) return <Badge tone="ember" icon={<TriangleAlert />}>{shortWords(shortLines)}</Badge>;
  if (status === "reserved") return null;
  return <Badge tone="herb" icon={<CheckCircle2 />}>Nothing short</Badge>;
}
