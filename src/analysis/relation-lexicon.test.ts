/**
 * The paraphrase lexicon and closed compounds (relation-lexicon.ts) through relationCues, on
 * a catalog whose relation labels are noun phrases in the style of open knowledge bases
 * ("place of birth", "cast member", "educated at", "spouse"; common practice, invented data).
 * Expected scores are hand-derived: a lexicon match counts LEXICON_CREDIT = 0.9.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Catalog } from "../catalog/index.js";
import { writtenCatalog } from "../../test/helpers/hand-links.js";
import { buildQuestionModel, relationCues, words, type QuestionModel } from "./index.js";
import { isFunctionWord } from "./words.js";
import { compoundCovers, LEXICON_CREDIT } from "./relation-lexicon.js";

let cat: Catalog;
let model: QuestionModel;

beforeAll(() => {
  cat = writtenCatalog((w) => {
    for (const [id, label] of [["r:pob", "place of birth"], ["r:cast", "cast member"], ["r:edu", "educated at"], ["r:spouse", "spouse"], ["r:member", "member of"], ["r:leads", "leads"], ["r:head", "head of"]] as const) w.predicateLabel(id, label);
  });
  model = buildQuestionModel(cat);
});
afterAll(() => cat.close());

function cuesOf(q: string): Record<string, number> {
  const ws = words(q);
  const content = ws.map((_, i) => i).filter((i) => !isFunctionWord(ws[i]!.norm));
  return Object.fromEntries(relationCues(ws, content, model).map((c) => [c.id, Number(c.score.toFixed(6))]));
}

describe("relation cues through the paraphrase lexicon", () => {
  it("matches question verbs to noun-phrase labels at 0.9 of a direct match", () => {
    expect(cuesOf("Where was Ada born?")).toEqual({ "r:pob": LEXICON_CREDIT });
    expect(cuesOf("Where did Ada study?")).toEqual({ "r:edu": LEXICON_CREDIT });
    expect(cuesOf("Who is Ada married to?")).toEqual({ "r:spouse": LEXICON_CREDIT });
  });
  it("matches a several-word phrase only where the label holds all of it ('member' alone is not 'starred')", () => {
    expect(cuesOf("Who starred in Glass Tide?")).toEqual({ "r:cast": LEXICON_CREDIT });
  });
  it("matches a closed compound to the two-word label it spells", () => {
    expect(compoundCovers("birthplace", ["place", "birth"])).toBe(true);
    expect(compoundCovers("placebo", ["place", "bo"])).toBe(false);
    expect(cuesOf("What is the birthplace of Ada?")).toEqual({ "r:pob": LEXICON_CREDIT });
  });
  it("keeps direct matches at full credit, and fills gaps only: a word a label holds is not paraphrased", () => {
    expect(cuesOf("Who is the spouse of Ada?")).toEqual({ "r:spouse": 1 });
    // "leads" is a label here: it does not also cue "head of" through the lexicon (lead ~ head)
    expect(cuesOf("Who leads Orrin?")).toEqual({ "r:leads": 1 });
  });
});
