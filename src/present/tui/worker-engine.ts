/**
 * The worker engine: the Session lives in a worker thread (engine-worker.js), so opening a
 * large catalog or building its relation index never freezes the screen, and progress
 * arrives as messages while the screen keeps painting and reading keys.
 */
import { Worker } from "node:worker_threads";
import type { EngineSource } from "./engine.js";
import type { ComposeView, EntityCard, OpenProgress, TuiEngine, TuiResult } from "./view-types.js";
import type { WorkerReply, WorkerRequest } from "./worker-protocol.js";

/** Opens the engine in a worker thread; resolves when the catalog is open. */
export function workerEngine(source: EngineSource, onProgress?: (p: OpenProgress) => void): Promise<TuiEngine> {
  const worker = new Worker(new URL("./engine-worker.js", import.meta.url), { workerData: { db: source.db, timeLimitMs: source.timeLimitMs } });
  const pending = new Map<number, { resolve: (v: TuiResult | EntityCard | ComposeView | null) => void; reject: (e: Error) => void }>();
  let next = 1;
  const call = (req: WorkerRequest & { id: number }) =>
    new Promise<TuiResult | EntityCard | ComposeView | null>((resolve, reject) => {
      pending.set(req.id, { resolve, reject });
      worker.postMessage(req);
    });
  return new Promise<TuiEngine>((resolve, reject) => {
    worker.on("error", (e) => {
      reject(e);
      for (const p of pending.values()) p.reject(e);
      pending.clear();
    });
    worker.on("message", (m: WorkerReply) => {
      switch (m.type) {
        case "progress":
          onProgress?.(m.progress);
          return;
        case "open-failed":
          void worker.terminate();
          reject(new Error(m.message));
          return;
        case "ready":
          resolve({
            title: m.title,
            ask: (question, pins, top) => call({ op: "ask", id: next++, question, pins, top }) as Promise<TuiResult>,
            card: (entity) => call({ op: "card", id: next++, entity }) as Promise<EntityCard | null>,
            compose: (entity) => call({ op: "compose", id: next++, entity }) as Promise<ComposeView | null>,
            close: () => {
              worker.postMessage({ op: "close" } satisfies WorkerRequest);
              setTimeout(() => void worker.terminate(), 200).unref();
            },
          });
          return;
        case "reply": {
          const p = pending.get(m.id);
          if (!p) return;
          pending.delete(m.id);
          if (m.ok) p.resolve(m.value);
          else p.reject(new Error(m.message));
        }
      }
    });
  });
}
