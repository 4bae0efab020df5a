/**
 * The plain-line reader (ntriples-lines.ts) against the n3 parser, line by line: every line it
 * reads gives the triple n3 gives (term types, values, language, datatype); a line it calls
 * empty gives n3 no triple and no error; a line it declines is n3's to decide. Hand-written
 * lines from the RDF 1.1 N-Triples grammar (W3C Recommendation 2014, section 7: IRIREF,
 * BLANK_NODE_LABEL, STRING_LITERAL_QUOTE with ECHAR/UCHAR, LANGTAG, comments), then random
 * lines assembled from valid and broken pieces (fast-check).
 */
import fc from "fast-check";
import { Parser } from "n3";
import { describe, expect, it } from "vitest";
import { readPlainLine } from "./ntriples-lines.js";

const MARK = "\u0001";

function viaN3(line: string): string[] | "error" {
  try {
    return new Parser({ format: "N-Triples", blankNodePrefix: MARK })
      .parse(line + "\n")
      .map((q) => JSON.stringify([q.subject.termType, q.subject.value, q.predicate.value, q.object.termType, q.object.value, q.object.termType === "Literal" ? [(q.object as { language: string }).language, (q.object as { datatype: { value: string } }).datatype.value] : null]));
  } catch {
    return "error";
  }
}

function viaLines(line: string): string[] | null | undefined {
  const t = readPlainLine(line, MARK);
  if (t === null || t === undefined) return t;
  const o = t.object;
  return [JSON.stringify([t.subject.termType, t.subject.value, t.predicate.value, o.termType, o.value, o.termType === "Literal" ? [o.language, o.datatype.value] : null])];
}

/** Checks one line; returns whether the plain reader read it (or called it empty). */
function agrees(line: string): boolean {
  const mine = viaLines(line);
  if (mine === undefined) return false;
  if (mine === null) expect(viaN3(line), line).toEqual([]);
  else expect(viaN3(line), line).toEqual(mine);
  return true;
}

describe("plain N-Triples lines", () => {
  it("read as n3 reads them: IRIs, blank nodes, literals with escapes, language tags, datatypes, comments", () => {
    const read = [
      "<http://x/s> <http://x/p> <http://x/o> .",
      "<http://x/s>\t<http://x/p>\t<urn:x:o>.",
      "<http://x/s><http://x/p><http://x/o>.",
      "_:b1 <http://x/p> _:b-2 .",
      '<http://x/s> <http://x/p> "plain" .',
      '<http://x/s> <http://x/p> "" .',
      '<http://x/s> <http://x/p> "tab\\there \\"quoted\\" back\\\\slash \\n \\r \\b \\f \\\'" .',
      '<http://x/s> <http://x/p> "caf\\u00E9 \\U0001F600" .',
      '<http://x/s> <http://x/p> "Grüße, 東京"@DE-ch .',
      '<http://x/s> <http://x/p> "5"^^<http://www.w3.org/2001/XMLSchema#integer> .',
      '<http://x/s> <http://x/p> "s"^^<http://www.w3.org/2001/XMLSchema#string> .',
      '<http://x/s> <http://x/p> "x"@en . # a comment',
      "<http://x/s> <http://x/p> <http://x/o> .\r",
      "<http://x/é> <http://x/p> <http://x/o#frag?q=1> .",
      "",
      "   ",
      "# only a comment",
    ];
    for (const line of read) expect(agrees(line), line).toBe(true);
  });

  it("declines lines of any other shape (n3 decides those)", () => {
    const declined = [
      "<http://x/s> <http://x/p> <http://x/o>",
      "<http://x/s> <http://x/p> <http://x/o> . junk",
      "<rel> <http://x/p> <http://x/o> .",
      "<http://x/a\\u0062> <http://x/p> <http://x/o> .",
      "<http://x/a b> <http://x/p> <http://x/o> .",
      '<http://x/s> <http://x/p> "open .',
      '<http://x/s> <http://x/p> "bad \\q escape" .',
      '<http://x/s> <http://x/p> "\\uD800" .',
      '<http://x/s> <http://x/p> "x"@ .',
      '<http://x/s> <http://x/p> "x"^<http://x/t> .',
      "_:a.b <http://x/p> <http://x/o> .",
      "_:-a <http://x/p> <http://x/o> .",
      '"lit" <http://x/p> <http://x/o> .',
      "<http://x/s> _:p <http://x/o> .",
    ];
    for (const line of declined) expect(readPlainLine(line, MARK), line).toBeUndefined();
  });

  it("agree with n3 on random lines built from valid and broken pieces (fast-check)", () => {
    // valid pieces four times as often as broken ones
    const mixed = <T>(valid: fc.Arbitrary<T>, broken: fc.Arbitrary<T>) => fc.oneof({ arbitrary: valid, weight: 4 }, { arbitrary: broken, weight: 1 });
    const iri = mixed(fc.constantFrom("<http://x/a>", "<urn:x:b>", "<http://x/é#f>", "<http://x/q?a=1&b=2>"), fc.constantFrom("<rel>", "<http://x/a b>", "<http://x/\\u0061>", "<http://x/a", "<>"));
    const blank = mixed(fc.constantFrom("_:b1", "_:x_y-z", "_:9"), fc.constantFrom("_:a.b", "_:", "_:é"));
    const text = fc.array(fc.constantFrom("a", "Z", " ", "é", "東", "\\t", "\\n", '\\"', "\\\\", "\\u00e9", "\\U0001F600", "\\x", "\\uD800", '"', "#", "\t"), { maxLength: 8 }).map((a) => a.join(""));
    const literal = fc.tuple(text, fc.constantFrom("", "@en", "@EN-gb", "@", "@en-", "^^<http://www.w3.org/2001/XMLSchema#integer>", "^^<rel>", "^<http://x/t>")).map(([t, s]) => `"${t}"${s}`);
    const space = fc.constantFrom("", " ", "\t", "  ", "\r");
    const end = mixed(fc.constantFrom(" .", ".", " . # note", " .\r"), fc.constantFrom(" . x", "", " .."));
    const line = fc.tuple(space, fc.oneof(iri, blank, literal), space, fc.oneof(iri, blank), space, fc.oneof(iri, blank, literal), end).map((p) => p.join(""));
    let readCount = 0;
    fc.assert(
      fc.property(line, (l) => {
        if (agrees(l)) readCount++;
      }),
      { numRuns: 3000, seed: 19 },
    );
    expect(readCount).toBeGreaterThan(100); // the property read lines, not only declined them
  });
});
