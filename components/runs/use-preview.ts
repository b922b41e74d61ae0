"use client";
// The run form's live preview: the evaluation bundle — the very file the server's worker threads run — loaded in a
// browser module Worker, so typing never waits on the main thread and mathjs never joins the page's first load.
// Each change posts the inputs; an answer to an older message than the newest is dropped. Inputs asked for before
// the worker has loaded are posted as soon as it says it is ready.
import { useCallback, useEffect, useRef, useState } from "react";
import type { EvaluateResult, EvaluationResponse } from "@/lib/evaluation/protocol";
import type { LibraryEntries } from "@/lib/standards/library-inputs";

/** lib/evaluation/protocol.ts READY_MESSAGE (a unit test keeps the two equal). */
export const WORKER_READY = "evaluation-worker-ready";

export type PreviewState =
  | { status: "loading" }
  | { status: "unavailable"; message: string }
  | { status: "working" }
  | { status: "ready"; result: EvaluateResult };

export function usePreview(bundleUrl: string, source: string, libraries: LibraryEntries) {
  const worker = useRef<Worker | null>(null);
  const ready = useRef(false);
  const latest = useRef(0);
  const pending = useRef<Record<string, string> | null>(null);
  const task = useRef({ source, libraries });
  const [state, setState] = useState<PreviewState>({ status: "loading" });

  useEffect(() => {
    task.current = { source, libraries };
  }, [source, libraries]);

  const post = useCallback((inputs: Record<string, string>) => {
    const id = ++latest.current;
    worker.current?.postMessage({ id, task: "evaluate", ...task.current, inputs });
  }, []);

  useEffect(() => {
    let w: Worker;
    try {
      w = new Worker(bundleUrl, { type: "module", name: "gusset-preview" });
    } catch {
      const timer = setTimeout(() =>
        setState({ status: "unavailable", message: "The preview cannot run in this browser; Run still works." }),
      );
      return () => clearTimeout(timer);
    }
    worker.current = w;
    w.onmessage = (event: MessageEvent<EvaluationResponse | string>) => {
      const data = event.data;
      if (data === WORKER_READY) {
        ready.current = true;
        if (pending.current) {
          setState({ status: "working" });
          post(pending.current);
        }
        return;
      }
      if (typeof data !== "object" || data === null || data.id !== latest.current) return;
      if (!data.ok) setState({ status: "unavailable", message: `The preview stopped: ${data.error}` });
      else setState({ status: "ready", result: data.result as EvaluateResult });
    };
    w.onerror = () => setState({ status: "unavailable", message: "The preview could not load; Run still works." });
    return () => {
      w.terminate();
      worker.current = null;
      ready.current = false;
    };
  }, [bundleUrl, post]);

  /** Ask for a preview of these inputs (the newest wins); before the worker is ready it waits for it. */
  const request = useCallback(
    (inputs: Record<string, string>) => {
      pending.current = inputs;
      if (!ready.current) return;
      setState((previous) => (previous.status === "ready" ? previous : { status: "working" }));
      post(inputs);
    },
    [post],
  );

  return { state, request };
}
