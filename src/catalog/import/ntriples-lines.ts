/**
 * Plain N-Triples lines, read without a general parser
 * ====================================================
 *
 * Reads the common shape of a line of RDF 1.1 N-Triples (W3C Recommendation 25 February 2014,
 * section 7 "N-Triples Grammar"): `subject predicate object .` where IRIs are written without
 * escapes and start with a scheme, blank-node labels are ASCII letters, digits, `_` and `-`,
 * and literals use the grammar's string escapes (ECHAR `\t \b \n \r \f \" \' \\`, UCHAR
 * `\uXXXX`, `\UXXXXXXXX`) with an optional language tag or datatype IRI; then an optional
 * comment. A line of any other shape (an IRI with an escape, a relative IRI, a blank-node
 * label with a dot or a non-ASCII character, a surrogate escape, anything malformed) is not
 * read here: the caller hands it to the n3 parser, which accepts or rejects it, so the two
 * paths agree by construction on every line this one declines.
 *
 * The terms have the shape of n3's (the RDF/JS data model: `termType`, `value`, `language`,
 * `datatype`) with n3's conventions: language tags in lower case, plain literals typed
 * xsd:string, language-tagged ones rdf:langString, blank nodes valued `prefix + label`.
 * (src/catalog/import/ntriples.test.ts compares the two readers line by line.)
 */

const XSD_STRING = "http://www.w3.org/2001/XMLSchema#string";
const LANG_STRING = "http://www.w3.org/1999/02/22-rdf-syntax-ns#langString";

/** An IRI or blank-node term. */
export interface NodeTerm {
  readonly termType: "NamedNode" | "BlankNode";
  readonly value: string;
}

/** A literal term. */
export interface LiteralTerm {
  readonly termType: "Literal";
  readonly value: string;
  readonly language: string;
  readonly datatype: { readonly termType: "NamedNode"; readonly value: string };
}

/** One triple read from a line. */
export interface LineTriple {
  readonly subject: NodeTerm;
  readonly predicate: NodeTerm;
  readonly object: NodeTerm | LiteralTerm;
}

const STRING_TYPE = { termType: "NamedNode", value: XSD_STRING } as const;
const LANG_TYPE = { termType: "NamedNode", value: LANG_STRING } as const;

const isSpace = (c: number) => c === 0x20 || c === 0x09 || c === 0x0d;
const isAlpha = (c: number) => (c >= 0x41 && c <= 0x5a) || (c >= 0x61 && c <= 0x7a);
const isDigit = (c: number) => c >= 0x30 && c <= 0x39;

/**
 * Reads one line (without its line break). Returns the triple; null for a line with no
 * statement (blank or a comment); undefined when the line is not of the plain shape (see
 * the file header) and must go to the general parser.
 */
export function readPlainLine(line: string, blankPrefix: string): LineTriple | null | undefined {
  const n = line.length;
  let i = 0;
  while (i < n && isSpace(line.charCodeAt(i))) i++;
  if (i === n || line.charCodeAt(i) === 0x23) return null;
  let end = 0;
  // a term reader sets `end` to the index after the term and returns it, or undefined
  const iri = (at: number): string | undefined => {
    if (line.charCodeAt(at) !== 0x3c) return undefined;
    let k = at + 1;
    // a scheme: ALPHA *( ALPHA / DIGIT / "+" / "-" / "." ) ":" (RFC 3986 section 3.1)
    if (!isAlpha(line.charCodeAt(k))) return undefined;
    k++;
    for (let c = line.charCodeAt(k); isAlpha(c) || isDigit(c) || c === 0x2b || c === 0x2d || c === 0x2e; c = line.charCodeAt(++k));
    if (line.charCodeAt(k) !== 0x3a) return undefined;
    for (; k < n; k++) {
      const c = line.charCodeAt(k);
      if (c === 0x3e) break;
      // IRIREF excludes #x00-#x20 < > " { } | ^ ` \ (an escape goes to the general parser)
      if (c <= 0x20 || c === 0x3c || c === 0x22 || c === 0x7b || c === 0x7d || c === 0x7c || c === 0x5e || c === 0x60 || c === 0x5c) return undefined;
    }
    if (k === n) return undefined;
    end = k + 1;
    return line.slice(at + 1, k);
  };
  const node = (at: number): NodeTerm | undefined => {
    const c = line.charCodeAt(at);
    if (c === 0x3c) {
      const value = iri(at);
      return value === undefined ? undefined : { termType: "NamedNode", value };
    }
    if (c !== 0x5f || line.charCodeAt(at + 1) !== 0x3a) return undefined;
    let k = at + 2;
    for (let d = line.charCodeAt(k); isAlpha(d) || isDigit(d) || d === 0x5f || d === 0x2d; d = line.charCodeAt(++k));
    const first = line.charCodeAt(at + 2);
    if (k === at + 2 || first === 0x2d) return undefined;
    end = k;
    return { termType: "BlankNode", value: blankPrefix + line.slice(at + 2, k) };
  };
  const literal = (at: number): LiteralTerm | undefined => {
    let k = at + 1;
    let value = "";
    let from = k;
    for (;;) {
      if (k >= n) return undefined;
      const c = line.charCodeAt(k);
      if (c === 0x22) break;
      if (c === 0x0d || c === 0x0a) return undefined;
      if (c !== 0x5c) {
        k++;
        continue;
      }
      value += line.slice(from, k);
      const e = line.charCodeAt(k + 1);
      let add: string | undefined;
      let skip = 2;
      if (e === 0x74) add = "\t";
      else if (e === 0x62) add = "\b";
      else if (e === 0x6e) add = "\n";
      else if (e === 0x72) add = "\r";
      else if (e === 0x66) add = "\f";
      else if (e === 0x22) add = '"';
      else if (e === 0x27) add = "'";
      else if (e === 0x5c) add = "\\";
      else if (e === 0x75 || e === 0x55) {
        const digits = e === 0x75 ? 4 : 8;
        const hex = line.slice(k + 2, k + 2 + digits);
        if (hex.length !== digits || !/^[0-9A-Fa-f]+$/.test(hex)) return undefined;
        const cp = parseInt(hex, 16);
        if (cp > 0x10ffff || (cp >= 0xd800 && cp <= 0xdfff)) return undefined;
        add = String.fromCodePoint(cp);
        skip = 2 + digits;
      }
      if (add === undefined) return undefined;
      value += add;
      k += skip;
      from = k;
    }
    value += line.slice(from, k);
    k++;
    const c = line.charCodeAt(k);
    if (c === 0x40) {
      // LANGTAG: "@" [a-zA-Z]+ ("-" [a-zA-Z0-9]+)*
      let j = k + 1;
      while (isAlpha(line.charCodeAt(j))) j++;
      if (j === k + 1) return undefined;
      while (line.charCodeAt(j) === 0x2d) {
        const s = ++j;
        while (isAlpha(line.charCodeAt(j)) || isDigit(line.charCodeAt(j))) j++;
        if (j === s) return undefined;
      }
      end = j;
      return { termType: "Literal", value, language: line.slice(k + 1, j).toLowerCase(), datatype: LANG_TYPE };
    }
    if (c === 0x5e) {
      if (line.charCodeAt(k + 1) !== 0x5e) return undefined;
      const dt = iri(k + 2);
      if (dt === undefined) return undefined;
      return { termType: "Literal", value, language: "", datatype: dt === XSD_STRING ? STRING_TYPE : { termType: "NamedNode", value: dt } };
    }
    end = k;
    return { termType: "Literal", value, language: "", datatype: STRING_TYPE };
  };
  const space = (at: number): number => {
    while (at < n && isSpace(line.charCodeAt(at))) at++;
    return at;
  };

  const subject = node(i);
  if (subject === undefined) return undefined;
  i = space(end);
  if (line.charCodeAt(i) !== 0x3c) return undefined;
  const p = iri(i);
  if (p === undefined) return undefined;
  i = space(end);
  const object = line.charCodeAt(i) === 0x22 ? literal(i) : node(i);
  if (object === undefined) return undefined;
  i = space(end);
  if (line.charCodeAt(i) !== 0x2e) return undefined;
  i = space(i + 1);
  if (i < n && line.charCodeAt(i) !== 0x23) return undefined;
  return { subject, predicate: { termType: "NamedNode", value: p }, object };
}
