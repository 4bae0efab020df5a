/**
 * Terminal key sequences → key events, as a pure function (tested without rendering).
 *
 * Method: a chunk of terminal input (already split by ink at escape sequences) is read
 * left to right: ECMA-48 control sequences (CSI `ESC [ … final`, SS3 `ESC O x`) name the
 * cursor and editing keys as xterm sends them; C0 control bytes give Enter (CR/LF), Tab,
 * Backspace (DEL 0x7f or BS 0x08) and Ctrl+letter; runs of printable characters become one
 * text event (a paste stays one insertion).
 * [Reference] ECMA-48, Control Functions for Coded Character Sets (5th ed., 1991); xterm
 * "Control Sequences" (ctlseqs), PC-Style Function Keys.
 */

/** Names of the non-text keys the screen uses. */
export type KeyName =
  | "enter" | "tab" | "backtab" | "backspace" | "delete" | "escape"
  | "up" | "down" | "left" | "right" | "home" | "end" | "pageup" | "pagedown" | "f1";

/** One key press. */
export type KeyEvent =
  /** Printable text (one key, or a whole paste). */
  | { readonly kind: "text"; readonly text: string }
  /** A named key. */
  | { readonly kind: "key"; readonly name: KeyName }
  /** Ctrl with a letter, `letter` in lower case (ctrl-c, ctrl-u, …). */
  | { readonly kind: "ctrl"; readonly letter: string };

/** Escape sequences after ESC, as xterm and common terminals send them. */
const SEQUENCES: Readonly<Record<string, KeyName>> = {
  "[A": "up", "[B": "down", "[C": "right", "[D": "left",
  OA: "up", OB: "down", OC: "right", OD: "left",
  "[H": "home", "[F": "end", OH: "home", OF: "end",
  "[1~": "home", "[7~": "home", "[4~": "end", "[8~": "end",
  "[3~": "delete", "[5~": "pageup", "[6~": "pagedown",
  "[Z": "backtab", OP: "f1", "[11~": "f1", "[[A": "f1",
};

/** Reads one chunk of terminal input into key events. */
export function parseKeys(chunk: string): KeyEvent[] {
  const out: KeyEvent[] = [];
  let text = "";
  const flush = () => {
    if (text.length > 0) out.push({ kind: "text", text });
    text = "";
  };
  let i = 0;
  while (i < chunk.length) {
    const c = chunk[i]!;
    const code = c.charCodeAt(0);
    if (c === "\x1b") {
      flush();
      const rest = chunk.slice(i + 1);
      // CSI: ESC [ params final ; SS3: ESC O x
      const csi = /^\[\[?[0-9;:<=>?]*[ -/]*[@-~]/.exec(rest);
      const ss3 = /^O[@-~]/.exec(rest);
      const m = csi ?? ss3;
      if (m) {
        // drop modifier parameters ("1;5A" = ctrl+up) and keep the key
        const raw = m[0];
        const plain = raw.replace(/^\[1;\d+([A-DHF])$/, "[$1").replace(/^\[(\d+);\d+~$/, "[$1~");
        const name = SEQUENCES[plain];
        if (name) out.push({ kind: "key", name });
        i += 1 + raw.length;
        continue;
      }
      if (rest.length === 0 || rest[0] === "\x1b") {
        out.push({ kind: "key", name: "escape" });
        i += 1;
        continue;
      }
      // ESC + character: a meta/alt chord; not used, skipped
      i += 1 + (rest.codePointAt(0)! > 0xffff ? 2 : 1);
      continue;
    }
    if (code < 0x20 || code === 0x7f) {
      flush();
      if (c === "\r" || c === "\n") out.push({ kind: "key", name: "enter" });
      else if (c === "\t") out.push({ kind: "key", name: "tab" });
      else if (c === "\x7f" || c === "\b") out.push({ kind: "key", name: "backspace" });
      else if (code >= 1 && code <= 26) out.push({ kind: "ctrl", letter: String.fromCharCode(code + 96) });
      i += 1;
      // CR LF from a paste counts once
      if (c === "\r" && chunk[i] === "\n") i += 1;
      continue;
    }
    text += c;
    i += 1;
  }
  flush();
  return out;
}
