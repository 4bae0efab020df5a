/**
 * Escaping of the terms that go into SPARQL queries and N-Triples lines. The expected texts
 * follow the grammars of SPARQL 1.1 Query Language §19.8 (IRIREF, STRING_LITERAL_QUOTE, ECHAR)
 * and RDF 1.1 N-Triples; the round trip is checked with an independent parser (n3's N-Triples
 * parser, the W3C test-suite-conformant one load uses).
 */
import { describe, expect, it } from "vitest";
import { Parser } from "n3";
import { iriRef, literal, ntTerm, stringLiteral, isWritableIri } from "./terms.js";
import { TiepointError } from "../../model/index.js";

const HOSTILE = ['say "hi"', "back\\slash", "a > b", "close } brace", "line\nbreak", "cr\rhere", "tab\there", "# not a comment", '"} } UNION { ?s ?p ?o } #', "\\u0022 stays text", "émoji 🌍", ""];

function parseObject(nt: string): string {
  const quads = new Parser({ format: "N-Triples" }).parse(`<http://x.example/s> <http://x.example/p> ${nt} .\n`);
  expect(quads).toHaveLength(1);
  return quads[0]!.object.value;
}

describe("SPARQL and N-Triples terms", () => {
  it("escapes quotes, backslashes and line ends in literals (ECHAR)", () => {
    expect(stringLiteral('say "hi"')).toBe('"say \\"hi\\""');
    expect(stringLiteral("back\\slash")).toBe('"back\\\\slash"');
    expect(stringLiteral("line\nbreak\r")).toBe('"line\\nbreak\\r"');
    // '>', '}' and '#' need no escape inside a string (they cannot end it)
    expect(stringLiteral("a > b } #")).toBe('"a > b } #"');
  });

  it("every hostile literal survives a round trip through an independent N-Triples parser", () => {
    for (const s of HOSTILE) expect(parseObject(stringLiteral(s))).toBe(s);
    expect(parseObject(literal("x", { lang: "en-GB" }))).toBe("x");
  });

  it("refuses IRIs the grammars cannot hold instead of sending them", () => {
    for (const bad of ["http://x.example/a>b", "http://x.example/a b", 'http://x.example/"', "http://x.example/{x}", "http://x.example/a\nb", "http://x.example/a\\b", "http://x.example/`", ""]) {
      expect(isWritableIri(bad)).toBe(false);
      expect(() => iriRef(bad)).toThrow(TiepointError);
    }
    // '#' and non-ASCII letters are IRI characters (RFC 3987)
    expect(iriRef("http://x.example/a#frag")).toBe("<http://x.example/a#frag>");
    expect(iriRef("http://x.example/Zürich")).toBe("<http://x.example/Zürich>");
  });

  it("refuses a language tag that is not one", () => {
    expect(() => literal("x", { lang: 'en"} #' })).toThrow(TiepointError);
  });

  it("writes result terms as N-Triples (booleans in their canonical form, XSD 1.1 Part 2 §3.3.2.2)", () => {
    expect(ntTerm({ type: "literal", value: "1", datatype: "http://www.w3.org/2001/XMLSchema#boolean" })).toBe('"true"^^<http://www.w3.org/2001/XMLSchema#boolean>');
    expect(ntTerm({ type: "literal", value: 'a"b', "xml:lang": "en" })).toBe('"a\\"b"@en');
    expect(ntTerm({ type: "uri", value: "http://x.example/a>b" })).toBeUndefined();
    expect(ntTerm({ type: "bnode", value: "nodeID://b10001" })).toBe("_:b10001");
  });
});
