import { describe, expect, it } from "vitest";
import fc from "fast-check";
import stringWidth from "string-width";
import { displayWidth, fit, graphemes, truncate } from "./text-width.js";

// Outside reference: the `string-width` package (the width function ink itself lays text out
// with), checked on the same strings. Expected widths name their Unicode source.
describe("displayWidth", () => {
  it("counts printable ASCII one column each", () => {
    expect(displayWidth("Harbor Lab")).toBe(10); // UAX #11: ASCII is Narrow (Na)
  });
  it("counts East Asian Wide characters two columns each", () => {
    expect(displayWidth("漢字")).toBe(4); // U+6F22, U+5B57: EastAsianWidth.txt class W
    expect(displayWidth("ｈｉ")).toBe(4); // U+FF48, U+FF49: class F (fullwidth)
    expect(displayWidth("한글")).toBe(4); // U+D55C, U+AE00: Hangul syllables, class W
  });
  it("adds no width for combining marks", () => {
    expect(displayWidth("e\u0301")).toBe(1); // U+0301 COMBINING ACUTE ACCENT, General_Category Mn
    expect(displayWidth("Cafe\u0301")).toBe(4);
    expect(graphemes("e\u0301x")).toEqual(["e\u0301", "x"]); // UAX #29: a mark extends its base
  });
  it("counts emoji with emoji presentation two columns", () => {
    expect(displayWidth("👍")).toBe(2); // U+1F44D: Emoji_Presentation=Yes (UTS #51)
    expect(displayWidth("👩‍🔬")).toBe(2); // ZWJ sequence: one grapheme (UAX #29 GB11)
  });
  it("agrees with string-width on a mixed sample", () => {
    const samples = ["Harbor Lab", "漢字テスト", "Cafe\u0301 au lait", "Zoë Ñandú", "中文 and ASCII", "ｆｕｌｌ", "tab\u200bzero", "한국어 문장"];
    for (const s of samples) expect(displayWidth(s), s).toBe(stringWidth(s));
  });
  it("agrees with string-width on random strings from a mixed alphabet (fast-check)", () => {
    const alphabet = ["a", "Z", " ", "é", "e\u0301", "漢", "ｈ", "한", "ñ", "-", "·", "→", "ß"];
    fc.assert(
      fc.property(fc.array(fc.constantFrom(...alphabet), { maxLength: 30 }), (parts) => {
        const s = parts.join("");
        expect(displayWidth(s)).toBe(stringWidth(s));
      }),
    );
  });
});

describe("truncate", () => {
  it("leaves a string that fits alone", () => {
    expect(truncate("short", 10)).toBe("short");
  });
  it("cuts with an ellipsis, never splitting a wide character", () => {
    expect(truncate("漢字テスト", 5)).toBe("漢字…"); // 2+2+1 columns
    expect(truncate("漢字テスト", 4)).toBe("漢…"); // a wide char does not fit in the last column
  });
  it("keeps a combining mark with its base", () => {
    expect(truncate("Cafe\u0301 au lait", 5)).toBe("Cafe\u0301…");
  });
  it("drops trailing spaces before the ellipsis and handles tiny widths", () => {
    expect(truncate("Harbor Lab of the North", 8)).toBe("Harbor…");
    expect(truncate("abc", 0)).toBe("");
    expect(truncate("abcdef", 1)).toBe("…");
  });
  it("never exceeds the width and is a prefix of the input (fast-check)", () => {
    const alphabet = ["a", " ", "e\u0301", "漢", "👍", "ß"];
    fc.assert(
      fc.property(fc.array(fc.constantFrom(...alphabet), { maxLength: 25 }), fc.integer({ min: 0, max: 30 }), (parts, w) => {
        const s = parts.join("");
        const t = truncate(s, w);
        expect(displayWidth(t)).toBeLessThanOrEqual(w);
        const body = t.endsWith("…") && !s.startsWith(t) ? t.slice(0, -1) : t;
        expect(s.startsWith(body)).toBe(true);
      }),
    );
  });
  it("fit pads to the exact width", () => {
    expect(fit("漢a", 5)).toBe("漢a  ");
    expect(displayWidth(fit("a very long label indeed", 7))).toBe(7);
  });
});
