import { describe, expect, it } from "vitest";
import { initialLine, lineReducer, type LineAction, type LineState } from "./line-editor.js";

const run = (s: LineState, ...as: LineAction[]) => as.reduce(lineReducer, s);
const type = (text: string): LineAction => ({ type: "insert", text });

describe("line editor", () => {
  it("inserts at the cursor and moves left/right, home/end", () => {
    const s = run(initialLine(), type("helo"), { type: "left" }, type("l"), { type: "home" }, type(">"), { type: "end" }, type("!"));
    expect(s.text).toBe(">hello!");
    expect(s.cursor).toBe(7);
  });
  it("backspace deletes before the cursor, delete under it", () => {
    const s = run(initialLine(), type("abcd"), { type: "left" }, { type: "left" }, { type: "backspace" }, { type: "delete" });
    expect(s.text).toBe("ad");
    expect(s.cursor).toBe(1);
    expect(run(s, { type: "home" }, { type: "backspace" }).text).toBe("ad"); // nothing before the start
  });
  it("moves and deletes a base letter with its combining mark as one unit (UAX #29)", () => {
    const s = run(initialLine(), type("cafe\u0301"), { type: "left" });
    expect(s.cursor).toBe(3); // before "e\u0301"
    expect(run(s, { type: "delete" }).text).toBe("caf");
    expect(run(initialLine(), type("漢字"), { type: "backspace" }).text).toBe("漢");
  });
  it("ctrl-u deletes from the start to the cursor", () => {
    const s = run(initialLine(), type("which lab"), { type: "left" }, { type: "left" }, { type: "left" }, { type: "kill-to-start" });
    expect(s.text).toBe("lab");
    expect(s.cursor).toBe(0);
  });
  it("drops control characters from pasted text, keeps tabs as spaces", () => {
    expect(run(initialLine(), type("a\x07b\tc")).text).toBe("ab c");
  });
  it("walks the history and restores the unsent draft", () => {
    let s = run(initialLine(), type("first"), { type: "submit" }, type("second"), { type: "submit" }, type("draft"));
    expect(s.history).toEqual(["first", "second"]);
    s = run(s, { type: "history-prev" });
    expect(s.text).toBe("second");
    s = run(s, { type: "history-prev" }, { type: "history-prev" });
    expect(s.text).toBe("first"); // stops at the oldest
    s = run(s, { type: "history-next" }, { type: "history-next" });
    expect(s.text).toBe("draft");
    expect(run(s, { type: "history-next" }).text).toBe("draft");
  });
  it("does not record empty or repeated questions", () => {
    const s = run(initialLine(), type("q"), { type: "submit" }, type("q"), { type: "submit" }, type("   "), { type: "submit" });
    expect(s.history).toEqual(["q"]);
  });
});
