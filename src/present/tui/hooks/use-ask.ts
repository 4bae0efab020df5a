/** Runs the pending question of the state on the engine and reports the answer back. */
import { useEffect } from "react";
import type { AskRequest, TuiAction } from "../state.js";
import type { TuiEngine } from "../view-types.js";

/** Asks `request` (once per sequence number) and dispatches `answered` or `ask-failed`. */
export function useAsk(engine: { readonly current: TuiEngine | undefined }, request: AskRequest | undefined, top: number, dispatch: (a: TuiAction) => void): void {
  useEffect(() => {
    const e = engine.current;
    if (!request || !e) return;
    const seq = request.seq;
    e.ask(request.question, request.pins, top).then(
      (view) => dispatch({ type: "answered", seq, view }),
      (err: unknown) => dispatch({ type: "ask-failed", seq, message: `error: ${err instanceof Error ? err.message : String(err)}` }),
    );
  }, [request?.seq]); // eslint-disable-line react-hooks/exhaustive-deps
}
