"use client";

import { QueryClient, QueryClientProvider } from "@tanstack/react-query";
import { useState, type ReactNode } from "react";
import { z } from "zod";

// zod compiles object parsers with `new Function` when it can, and probes for that by trying eval; under the app's
// Content-Security-Policy (no 'unsafe-eval') the probe is a reported violation. Parsing without it is just as correct.
z.config({ jitless: true });

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
