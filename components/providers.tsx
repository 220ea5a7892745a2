"use client";

import { QueryClient, QueryClientProvider } from "@tanstack/react-query";
import { useState, type ReactNode } from "react";

/** The one TanStack Query client of the browser session. */
export function Providers({ children }: { children: ReactNode }) {
  const [client] = useState(
    () =>
      new QueryClient({
        defaultOptions: { queries: { staleTime: 30_000, retry: (count, error) => count < 2 && !(error instanceof Error && "status" in error) } },
      }),
  );
  return <QueryClientProvider client={client}>{children}</QueryClientProvider>;
}
