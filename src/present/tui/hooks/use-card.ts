/** Loads the entity card on top of the card stack when it has no data yet. */
import { useEffect } from "react";
import type { CardFrame, TuiAction } from "../state.js";
import type { TuiEngine } from "../view-types.js";

/** Fetches the top card's data and dispatches `card-loaded`. */
export function useCard(engine: { readonly current: TuiEngine | undefined }, top: CardFrame | undefined, dispatch: (a: TuiAction) => void): void {
  const want = top && top.card === undefined ? top.id : undefined;
  useEffect(() => {
    const e = engine.current;
    if (want === undefined || !e) return;
    e.card(want).then(
      (card) => dispatch({ type: "card-loaded", id: want, card }),
      () => dispatch({ type: "card-loaded", id: want, card: null }),
    );
  }, [want]); // eslint-disable-line react-hooks/exhaustive-deps
}
