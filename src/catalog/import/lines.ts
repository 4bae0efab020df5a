/**
 * Synchronous, chunked reading of one input file as blocks of whole lines.
 *
 * The file is read `DEFAULTS.chunkBytes` at a time (never whole), so a million-line file
 * never sits in memory. Every line is checked for valid UTF-8 (WHATWG Encoding: a fatal
 * decoder; here `buffer.isUtf8`, the same check, run per block and, on failure, per line)
 * and against a length limit. A bad line is reported through `onBadLine` and replaced by an
 * empty line, so the line numbers of everything after it stay right. A UTF-8 byte order mark
 * at the start is dropped; a CR before LF is kept for the format parser to treat as space.
 */
import { closeSync, openSync, readSync } from "node:fs";
import { isUtf8 } from "node:buffer";

/** Reading limits; all optional. */
export const DEFAULTS = {
  /** Bytes read per system call. */
  chunkBytes: 1 << 20,
  /** Longest accepted line in bytes (without its line break): 1 MiB. */
  maxLineBytes: 1 << 20,
};

/** Options of {@link readBlocks}. */
export interface ReadOptions {
  /** @default DEFAULTS.chunkBytes */
  readonly chunkBytes?: number;
  /** @default DEFAULTS.maxLineBytes */
  readonly maxLineBytes?: number;
}

/** A run of whole lines of the file. */
export interface Block {
  /** The lines' text, joined by "\n" and ending with "\n". */
  readonly text: string;
  /** 1-based number of the block's first line. */
  readonly firstLine: number;
  /** Number of lines in the block. */
  readonly lineCount: number;
  /** Bytes of the file consumed so far (for progress). */
  readonly bytesRead: number;
}

/** Why a line was dropped. */
export type BadLineKind = "utf8" | "too-long";

const BOM = Buffer.from([0xef, 0xbb, 0xbf]);
const NL = 0x0a;

/**
 * Reads `path` block by block, calling `onBlock` for each; `onBadLine` is called for each
 * invalid-UTF-8 or over-long line (which is then passed on as an empty line). Throws the
 * file system's error when the file cannot be opened or read.
 */
export function readBlocks(
  path: string,
  onBlock: (block: Block) => void,
  onBadLine: (line: number, kind: BadLineKind, detail: string) => void,
  options: ReadOptions = {},
): void {
  const chunkBytes = options.chunkBytes ?? DEFAULTS.chunkBytes;
  const maxLine = options.maxLineBytes ?? DEFAULTS.maxLineBytes;
  const fd = openSync(path, "r");
  try {
    let buf = Buffer.allocUnsafe(chunkBytes + maxLine + 2);
    let have = 0; // bytes of buf holding unconsumed data
    let line = 1;
    let total = 0;
    let first = true;
    let skipping = false; // inside an over-long line, dropping bytes until its end
    let skippingLine = 0;
    for (;;) {
      if (buf.length - have < chunkBytes) {
        const bigger = Buffer.allocUnsafe(have + chunkBytes);
        buf.copy(bigger, 0, 0, have);
        buf = bigger;
      }
      const n = readSync(fd, buf, have, chunkBytes, null);
      total += n;
      const end = have + n;
      let start = 0;
      if (first && end >= 3 && buf.subarray(0, 3).equals(BOM)) start = 3;
      if (first && end >= 3) first = false;
      if (skipping) {
        const nl = buf.indexOf(NL, start);
        if (nl < 0 || nl >= end) {
          have = 0;
          if (n === 0) {
            onBlock({ text: "\n", firstLine: skippingLine, lineCount: 1, bytesRead: total });
            return;
          }
          continue;
        }
        skipping = false;
        onBlock({ text: "\n", firstLine: skippingLine, lineCount: 1, bytesRead: total });
        start = nl + 1;
      }
      // complete lines end at the last newline; at end of file the rest is a line too
      const last = end > start ? buf.lastIndexOf(NL, end - 1) : -1;
      const eof = n === 0;
      const stop = eof ? end : last >= start ? last + 1 : start;
      if (stop > 0) first = false;
      if (stop > start) {
        const lines = emitLines(buf, start, stop, line, eof, maxLine, onBadLine);
        if (lines.count > 0) onBlock({ text: lines.text, firstLine: line, lineCount: lines.count, bytesRead: total });
        line += lines.count;
      }
      if (eof) return;
      // keep the unfinished last line
      const rest = end - stop;
      if (rest > maxLine) {
        onBadLine(line, "too-long", `line longer than ${maxLine} bytes`);
        skipping = true;
        skippingLine = line;
        line += 1;
        have = 0;
        continue;
      }
      buf.copy(buf, 0, stop, end);
      have = rest;
    }
  } finally {
    closeSync(fd);
  }
}

function emitLines(
  buf: Buffer,
  start: number,
  stop: number,
  firstLine: number,
  eof: boolean,
  maxLine: number,
  onBadLine: (line: number, kind: BadLineKind, detail: string) => void,
): { text: string; count: number } {
  const region = buf.subarray(start, stop);
  const endsWithNl = region.length > 0 && region[region.length - 1] === NL;
  if (isUtf8(region) && !anyTooLong(region, maxLine)) {
    let text = region.toString("utf8");
    let count = countNewlines(region);
    if (!endsWithNl) {
      if (!eof || region.length > 0) {
        text += "\n";
        count += 1;
      }
    }
    return { text, count };
  }
  // slow path: line by line
  const parts: string[] = [];
  let pos = 0;
  let ln = firstLine;
  while (pos < region.length) {
    let nl = region.indexOf(NL, pos);
    if (nl < 0) nl = region.length;
    const bytes = region.subarray(pos, nl);
    if (bytes.length > maxLine) {
      onBadLine(ln, "too-long", `line longer than ${maxLine} bytes`);
      parts.push("");
    } else if (!isUtf8(bytes)) {
      onBadLine(ln, "utf8", `invalid UTF-8 at byte ${firstInvalid(bytes) + 1} of the line`);
      parts.push("");
    } else {
      parts.push(bytes.toString("utf8"));
    }
    ln++;
    pos = nl + 1;
  }
  return { text: parts.join("\n") + "\n", count: parts.length };
}

function countNewlines(b: Buffer): number {
  let c = 0;
  let i = b.indexOf(NL);
  while (i >= 0) {
    c++;
    i = b.indexOf(NL, i + 1);
  }
  return c;
}

function anyTooLong(b: Buffer, maxLine: number): boolean {
  if (b.length <= maxLine) return false;
  let pos = 0;
  while (pos < b.length) {
    let nl = b.indexOf(NL, pos);
    if (nl < 0) nl = b.length;
    if (nl - pos > maxLine) return true;
    pos = nl + 1;
  }
  return false;
}

/** Offset of the first byte that breaks UTF-8 (RFC 3629 well-formed sequences). */
function firstInvalid(b: Buffer): number {
  let i = 0;
  while (i < b.length) {
    const c = b[i]!;
    let need: number;
    let min: number;
    if (c < 0x80) {
      i++;
      continue;
    } else if (c >= 0xc2 && c <= 0xdf) (need = 1), (min = 0x80);
    else if (c >= 0xe0 && c <= 0xef) (need = 2), (min = 0x800);
    else if (c >= 0xf0 && c <= 0xf4) (need = 3), (min = 0x10000);
    else return i;
    let cp = c & (0x3f >> need);
    for (let k = 1; k <= need; k++) {
      const d = b[i + k];
      if (d === undefined || (d & 0xc0) !== 0x80) return i;
      cp = (cp << 6) | (d & 0x3f);
    }
    if (cp < min || cp > 0x10ffff || (cp >= 0xd800 && cp <= 0xdfff)) return i;
    i += need + 1;
  }
  return i;
}
