"use client";
// Starts the what-if worker for a revision (in an effect, terminated on clean-up) and sends it requests.
import { useEffect, useRef, useState } from "react";
import type { AnalysisResult, TrussModel } from "@/lib/analysis";
import type { DesignStandard } from "@/lib/review/design-checks/types";
import type { WhatIfAnswer, WhatIfMessage, WhatIfReply, WhatIfRequest } from "./whatif-protocol";

type Pending = Map<number, { resolve: (a: WhatIfAnswer) => void; reject: (e: Error) => void }>;

export function useWhatIfWorker(model: TrussModel, result: AnalysisResult, standard: DesignStandard | null) {
  const worker = useRef<Worker | null>(null);
  const pending = useRef<Pending>(new Map());
  const nextId = useRef(1);
  const [ready, setReady] = useState(false);

  useEffect(() => {
    if (!standard) return;
    const w = new Worker(new URL("./whatif.worker.ts", import.meta.url), { type: "module" });
    const waiting = pending.current;
    worker.current = w;
    w.onmessage = (event: MessageEvent<WhatIfReply>) => {
      const reply = event.data;
      const entry = waiting.get(reply.id);
      waiting.delete(reply.id);
      if (!entry) return;
      if (reply.ok) entry.resolve(reply.answer);
      else entry.reject(new Error(reply.error));
    };
    const init: WhatIfMessage = { id: 0, request: { kind: "init", model, result, standard } };
    waiting.set(0, { resolve: () => setReady(true), reject: () => setReady(false) });
    w.postMessage(init);
    return () => {
      w.terminate();
      worker.current = null;
      waiting.clear();
      setReady(false);
    };
  }, [model, result, standard]);

  const ask = (request: WhatIfRequest): Promise<WhatIfAnswer> =>
    new Promise((resolve, reject) => {
      const w = worker.current;
      if (!w) return reject(new Error("The what-if engine is not running."));
      const id = nextId.current++;
      pending.current.set(id, { resolve, reject });
      w.postMessage({ id, request } satisfies WhatIfMessage);
    });

  return { ready, ask };
}
