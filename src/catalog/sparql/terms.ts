/**
 * RDF terms written as text: the one place where a name from a store, a catalog or a
 * question becomes part of a SPARQL query or an N-Triples line.
 *
 * SPARQL 1.1 Query Language (W3C Recommendation 2013) §19.8 grammar: an IRIREF is `<…>` with
 * no `<>"{}|^`\` and no character in U+0000–U+0020; a STRING_LITERAL_QUOTE is `"…"` with `"`,
 * `\`, LF and CR escaped (ECHAR). RDF 1.1 N-Triples (W3C Recommendation 2014) uses the same
 * two forms, and also allows UCHAR (`\uXXXX`) inside an IRIREF. An IRI with a character that
 * neither grammar allows cannot name a term of an RDF store, so {@link iriRef} refuses it
 * rather than sending a query that means something else; a literal can hold any text, since
 * every character that ends or breaks the string is escaped.
 */
import { TiepointError } from "../../model/index.js";

/** Characters an IRIREF may not contain (SPARQL 1.1 §19.8 rule [139], N-Triples rule [18]). */
const BAD_IRI = /[\u0000-\u0020<>"{}|^`\\]/;

/** True when `iri` can be written as an IRIREF. */
export function isWritableIri(iri: string): boolean {
  return iri !== "" && !BAD_IRI.test(iri) && !hasLoneSurrogate(iri);
}

function hasLoneSurrogate(s: string): boolean {
  return /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/.test(s);
}

/** `<iri>`, for SPARQL and N-Triples alike; an IRI the grammars cannot hold is an error (never sent). */
export function iriRef(iri: string): string {
  if (!isWritableIri(iri)) throw new TiepointError("catalog/iri", `not a writable IRI: ${JSON.stringify(iri.slice(0, 200))} (a character IRIs may not contain)`);
  return `<${iri}>`;
}

/** `"text"` with `"`, `\`, LF, CR (and TAB, BS, FF) escaped; lone surrogates become U+FFFD. */
export function stringLiteral(text: string): string {
  let out = '"';
  for (const ch of text.replace(/[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/g, "\uFFFD")) {
    switch (ch) {
      case '"':
        out += '\\"';
        break;
      case "\\":
        out += "\\\\";
        break;
      case "\n":
        out += "\\n";
        break;
      case "\r":
        out += "\\r";
        break;
      case "\t":
        out += "\\t";
        break;
      case "\b":
        out += "\\b";
        break;
      case "\f":
        out += "\\f";
        break;
      default:
        out += ch;
    }
  }
  return out + '"';
}

/** A literal with an optional language tag or datatype (`"x"@en`, `"1"^^<…#integer>`). */
export function literal(text: string, options: { readonly lang?: string; readonly datatype?: string } = {}): string {
  if (options.lang) {
    if (!/^[a-zA-Z]+(-[a-zA-Z0-9]+)*$/.test(options.lang)) throw new TiepointError("catalog/literal", `not a language tag: ${JSON.stringify(options.lang.slice(0, 40))}`);
    return `${stringLiteral(text)}@${options.lang}`;
  }
  const XSD_STRING = "http://www.w3.org/2001/XMLSchema#string";
  if (options.datatype && options.datatype !== XSD_STRING) return `${stringLiteral(text)}^^${iriRef(options.datatype)}`;
  return stringLiteral(text);
}

const XSD_BOOLEAN = "http://www.w3.org/2001/XMLSchema#boolean";

/** One term of SPARQL 1.1 Query Results JSON (W3C Recommendation 2013, §3.2.2). */
export interface ResultTerm {
  readonly type: "uri" | "literal" | "bnode" | "typed-literal";
  readonly value: string;
  readonly "xml:lang"?: string;
  readonly datatype?: string;
}

/**
 * The N-Triples form of a result term: an IRI, a literal, or a blank node as `_:label` (the
 * label made of the characters N-Triples allows). Returns undefined for an IRI no RDF
 * syntax can write (reported by the caller).
 */
export function ntTerm(t: ResultTerm): string | undefined {
  if (t.type === "uri") return isWritableIri(t.value) ? `<${t.value}>` : undefined;
  if (t.type === "bnode") return `_:${bnodeLabel(t.value)}`;
  const lang = t["xml:lang"];
  // a store may hand back a boolean in its other lexical form (Virtuoso: "1"/"0"); XSD 1.1 Part 2
  // §3.3.2.2 makes "true"/"false" the canonical ones, the form files are written in
  if (t.datatype === XSD_BOOLEAN && (t.value === "1" || t.value === "0")) return literal(t.value === "1" ? "true" : "false", { datatype: XSD_BOOLEAN });
  return literal(t.value, lang ? { lang } : t.datatype ? { datatype: t.datatype } : {});
}

/** A blank-node label the N-Triples grammar accepts (letters, digits, `_`, `-`; others as `_xHH`). */
export function bnodeLabel(value: string): string {
  const s = value.replace(/^nodeID:\/\//, "").replace(/[^A-Za-z0-9_-]/g, (c) => `_x${c.codePointAt(0)!.toString(16)}`);
  return /^[A-Za-z0-9_]/.test(s) ? s : `b${s}`;
}

/** The catalog id of a result term naming a node (an IRI as written, a blank node as `_:label`). */
export function nodeId(t: ResultTerm): string {
  return t.type === "bnode" ? `_:${bnodeLabel(t.value)}` : t.value;
}

/** "1"/"true" as a boolean cell of a CSV answer (SPARQL 1.1 CSV writes a boolean as its lexical form; Virtuoso as 1/0). */
export function csvTrue(cell: string): boolean {
  return cell === "1" || cell === "true";
}

/**
 * A node read from a CSV answer (SPARQL 1.1 Query Results CSV §2 writes an IRI as its text and
 * a blank node as `_:label`; Virtuoso writes `nodeID://…` as in its JSON), told apart by the
 * query's own `isBlank` column.
 */
export function csvNode(text: string, blank: boolean): ResultTerm {
  return blank ? { type: "bnode", value: text.startsWith("_:") ? text.slice(2) : text } : { type: "uri", value: text };
}

/** A literal read from a CSV answer, with the `lang` and `datatype` the query projected beside it (empty when none). */
export function csvLiteral(text: string, lang: string, datatype: string): ResultTerm {
  return lang !== "" ? { type: "literal", value: text, "xml:lang": lang } : datatype !== "" ? { type: "typed-literal", value: text, datatype } : { type: "literal", value: text };
}
