/**
 * Question analysis on a small fixture catalog (a real in-memory SQLite catalog written
 * through CatalogWriter). Link results are built by hand from the question text, so these
 * tests exercise the analysis alone. Expected stems follow Porter 1980 (via the `stemmer`
 * package); expected weights are hand-computed from relation-cues.ts (1 + 4 × score).
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Catalog, CatalogWriter } from "../catalog/index.js";
import type { LinkResult, LinkedMention } from "../linking/index.js";
import { analyze, buildQuestionModel, detectAnswerType, expectedInverse, relationCues, words, type QuestionModel } from "./index.js";

let cat: Catalog;
let model: QuestionModel;
const num = (id: string) => cat.numOf(id)!;

beforeAll(() => {
  cat = Catalog.open(":memory:", { create: true });
  const w = new CatalogWriter(cat);
  w.begin();
  const type = (id: string, label: string, aliases: string[] = [], sup?: string) => {
    w.label(id, label);
    for (const a of aliases) w.alias(id, a);
    if (sup) w.subclass(id, sup);
  };
  type("t:Thing", "thing");
  type("t:Person", "person", ["people"], "t:Thing");
  type("t:Researcher", "researcher", ["scientist"], "t:Person");
  type("t:Org", "organisation", [], "t:Thing");
  type("t:Company", "company", ["maker"], "t:Org");
  type("t:Vessel", "vessel", ["ship", "research vessel"], "t:Thing");
  type("t:Place", "place", [], "t:Thing");
  type("t:Port", "port", ["harbour"], "t:Place");
  type("t:Instrument", "instrument", [], "t:Thing");
  const rel = (id: string, label: string, aliases: string[] = []) => {
    w.predicateLabel(id, label);
    for (const a of aliases) w.predicateAlias(id, a);
  };
  rel("r:carries", "carries", ["carried aboard", "on board"]);
  rel("r:builtBy", "built by", ["made by"]);
  rel("r:homePort", "home port", ["sails from"]);
  rel("r:worksAt", "works at");
  const ent = (id: string, label: string, t: string) => {
    w.label(id, label);
    w.type(id, t);
  };
  ent("p:ada", "Ada Quell", "t:Researcher");
  ent("o:ostrel", "Ostrel", "t:Company");
  ent("v:lumen", "Lumen Ray", "t:Vessel");
  ent("i:halo", "Halo", "t:Instrument");
  ent("x:tolvane", "Tolvane", "t:Port");
  w.edge("v:lumen", "r:carries", "i:halo");
  w.edge("i:halo", "r:builtBy", "o:ostrel");
  w.edge("v:lumen", "r:homePort", "x:tolvane");
  w.edge("p:ada", "r:worksAt", "o:ostrel");
  w.commit();
  model = buildQuestionModel(cat);
});

afterAll(() => cat.close());

/** A LinkResult naming `spans` (exact substrings of the question) as the given entities. */
function linked(question: string, spans: readonly [string, string, number?][]): LinkResult {
  const mentions: LinkedMention[] = spans.map(([text, id, confidence]) => {
    const start = question.indexOf(text);
    if (start < 0) throw new Error(`fixture: "${text}" not in "${question}"`);
    const ref = cat.ref(num(id));
    return { text, start, end: start + text.length, entity: ref, confidence: confidence ?? 0.95, alternatives: [], num: num(id) };
  });
  return { mentions, unlinked: [] };
}

const ids = (types: readonly { id: string }[]) => types.map((t) => t.id).sort();

describe("question model", () => {
  it("derives person-, organisation- and place-like types from labels and supertypes", () => {
    const name = (nums: readonly number[]) => nums.map((n) => cat.ref(n).id).sort();
    expect(name(model.personTypes)).toEqual(["t:Person", "t:Researcher"]);
    expect(name(model.organisationTypes)).toEqual(["t:Company", "t:Org"]);
    expect(name(model.placeTypes)).toEqual(["t:Place", "t:Port"]);
  });

  it("does not take a type for a person because one word of an alias stems like a person word", () => {
    // "research vessel" stems to "research vessel"; "researcher" stems to "research" (Porter 1980)
    expect(model.personTypes).not.toContain(num("t:Vessel"));
  });

  it("follows subtypes in both directions", () => {
    const researcher = model.typeByNum.get(num("t:Researcher"))!;
    expect(researcher.ancestors.map((n) => cat.ref(n).id).sort()).toEqual(["t:Person", "t:Researcher", "t:Thing"]);
    const place = model.typeByNum.get(num("t:Place"))!;
    expect(place.descendants.map((n) => cat.ref(n).id).sort()).toEqual(["t:Place", "t:Port"]);
  });

  it("leaves out predicates without edges when edge counts are given", () => {
    const counts = new Array(cat.maxPredicateNum() + 1).fill(0);
    counts[model.relations.find((r) => r.id === "r:carries")!.num] = 1;
    expect(buildQuestionModel(cat, { relationEdgeCounts: counts }).relations.map((r) => r.id)).toEqual(["r:carries"]);
  });
});

describe("expected answer type", () => {
  const typeOf = (q: string) => analyze(q, { mentions: [], unlinked: [] }, model);

  it("matches the head noun after which/what, plurals included", () => {
    expect(ids(typeOf("Which vessels carry the Halo?").answerTypes)).toEqual(["t:Vessel"]);
    expect(ids(typeOf("What ship sails from Tolvane?").answerTypes)).toEqual(["t:Vessel"]);
  });

  it("prefers the longest label or alias in the noun phrase", () => {
    const a = typeOf("Which research vessel carries the Halo?");
    expect(ids(a.answerTypes)).toEqual(["t:Vessel"]);
    // both words were used for the type, so neither is left for relation cues
    expect(a.relationCues.map((c) => c.id)).toEqual(["r:carries"]);
  });

  it("takes the noun after an imperative opening and after 'what kind of'", () => {
    expect(ids(typeOf("Name the company that made the Halo").answerTypes)).toEqual(["t:Company"]);
    expect(ids(typeOf("What kind of instrument is on board the Lumen Ray?").answerTypes)).toEqual(["t:Instrument"]);
  });

  it("stops the noun phrase at the verb: the object's noun is not the answer type", () => {
    expect(ids(typeOf("Which company built the instrument?").answerTypes)).toEqual(["t:Company"]);
  });

  it("gives the agent types for who and the place types for where (most general only)", () => {
    const who = typeOf("Who made the Halo?");
    expect(ids(who.answerTypes)).toEqual(["t:Org", "t:Person"]);
    expect(who.answerTypeSource).toBe("who");
    expect(ids(typeOf("Where is the Lumen Ray based?").answerTypes)).toEqual(["t:Place"]);
  });

  it("narrows who to a named subtype after a copula only", () => {
    expect(ids(typeOf("Who is the scientist working at Ostrel?").answerTypes)).toEqual(["t:Researcher"]);
    // "who made": the verb is not a type noun even when a type alias shares its stem
    expect(ids(typeOf("Who made the Halo?").answerTypes)).toEqual(["t:Org", "t:Person"]);
  });

  it("sets no type, with a note, when the question names none", () => {
    const a = typeOf("What is the sailing base of the Lumen Ray?");
    expect(a.answerTypes).toEqual([]);
    expect(a.notes.join(" ")).toMatch(/names no type/);
    // the unused noun-phrase words still cue relations ("sailing" ~ "sails from")
    expect(a.relationCues[0]?.id).toBe("r:homePort");
    expect(typeOf("Tolvane and the Lumen Ray").notes.join(" ")).toMatch(/no question word/);
  });

  it("takes the type from the subject complement when the wh-phrase is a name ('Which X is the largest ship?')", () => {
    const q = "Which Halo is the largest ship?";
    const a = analyze(q, linked(q, [["Halo", "i:halo"]]), model);
    expect(ids(a.answerTypes)).toEqual(["t:Vessel"]);
  });

  it("never takes a word inside a linked mention as the head noun", () => {
    const ws = words("Which Vessel Works carries it?");
    const blocked = ws.map((w) => w.start >= 6 && w.end <= 18);
    expect(detectAnswerType(ws, blocked, model).types).toEqual([]);
  });
});

describe("relation cues", () => {
  it("matches stems exactly and gives a soft weight 1 + 4·score (hand-computed)", () => {
    const q = "Which ship carried the Halo?";
    const a = analyze(q, linked(q, [["Halo", "i:halo"]]), model);
    const carries = a.relationCues.find((c) => c.id === "r:carries")!;
    // "carried" → carri = stem of the label "carries": score 1, weight 5
    expect(carries.score).toBeCloseTo(1, 12);
    expect(carries.weight).toBeCloseTo(5, 12);
    expect(carries.words).toEqual(["carried"]);
    expect(a.relationCues.map((c) => c.id)).toEqual(["r:carries"]);
  });

  it("gives partial credit 0.7 for a shared stem prefix of 4+ letters (hand-computed weight 3.8)", () => {
    const ws = words("the carrier Lumen Ray");
    const cues = relationCues(ws, [1], model);
    // stem(carrier) = "carrier", stem(carries) = "carri": prefix of 5 letters
    expect(cues.map((c) => [c.id, c.weight])).toEqual([["r:carries", 1 + 4 * 0.7]]);
  });

  it("scores a multi-word surface by the share of its content stems present", () => {
    const ws = words("sails Tolvane");
    const cues = relationCues(ws, [0], model);
    // "sails from": content stems [sail]; "from" is a function word → 1 of 1
    expect(cues[0]?.id).toBe("r:homePort");
    expect(cues[0]?.score).toBeCloseTo(1, 12);
  });

  it("records the cue position and whether the voice flips the direction", () => {
    const q1 = "Which ship carries the Halo?";
    const c1 = analyze(q1, linked(q1, [["Halo", "i:halo"]]), model).relationCues[0]!;
    expect([c1.start, c1.flip]).toEqual([q1.indexOf("carries"), false]);
    // from the Halo (right of the verb) the walk goes object → subject: against the triple
    expect(expectedInverse(c1, q1.indexOf("Halo"))).toBe(true);
    // "made by" (passive) against the passive label "built by": no flip
    const q2 = "Which instrument was made by Ostrel?";
    const c2 = analyze(q2, linked(q2, [["Ostrel", "o:ostrel"]]), model).relationCues.find((c) => c.id === "r:builtBy")!;
    expect(c2.flip).toBe(false);
    expect(expectedInverse(c2, q2.indexOf("Ostrel"))).toBe(true); // stored: instrument built by Ostrel
    // "which company made the Halo" (active) against "built by": flipped
    const q3 = "Which company made the Halo?";
    const c3 = analyze(q3, linked(q3, [["Halo", "i:halo"]]), model).relationCues.find((c) => c.id === "r:builtBy")!;
    expect(c3.flip).toBe(true);
    expect(expectedInverse(c3, q3.indexOf("Halo"))).toBe(false); // stored: Halo built by company
  });

  it("ignores words inside clue mentions", () => {
    const q = "Which ship carries the Home Port Buoy?";
    const a = analyze(q, linked(q, [["Home Port Buoy", "i:halo"]]), model);
    expect(a.relationCues.map((c) => c.id)).toEqual(["r:carries"]);
  });
});

describe("clues", () => {
  it("turns linked mentions into clues weighted by confidence", () => {
    const q = "Which ship carries the Halo from Tolvane?";
    const a = analyze(q, linked(q, [["Halo", "i:halo", 0.9], ["Tolvane", "x:tolvane", 0.6]]), model);
    expect(a.clues.map((c) => [c.id, c.weight, c.mention])).toEqual([
      ["i:halo", 0.9, 0],
      ["x:tolvane", 0.6, 1],
    ]);
  });

  it("does not use a mention of a type as a clue", () => {
    const q = "Which vessel carries the Halo?";
    const a = analyze(q, linked(q, [["vessel", "t:Vessel"], ["Halo", "i:halo"]]), model);
    expect(a.clues.map((c) => c.id)).toEqual(["i:halo"]);
    expect(ids(a.answerTypes)).toEqual(["t:Vessel"]);
    expect(a.notes.join(" ")).toMatch(/names a type/);
  });

  it("weighs a pre-modifying clue lower ('the Ostrel researcher Ada Quell'), by 0.25", () => {
    const q = "What did the Ostrel researcher Ada Quell build?";
    const a = analyze(q, linked(q, [["Ostrel", "o:ostrel", 1], ["Ada Quell", "p:ada", 1]]), model);
    expect(a.clues.map((c) => [c.id, c.weight])).toEqual([
      ["o:ostrel", 0.25],
      ["p:ada", 1],
    ]);
    const q2 = "Which ship carries Halo and Ada Quell?";
    const b = analyze(q2, linked(q2, [["Halo", "i:halo", 1], ["Ada Quell", "p:ada", 1]]), model);
    expect(b.clues.map((c) => c.weight)).toEqual([1, 1]);
  });

  it("reads a mention that is a number with its unit as the quantity, unless the entity's label holds the number", () => {
    const q = "Which ship is longer than 60 metres?";
    const a = analyze(q, linked(q, [["60 metres", "i:halo", 0.5]]), model);
    expect(a.mentions).toEqual([]);
    expect(a.clues).toEqual([]);
    expect(a.notes.join(" ")).toMatch(/"60 metres" read as a quantity, not a name/);
  });

  it("notes when nothing is linked", () => {
    expect(analyze("Which ship?", { mentions: [], unlinked: [] }, model).notes.join(" ")).toMatch(/no clue entity/);
  });
});
