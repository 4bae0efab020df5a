/**
 * The one error class of tiepoint for a user's mistake or an environment problem.
 *
 * `code` names the stage and the kind (`catalog/parse`, `catalog/schema`, `cli/usage`, …).
 * Importers set `file` and `line`, so the CLI can print `FILE:LINE: message`.
 * Programmer misuse throws `TypeError` / `RangeError` instead.
 */
export class TiepointError extends Error {
  /** Stage-prefixed error code, e.g. `catalog/parse`. */
  readonly code: string;
  /** The file the error is about, when there is one. */
  readonly file?: string;
  /** 1-based line in `file`, when known. */
  readonly line?: number;
  /** Further errors collected with this one (importers report up to a limit). */
  readonly more: readonly TiepointError[];

  constructor(code: string, message: string, where: { file?: string; line?: number; more?: readonly TiepointError[] } = {}) {
    super(message);
    this.name = "TiepointError";
    this.code = code;
    this.file = where.file;
    this.line = where.line;
    this.more = where.more ?? [];
  }

  /** `FILE:LINE: message`, `FILE: message` or just the message. */
  format(): string {
    if (this.file !== undefined && this.line !== undefined) return `${this.file}:${this.line}: ${this.message}`;
    if (this.file !== undefined) return `${this.file}: ${this.message}`;
    return this.message;
  }
}

/** Codes whose errors are bad usage (exit status 2) rather than bad input (exit status 1). */
export const USAGE_CODES: ReadonlySet<string> = new Set(["cli/usage"]);
