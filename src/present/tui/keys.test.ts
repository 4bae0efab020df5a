import { describe, expect, it } from "vitest";
import { parseKeys } from "./keys.js";

// Sequences as xterm sends them (xterm ctlseqs, "PC-Style Function Keys"; ECMA-48 CSI/SS3).
describe("parseKeys", () => {
  it("names the cursor keys in normal (CSI) and application (SS3) mode", () => {
    expect(parseKeys("\x1b[A\x1b[B\x1b[C\x1b[D")).toEqual(["up", "down", "right", "left"].map((name) => ({ kind: "key", name })));
    expect(parseKeys("\x1bOA")).toEqual([{ kind: "key", name: "up" }]);
  });
  it("names home/end/delete/page keys in their common variants", () => {
    expect(parseKeys("\x1b[H")).toEqual([{ kind: "key", name: "home" }]);
    expect(parseKeys("\x1b[1~")).toEqual([{ kind: "key", name: "home" }]); // VT220 / tmux
    expect(parseKeys("\x1b[4~")).toEqual([{ kind: "key", name: "end" }]);
    expect(parseKeys("\x1b[3~")).toEqual([{ kind: "key", name: "delete" }]);
    expect(parseKeys("\x1b[5~\x1b[6~")).toEqual([{ kind: "key", name: "pageup" }, { kind: "key", name: "pagedown" }]);
  });
  it("tells Backspace (DEL 0x7f, or BS 0x08) from Delete", () => {
    expect(parseKeys("\x7f")).toEqual([{ kind: "key", name: "backspace" }]);
    expect(parseKeys("\b")).toEqual([{ kind: "key", name: "backspace" }]);
  });
  it("reads Enter, Tab, Shift-Tab (CSI Z), F1 (SS3 P) and Escape", () => {
    expect(parseKeys("\r")).toEqual([{ kind: "key", name: "enter" }]);
    expect(parseKeys("\t\x1b[Z")).toEqual([{ kind: "key", name: "tab" }, { kind: "key", name: "backtab" }]);
    expect(parseKeys("\x1bOP")).toEqual([{ kind: "key", name: "f1" }]);
    expect(parseKeys("\x1b")).toEqual([{ kind: "key", name: "escape" }]);
  });
  it("reads Ctrl+letter from C0 control bytes", () => {
    expect(parseKeys("\x15\x03")).toEqual([{ kind: "ctrl", letter: "u" }, { kind: "ctrl", letter: "c" }]);
  });
  it("ignores modifier parameters on cursor keys (CSI 1;5A = ctrl+up)", () => {
    expect(parseKeys("\x1b[1;5A")).toEqual([{ kind: "key", name: "up" }]);
  });
  it("keeps a pasted run of text as one event and splits at controls", () => {
    expect(parseKeys("which lab?\r")).toEqual([{ kind: "text", text: "which lab?" }, { kind: "key", name: "enter" }]);
    expect(parseKeys("漢字e\u0301")).toEqual([{ kind: "text", text: "漢字e\u0301" }]);
    expect(parseKeys("a\r\nb")).toEqual([{ kind: "text", text: "a" }, { kind: "key", name: "enter" }, { kind: "text", text: "b" }]);
  });
});
