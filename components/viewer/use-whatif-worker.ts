"use client";
// The what-if worker of a revision, started on the first question (not when the panel opens): it needs the whole
// stored revision (model and design-format results), the one large download the viewer leaves out until a what-if
// asks for it (issue 13: bytes before the first drawn roof). Terminated on clean-up.
import { useQueryClient } from "@tanstack/react-query";
import { useEffect, useRef } from "react";
import type { DesignStandard } from "@/lib/review/design-checks/types";
import { fetchFullRevision } from "./viewed-revision";
import type { WhatIfAnswer, WhatIfMessage, WhatIfReply, WhatIfRequest } from "./whatif-protocol";

type Pending = Map<number, { resolve: (a: WhatIfAnswer) => void; reject: (e: Error) => void }>;

/** Query key of the whole stored revision (fetched once, for the what-ifs). */
const fullRevisionKey = (projectId: string, number: number) => ["projects", projectId, "models", number, "full"] as const;

export function useWhatIfWorker(projectId: string, number: number, standard: DesignStandard | null) {
  const queryClient = useQueryClient();
  const started = useRef<Promise<Worker> | null>(null);
  const pending = useRef<Pending>(new Map());
  const nextId = useRef(1);

  useEffect(() => {
    const waiting = pending.current;
    return () => {
      void started.current?.then((w) => w.terminate(), () => undefined);
      started.current = null;
      for (const entry of waiting.values()) entry.reject(new Error("The what-if engine was stopped."));
      waiting.clear();
    };
  }, [projectId, number, standard]);

  const start = (design: DesignStandard): Promise<Worker> => {
    started.current ??= (async () => {
      const { model, result } = await queryClient.fetchQuery({ queryKey: fullRevisionKey(projectId, number), queryFn: () => fetchFullRevision(projectId, number), staleTime: Infinity });
      const w = new Worker(new URL("./whatif.worker.ts", import.meta.url), { type: "module" });
      w.onmessage = (event: MessageEvent<WhatIfReply>) => {
        const reply = event.data;
        const entry = pending.current.get(reply.id);
        pending.current.delete(reply.id);
        if (!entry) return;
        if (reply.ok) entry.resolve(reply.answer);
        else entry.reject(new Error(reply.error));
      };
      w.postMessage({ id: 0, request: { kind: "init", model, result, standard: design } } satisfies WhatIfMessage);
      return w;
    })();
    // A failed start (the download failed) is tried again on the next question.
    started.current.catch(() => (started.current = null));
    return started.current;
  };

  const ask = async (request: WhatIfRequest): Promise<WhatIfAnswer> => {
    if (!standard) throw new Error("The what-if engine needs the revision's review.");
    const w = await start(standard);
    return new Promise((resolve, reject) => {
      const id = nextId.current++;
      pending.current.set(id, { resolve, reject });
      w.postMessage({ id, request } satisfies WhatIfMessage);
    });
  };

  return { ready: standard !== null, ask };
}
