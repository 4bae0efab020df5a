/**
 * Writing a report file (`--out FILE`) atomically: the text goes to a temporary file in the
 * same folder, which is then renamed over the target (rename is atomic within one file
 * system, POSIX rename(2)). A reader never sees half a report; on any error the temporary
 * file is removed and the target is left as it was.
 */
import { closeSync, fsyncSync, openSync, renameSync, statSync, unlinkSync, writeSync } from "node:fs";
import { basename, dirname, join } from "node:path";
import { randomBytes } from "node:crypto";
import { TiepointError } from "../model/index.js";

function reason(e: unknown): string {
  const err = e as { code?: string; message?: string };
  switch (err.code) {
    case "ENOENT":
      return "its folder does not exist";
    case "EACCES":
    case "EPERM":
      return "permission denied";
    case "EROFS":
      return "the file system is read-only";
    case "ENOSPC":
      return "no space left on the device";
    case "EISDIR":
      return "it is a folder";
    default:
      return err.message ?? String(e);
  }
}

/** Checks early (before long work) that `path` names a file in an existing folder; a `cli/out` TiepointError if not. */
export function checkOutTarget(path: string): void {
  try {
    if (statSync(path, { throwIfNoEntry: false })?.isDirectory()) throw Object.assign(new Error("is a folder"), { code: "EISDIR" });
    if (!statSync(dirname(path)).isDirectory()) throw Object.assign(new Error("not a folder"), { code: "ENOENT" });
  } catch (e) {
    throw new TiepointError("cli/out", `cannot write the report: ${reason(e)}`, { file: path });
  }
}

/** Writes `text` to `path` atomically; throws a one-line `cli/out` TiepointError naming the file. */
export function writeFileAtomic(path: string, text: string): void {
  checkOutTarget(path);
  const dir = dirname(path);
  const tmp = join(dir, `.${basename(path)}.${process.pid}.${randomBytes(4).toString("hex")}.tmp`);
  let fd: number | undefined;
  try {
    fd = openSync(tmp, "wx", 0o644);
    writeSync(fd, text);
    fsyncSync(fd);
    closeSync(fd);
    fd = undefined;
    renameSync(tmp, path);
  } catch (e) {
    if (fd !== undefined) {
      try {
        closeSync(fd);
      } catch {
        /* already closed */
      }
    }
    try {
      unlinkSync(tmp);
    } catch {
      /* never created */
    }
    throw new TiepointError("cli/out", `cannot write the report: ${reason(e)}`, { file: path });
  }
}
