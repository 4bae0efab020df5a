/** Runs a composition when the compose frame has none yet. */
import { useEffect } from "react";
import type { ComposeFrame, TuiAction } from "../state.js";
import type { TuiEngine } from "../view-types.js";

/** Asks the engine to compose for the frame's entity and dispatches `composed`. */
export function useCompose(engine: { readonly current: TuiEngine | undefined }, frame: ComposeFrame | undefined, dispatch: (a: TuiAction) => void): void {
  const want = frame && frame.view === undefined ? frame.id : undefined;
  useEffect(() => {
    const e = engine.current;
    if (want === undefined || !e) return;
    if (!e.compose) {
      dispatch({ type: "composed", id: want, view: null });
      return;
    }
    e.compose(want).then(
      (view) => dispatch({ type: "composed", id: want, view }),
      () => dispatch({ type: "composed", id: want, view: null }),
    );
  }, [want]); // eslint-disable-line react-hooks/exhaustive-deps
}
