"use client";

// The usage trend drawn with recharts: one stacked bar per month, a segment per category. The
// figures arrive as exact decimal strings; they become numbers here only to size the bars, and the
// tooltip shows the exact strings again. The table under the chart (panels.tsx) carries the same
// figures for screen readers and for reading off, so the drawing itself is hidden from them.
import { Bar, BarChart, CartesianGrid, Legend, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";
import { amountText } from "@/components/purchasing/order-format";
import type { UsageMonth } from "@/lib/data/dashboard";

type Category = "cure" | "casing" | "spice" | "ingredient";

// tailwind.config.ts tokens: cure marks curing salts (it IS their series here); smoke, paprika and
// brine tell the others apart, and the legend names every one (colour is never the only sign).
// Stacked from the bottom in this order, so the thin cure segment sits on top where it shows.
const SERIES: { key: Category; colour: string }[] = [
  { key: "casing", colour: "#2A2623" },
  { key: "spice", colour: "#AE3F1A" },
  { key: "ingredient", colour: "#56646F" },
  { key: "cure", colour: "#A8225A" },
];

/** The legend in the table's column order. */
const LEGEND_ORDER: Category[] = ["cure", "casing", "spice", "ingredient"];

const monthFormat = new Intl.DateTimeFormat("en-GB", { timeZone: "UTC", month: "short" });
const yearFormat = new Intl.DateTimeFormat("en-GB", { timeZone: "UTC", month: "short", year: "numeric" });

function axisMoney(currency: string) {
  let f: Intl.NumberFormat;
  try {
    f = new Intl.NumberFormat("en-GB", { style: "currency", currency, notation: "compact", maximumFractionDigits: 1 });
  } catch {
    f = new Intl.NumberFormat("en-GB", { notation: "compact", maximumFractionDigits: 1 });
  }
  return (v: number) => f.format(v);
}

export function UsageChart({ months, currency, labels }: { months: UsageMonth[]; currency: string; labels: Record<Category, string> }) {
  // numbers for drawing only; `exact` keeps the strings for the tooltip
  const data = months.map((m) => ({
    label: monthFormat.format(new Date(`${m.month}-01T00:00:00Z`)),
    title: yearFormat.format(new Date(`${m.month}-01T00:00:00Z`)),
    cure: Number(m.cure),
    casing: Number(m.casing),
    spice: Number(m.spice),
    ingredient: Number(m.ingredient),
    exact: m,
  }));
  return (
    <div aria-hidden="true" className="h-[260px] w-full min-w-0">
      <ResponsiveContainer width="100%" height="100%">
        <BarChart data={data} margin={{ top: 8, right: 8, bottom: 0, left: 0 }} accessibilityLayer={false}>
          <CartesianGrid vertical={false} stroke="#E4DDD2" />
          <XAxis dataKey="label" tickLine={false} axisLine={{ stroke: "#C9D1D8" }} tick={{ fill: "#56646F", fontSize: 13 }} />
          <YAxis tickFormatter={axisMoney(currency)} tickLine={false} axisLine={false} width={64} tick={{ fill: "#56646F", fontSize: 13 }} />
          <Tooltip
            cursor={{ fill: "#F1ECE4" }}
            labelFormatter={(_, payload) => (payload?.[0]?.payload as { title?: string } | undefined)?.title ?? ""}
            formatter={(_value, name, item) => {
              const key = item.dataKey as Category;
              const exact = (item.payload as { exact: UsageMonth }).exact;
              return [amountText(exact[key], currency), name];
            }}
          />
          <Legend iconType="square" itemSorter={(item) => LEGEND_ORDER.indexOf(item.dataKey as Category)} wrapperStyle={{ fontSize: 14, color: "#1F1A17" }} />
          {SERIES.map((s) => (
            <Bar key={s.key} dataKey={s.key} name={labels[s.key]} stackId="usage" fill={s.colour} stroke="#FFFFFF" strokeWidth={1} isAnimationActive={false} maxBarSize={56} />
          ))}
        </BarChart>
      </ResponsiveContainer>
    </div>
  );
}
