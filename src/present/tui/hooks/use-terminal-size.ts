/** The terminal's size in columns and rows, updated on resize (ink's stdout `resize` event). */
import { useStdout } from "ink";
import { useEffect, useState } from "react";

/** Inputs of {@link useTerminalSize}. */
export interface TerminalSizeOptions {
  /** A fixed width (tests); the terminal's otherwise. */
  readonly columns?: number;
  /** A fixed height (tests); the terminal's otherwise. */
  readonly rows?: number;
}

/** Columns and rows of the terminal. */
export interface TerminalSize {
  readonly columns: number;
  readonly rows: number;
}

/** The terminal size, following resizes. Falls back to 80×24 when the stream has none. */
export function useTerminalSize(options: TerminalSizeOptions = {}): TerminalSize {
  const { stdout } = useStdout();
  const read = (): TerminalSize => ({
    columns: options.columns ?? (stdout.columns || 80),
    rows: options.rows ?? (stdout.rows || 24),
  });
  const [size, setSize] = useState<TerminalSize>(read);
  useEffect(() => {
    const onResize = () => setSize(read());
    stdout.on("resize", onResize);
    onResize();
    return () => {
      stdout.off("resize", onResize);
    };
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [stdout, options.columns, options.rows]);
  return size;
}
