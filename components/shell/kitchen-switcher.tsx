"use client";

import { useTransition } from "react";
import { chooseKitchenAction } from "@/app/(app)/actions";

export function KitchenSwitcher({ kitchens, currentId }: { kitchens: { id: string; code: string; name: string }[]; currentId: string | null }) {
  const [pending, start] = useTransition();
  if (kitchens.length === 0) return <span className="text-sm text-brine">No kitchen assigned</span>;
  return (
    <label className="flex items-center gap-2 text-sm">
      <span className="sr-only font-semibold text-brine xl:not-sr-only">Kitchen</span>
      <select
        className="field-input min-w-[200px] py-0 font-semibold"
        value={currentId ?? ""}
        disabled={pending}
        onChange={(e) => start(() => chooseKitchenAction(e.target.value))}
      >
        {kitchens.map((k) => (
          <option key={k.id} value={k.id}>
            {k.code} · {k.name}
          </option>
        ))}
      </select>
    </label>
  );
}
