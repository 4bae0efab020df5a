/**
 * The one-line progress bar `check` draws on stderr while it works (only on a terminal):
 * `[#########-----------]  412/1000  41%  3.2 s  eta 4.6 s`. The estimate is the linear one
 * (elapsed / done × remaining), common practice.
 */

/** Options of {@link progressLine}; all optional. */
export interface ProgressOptions {
  /** Characters inside the brackets. @default 24 */
  readonly width?: number;
}

/** Defaults of {@link ProgressOptions}. */
export const PROGRESS_DEFAULTS = { width: 24 } as const;

/** The progress line for `done` of `total` after `elapsedMs` (no line break). */
export function progressLine(done: number, total: number, elapsedMs: number, options: ProgressOptions = {}): string {
  const width = options.width ?? PROGRESS_DEFAULTS.width;
  const share = total > 0 ? Math.min(1, Math.max(0, done / total)) : 1;
  const full = Math.round(share * width);
  const secs = elapsedMs / 1000;
  const eta = done > 0 && done < total ? `  eta ${((secs / done) * (total - done)).toFixed(1)} s` : "";
  const n = String(total).length;
  return `[${"#".repeat(full)}${"-".repeat(width - full)}] ${String(done).padStart(n)}/${total} ${String(Math.round(share * 100)).padStart(3)}%  ${secs.toFixed(1)} s${eta}`;
}
