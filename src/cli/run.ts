/**
 * The CLI's error boundary: maps a TiepointError to its one-line message and exit status
 * (1 bad input, 2 bad usage); anything else is a bug and is reported as such, briefly.
 */
import { TiepointError, USAGE_CODES } from "../model/index.js";

/** Prints an error the way users should see it and returns the exit status. */
export function reportError(e: unknown): number {
  if (e instanceof TiepointError) {
    const lines = [e, ...e.more].map((x) => `tiepoint: ${x.format()}`);
    process.stderr.write(lines.join("\n") + "\n");
    return USAGE_CODES.has(e.code) ? 2 : 1;
  }
  const err = e as { code?: string; message?: string; path?: string };
  if (err && typeof err.code === "string" && /^(ENOENT|EACCES|EISDIR|ENOSPC|EROFS|EPERM|SQLITE_FULL|SQLITE_READONLY|SQLITE_CANTOPEN|SQLITE_BUSY)/.test(err.code)) {
    process.stderr.write(`tiepoint: ${err.path ? err.path + ": " : ""}${err.message ?? err.code}\n`);
    return 1;
  }
  const msg = e instanceof Error ? e.message : String(e);
  process.stderr.write(`tiepoint: internal error: ${msg}\n(this is a bug in tiepoint; set TIEPOINT_DEBUG=1 for the stack trace)\n`);
  if (process.env.TIEPOINT_DEBUG && e instanceof Error) process.stderr.write(`${e.stack}\n`);
  return 1;
}

/** Runs a command body, turning errors into messages and exit statuses. */
export async function guarded(body: () => void | Promise<void>): Promise<void> {
  try {
    await body();
  } catch (e) {
    process.exitCode = reportError(e);
  }
}
