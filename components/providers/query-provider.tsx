"use client";

// One TanStack Query client per browser tab, for the signed-in shell. Client errors (4xx) are the
// person's to fix and are not retried; window focus does not refetch, so a half-typed count or an
// undo history in the stock grid is never swept away by switching apps on a tablet.
import { QueryClient, QueryClientProvider } from "@tanstack/react-query";
import { useState, type ReactNode } from "react";

const isClientError = (e: unknown) => {
  const status = (e as { status?: unknown } | null)?.status;
  return typeof status === "number" && status >= 400 && status < 500;
};

export function QueryProvider({ children }: { children: ReactNode }) {
  const [client] = useState(
    () =>
      new QueryClient({
        defaultOptions: {
          queries: {
            refetchOnWindowFocus: false,
            retry: (failures, error) => !isClientError(error) && failures < 2,
          },
          mutations: { retry: false },
        },
      }),
  );
  return <QueryClientProvider client={client}>{children}</QueryClientProvider>;
}
