/**
 * The second thread of a load's preparation (prepare.ts): receives batches of rows and
 * applies them to the two builders in arrival order; on `finish` builds both files under
 * temporary names (or takes the ones built ahead, on `presort` with `ahead`), writes its
 * outcome (a short JSON document) into the shared result buffer and sets the shared flag the
 * load's thread waits on (`Atomics.notify`); on `discard` (the load failed) deletes the files
 * built ahead and answers the same way.
 */
import { parentPort, workerData } from "node:worker_threads";
import { PrepareCore, type AheadInput, type PrepareInput, type PrepareOutput } from "./prepare.js";

const { flag: flagBuffer, result: resultBuffer } = workerData as { flag: SharedArrayBuffer; result: SharedArrayBuffer };
const flag = new Int32Array(flagBuffer);
const result = new Uint8Array(resultBuffer);
const core = new PrepareCore();

function answer(out: PrepareOutput): void {
  let bytes = Buffer.from(JSON.stringify(out), "utf8");
  if (bytes.length > result.length) bytes = Buffer.from(JSON.stringify({ ok: false, reason: "the preparation's result did not fit its buffer", stepMs: {}, ms: out.ms }), "utf8");
  result.set(bytes);
  Atomics.store(flag, 1, bytes.length);
  Atomics.store(flag, 0, 1);
  Atomics.notify(flag, 0);
}

parentPort!.on("message", (m: { index?: Int32Array; text?: unknown[]; presort?: true; ahead?: AheadInput; finish?: PrepareInput; discard?: true }) => {
  try {
    if (m.index) core.indexRows(m.index, m.index.length / 4);
    else if (m.presort) {
      core.presort();
      if (m.ahead) core.buildAhead(m.ahead);
    } else if (m.text) core.textRows(m.text);
    else if (m.finish) answer(core.build(m.finish));
    else if (m.discard) {
      core.discardAhead();
      answer({ ok: false, reason: "the load failed", stepMs: {}, ms: 0 });
    }
  } catch (e) {
    answer({ ok: false, reason: (e as Error).message, stepMs: {}, ms: 0 });
  }
});
