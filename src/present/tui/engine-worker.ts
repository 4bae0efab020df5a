/**
 * The worker-thread side of the worker engine: opens the Session off the screen's thread,
 * reports progress, and answers `ask` / `card` requests. Started by worker-engine.ts.
 */
import { parentPort, workerData } from "node:worker_threads";
import { TiepointError } from "../../model/index.js";
import { Session } from "../../pipeline/index.js";
import { SessionEngineCore, progressOf, titleOf } from "./engine.js";
import type { WorkerReply, WorkerRequest } from "./worker-protocol.js";

const port = parentPort;
if (!port) throw new TypeError("present/tui/engine-worker: must run as a worker thread");

const send = (m: WorkerReply) => port.postMessage(m);
const messageOf = (e: unknown) => (e instanceof TiepointError ? e.format() : e instanceof Error ? e.message : String(e));

const { db, timeLimitMs } = (workerData as { db?: string; timeLimitMs?: number } | undefined) ?? {};
let core: SessionEngineCore | undefined;
try {
  const session = Session.open({ ...(db !== undefined ? { db } : {}), onProgress: (p) => send({ type: "progress", progress: progressOf(p) }) });
  core = new SessionEngineCore(session, titleOf(session, db), timeLimitMs);
  send({ type: "ready", title: core.title });
} catch (e) {
  send({ type: "open-failed", message: messageOf(e) });
}

const handle = async (m: WorkerRequest): Promise<void> => {
  if (m.op === "close") {
    core?.session.close();
    port.close();
    return;
  }
  if (!core) {
    send({ type: "reply", id: m.id, ok: false, message: "the catalog is not open" });
    return;
  }
  try {
    const value = m.op === "ask" ? await core.ask(m.question, m.pins, m.top) : m.op === "compose" ? await core.compose(m.entity) : await core.card(m.entity);
    send({ type: "reply", id: m.id, ok: true, value });
  } catch (e) {
    send({ type: "reply", id: m.id, ok: false, message: messageOf(e) });
  }
};

// one request at a time, in order (an attached catalog's requests await the store; the session's pulls must not interleave)
let queue: Promise<void> = Promise.resolve();
port.on("message", (m: WorkerRequest) => {
  queue = queue.then(() => handle(m));
});
