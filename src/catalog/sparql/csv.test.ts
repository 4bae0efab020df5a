/**
 * The streaming CSV reader against the records of RFC 4180 §2 (its examples: fields in
 * quotes, a doubled quote, a line break inside quotes, CRLF record ends) and of SPARQL 1.1
 * Query Results CSV and TSV Formats §2.3 (the example result: IRIs as text, a blank node,
 * a literal with a comma and quotes, a newline inside a literal), fed whole and cut at every
 * position, since a connection may split the text anywhere.
 */
import { describe, expect, it } from "vitest";
import { CsvRecords } from "./csv.js";

function read(chunks: readonly string[]): { records: string[][]; ended: boolean } {
  const records: string[][] = [];
  const p = new CsvRecords((f) => records.push(f));
  for (const c of chunks) p.feed(c);
  return { records, ended: p.end() };
}

/** RFC 4180 §2 rules 1–7, as one text. */
const RFC = 'aaa,bbb,ccc\r\nzzz,yyy,xxx\r\n"aaa","b\r\nbb","ccc"\r\n"aaa","b""bb","ccc"\r\n';
const RFC_RECORDS = [
  ["aaa", "bbb", "ccc"],
  ["zzz", "yyy", "xxx"],
  ["aaa", "b\r\nbb", "ccc"],
  ["aaa", 'b"bb', "ccc"],
];

/** The result of SPARQL 1.1 Query Results CSV and TSV Formats §2.3 (x, literal). */
const SPARQL = 'x,literal\r\nhttp://example/x,String\r\nhttp://example/x,"String-with-dquote"""\r\n_:b0,Blank node\r\n_:b0,String-with-lang\r\n_:b0,123\r\nhttp://example.org/x,"Comma, inside"\r\n';
const SPARQL_RECORDS = [
  ["x", "literal"],
  ["http://example/x", "String"],
  ["http://example/x", 'String-with-dquote"'],
  ["_:b0", "Blank node"],
  ["_:b0", "String-with-lang"],
  ["_:b0", "123"],
  ["http://example.org/x", "Comma, inside"],
];

describe("SPARQL 1.1 Query Results CSV, streamed (RFC 4180 records)", () => {
  for (const [name, text, want] of [
    ["RFC 4180 §2", RFC, RFC_RECORDS],
    ["SPARQL 1.1 CSV §2.3", SPARQL, SPARQL_RECORDS],
  ] as const) {
    it(`reads the records of ${name}, whole and cut at every position`, () => {
      expect(read([text])).toEqual({ records: want, ended: true });
      for (let i = 0; i <= text.length; i++) expect(read([text.slice(0, i), text.slice(i)]), `cut at ${i}`).toEqual({ records: want, ended: true });
      // one character at a time
      expect(read([...text])).toEqual({ records: want, ended: true });
    });
  }

  it("takes LF alone as a record end (Virtuoso 7.2 writes LF), and an empty field between commas", () => {
    expect(read(['"s","n","b"\n"urn:x:a",3,\n"nodeID://b1",1,1\n']).records).toEqual([
      ["s", "n", "b"],
      ["urn:x:a", "3", ""],
      ["nodeID://b1", "1", "1"],
    ]);
  });

  it("says when the text stops inside a quoted field", () => {
    expect(read(['a,"unfinished\r\nstill']).ended).toBe(false);
    expect(read(['a,"finished"']).ended).toBe(true);
  });
});
