/**
 * Key presses as {@link KeyEvent}s. Reads ink's raw input events (one per escape sequence
 * or text run) and parses them with keys.ts, which tells Backspace (0x7f) from Delete
 * (`ESC [3~`), unlike ink's own useInput.
 */
import { useStdin } from "ink";
import { useEffect, useRef } from "react";
import { parseKeys, type KeyEvent } from "../keys.js";

/** Calls `onKey` for every key press while `active`. */
export function useKeys(onKey: (ev: KeyEvent) => void, active = true): void {
  const { setRawMode, internal_eventEmitter: events } = useStdin();
  const handler = useRef(onKey);
  handler.current = onKey;
  useEffect(() => {
    if (!active) return;
    setRawMode(true);
    const onInput = (data: string) => {
      for (const ev of parseKeys(data)) handler.current(ev);
    };
    events.on("input", onInput);
    return () => {
      events.off("input", onInput);
      setRawMode(false);
    };
  }, [active, events, setRawMode]);
}
