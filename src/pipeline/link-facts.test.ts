import { describe, expect, it } from "vitest";
import { closeAppositive, codeMismatch, partOfLongerName, wholeName, writtenWord } from "./link-facts.js";

// Hand-made cases; the expected words and verdicts are read off the strings.
describe("link facts: the written word of a mention, codes, close apposition", () => {
  it("extends a mention over the word it stands in, without sentence punctuation", () => {
    const q = "Who maintains gcc-19?";
    expect(writtenWord(q, q.indexOf("gcc"), q.indexOf("gcc") + 3).text).toBe("gcc-19");
    const r = "Does erlang-base-hipe2 exist.";
    expect(writtenWord(r, r.indexOf("erlang"), r.indexOf("erlang") + 11).text).toBe("erlang-base-hipe2");
    const s = "Which vessel carries (VK-9), then?";
    expect(writtenWord(s, s.indexOf("VK"), s.indexOf("VK") + 2).text).toBe("VK-9");
  });
  it("a code is not found when it holds a digit group no name of the entity holds", () => {
    expect(codeMismatch("gcc-19", ["gcc"])).toBe(true);
    expect(codeMismatch("VK-9", ["VK-7 spectrometer", "VK-7"])).toBe(true);
    expect(codeMismatch("KX-1140", ["KX-114"])).toBe(true);
    expect(codeMismatch("KX-114", ["KX-114"])).toBe(false);
    expect(codeMismatch("lua5.1", ["lua5.1"])).toBe(false);
    expect(codeMismatch("Harnesk", ["Harnesk"])).toBe(false);
  });
  it("a name after a determiner and common nouns is in close apposition", () => {
    const q = "Where was the sonar engineer Ilse Varrick born?";
    expect(closeAppositive(q, q.indexOf("Ilse"))).toBe(true);
    const r = "Where was Ilse Varrick born?";
    expect(closeAppositive(r, r.indexOf("Ilse"))).toBe(false);
    const s = "Who captains the Harnesk?";
    expect(closeAppositive(s, s.indexOf("Harnesk"))).toBe(false);
    const t = "In which country is the city of Kingston?";
    expect(closeAppositive(t, t.indexOf("Kingston"))).toBe(false);
  });
});

describe("link facts: other senses that take a whole name's word as one word of a longer name", () => {
  // invented names: "Braskian" derived from the realm Brask, also one word of "Braskian Sea Company" and derived within "North Brask"
  const m = { text: "Braskian", start: 6, end: 14, entity: { id: "k:brask", label: "Brask" }, num: 1, confidence: 0.3, alternatives: [], match: "derived" as const, derivation: { suffix: "ian", base: "Brask" } };
  it("a word derived from the whole label, or the label itself, is the whole name", () => {
    expect(wholeName(m)).toBe(true);
    expect(wholeName({ ...m, match: "label" })).toBe(true);
    expect(wholeName({ ...m, derivation: { suffix: "ian", base: "North Brask" } })).toBe(false);
    expect(wholeName({ ...m, match: "partial" })).toBe(false);
  });
  it("a partial match, or a derivation inside a name of several words, is part of a longer name", () => {
    expect(partOfLongerName({ id: "o:bsc", label: "Braskian Sea Company", confidence: 0.2, match: "partial" })).toBe(true);
    expect(partOfLongerName({ id: "k:nb", label: "North Brask", confidence: 0.2, match: "derived" })).toBe(true);
    expect(partOfLongerName({ id: "l:b", label: "Braskish", confidence: 0.2, match: "derived" })).toBe(false);
    expect(partOfLongerName({ id: "k:b2", label: "Brask", confidence: 0.2, match: "label" })).toBe(false);
  });
});
