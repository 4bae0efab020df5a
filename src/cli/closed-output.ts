/**
 * A reader that stops early (`tiepoint check … | head`) closes the pipe: the next write to
 * stdout fails with EPIPE. That is not an error of the command: it ends quietly with status 0
 * (common practice for Unix filters, which stop on SIGPIPE; Node ignores SIGPIPE and reports
 * EPIPE as an 'error' event instead, which would print a stack trace when unhandled).
 * Installed once, in main.ts, for stdout and stderr; every writer goes through these streams.
 */

/** The error codes that mean "the reader has gone". */
const GONE = new Set(["EPIPE", "ERR_STREAM_DESTROYED", "ECONNRESET"]);

/** True when `e` says the other end of the stream has closed. */
export function readerGone(e: unknown): boolean {
  const code = (e as { code?: unknown } | null)?.code;
  return typeof code === "string" && GONE.has(code);
}

/**
 * Ends the process quietly (status 0) when stdout's reader has gone; a closed stderr is
 * ignored (messages have nowhere to go, the command's own status stands). Any other stream
 * error is rethrown.
 */
export function endQuietlyWhenReaderGone(stdout: NodeJS.WriteStream = process.stdout, stderr: NodeJS.WriteStream = process.stderr): void {
  stdout.on("error", (e: unknown) => {
    if (!readerGone(e)) throw e;
    process.exit(0);
  });
  stderr.on("error", (e: unknown) => {
    if (!readerGone(e)) throw e;
  });
}
