"use client";

import { Printer } from "lucide-react";

export function PrintButton() {
  return (
    <button type="button" className="btn-primary print:hidden" onClick={() => window.print()}>
      <Printer aria-hidden className="h-5 w-5" />
      Print
    </button>
  );
}
