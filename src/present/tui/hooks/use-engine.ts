/** Opens the engine after the first paint and reports progress, success or failure. */
import { useEffect, useRef } from "react";
import type { OpenProgress, TuiEngine } from "../view-types.js";

/** How to open an engine: called once, with a progress callback. */
export type EngineOpener = (onProgress: (p: OpenProgress) => void) => Promise<TuiEngine>;

/** Callbacks of {@link useEngine}. */
export interface EngineEvents {
  readonly progress: (p: OpenProgress) => void;
  readonly opened: (title: string) => void;
  readonly failed: (message: string) => void;
}

/** The engine once open (a ref, so replies never re-render by themselves). Opens once per mount. */
export function useEngine(open: EngineOpener, on: EngineEvents): { readonly current: TuiEngine | undefined } {
  const engine = useRef<TuiEngine | undefined>(undefined);
  const cbs = useRef(on);
  cbs.current = on;
  const opener = useRef(open);
  useEffect(() => {
    let alive = true;
    opener.current((p) => alive && cbs.current.progress(p)).then(
      (e) => {
        if (!alive) {
          e.close();
          return;
        }
        engine.current = e;
        cbs.current.opened(e.title);
      },
      (err: unknown) => alive && cbs.current.failed(err instanceof Error ? err.message : String(err)),
    );
    return () => {
      alive = false;
      engine.current?.close();
      engine.current = undefined;
    };
    // opened once per mount, whatever the identity of later `open` props
  }, []);
  return engine;
}
