"use client";
// The form inside an edit sheet: submitted by hand to its server action (so a rejected form keeps
// every field as the person left it, instead of React resetting it), without the browser's own
// validation bubbles (the server's messages name the field).
import { startTransition, type ReactNode } from "react";

export function SheetForm({ action, children }: { action: (data: FormData) => void; children: ReactNode }) {
  return (
    <form
      noValidate
      className="flex flex-col gap-5"
      onSubmit={(ev) => {
        ev.preventDefault();
        const data = new FormData(ev.currentTarget);
        startTransition(() => action(data));
      }}
    >
      {children}
    </form>
  );
}
