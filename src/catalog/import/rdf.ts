/**
 * RDF importer: RDF 1.1 N-Triples (W3C Recommendation 2014) and RDF 1.1 Turtle (W3C
 * Recommendation 2014), parsed by the n3 package's streaming parser, fed block by block
 * through a synchronous push source so the whole load stays in one SQLite transaction.
 * The triples are mapped onto the catalog as fixed by ../shared/contract.md ("RDF mapping").
 *
 * N-Triples is line-based, so after a syntax error parsing resumes on the next line and
 * every bad line is reported; in Turtle the first syntax error ends the file.
 * Blank nodes keep the file's label (`_:name`); a label already used in the catalog or by
 * an earlier file of the load gets a suffix (`_:name-2`), since blank nodes are local to
 * their file. Anonymous Turtle nodes (`[]`, collections) are named `_:anonN`.
 */
import { createRequire } from "node:module";
import type { Parser as N3Parser, Quad, Term } from "n3";
import type { LoadContext } from "./context.js";
import type { CatalogWriter } from "../writer.js";
import { readBlocks } from "./lines.js";
import { readPlainLine } from "./ntriples-lines.js";

const RDF = "http://www.w3.org/1999/02/22-rdf-syntax-ns#";
const RDFS = "http://www.w3.org/2000/01/rdf-schema#";
const SKOS = "http://www.w3.org/2004/02/skos/core#";
const XSD_STRING = "http://www.w3.org/2001/XMLSchema#string";
/** QUDT schema namespace (https://qudt.org/doc/DOC_SCHEMA-QUDT.html). */
const QUDT = "http://qudt.org/schema/qudt/";
const LANG_STRING = `${RDF}langString`;

/** The predicates with a fixed meaning (contract "RDF mapping"). */
export const VOCABULARY = {
  type: `${RDF}type`,
  label: `${RDFS}label`,
  prefLabel: `${SKOS}prefLabel`,
  altLabel: `${SKOS}altLabel`,
  subClassOf: `${RDFS}subClassOf`,
  comment: `${RDFS}comment`,
  description: "http://schema.org/description",
  descriptionHttps: "https://schema.org/description",
} as const;

/**
 * Predicates that give an attribute predicate its unit (`P qudt:unit unit:M`,
 * `P schema:unitText "metres"`): QUDT's `qudt:unit` and `qudt:hasUnit` (object: a unit IRI),
 * schema.org's `unitText` (a literal) and `unitCode` (a literal code, or an IRI), http and https.
 */
export const UNIT_VOCABULARY: Readonly<Record<string, "text" | "code" | "iri">> = {
  [`${QUDT}unit`]: "iri",
  [`${QUDT}hasUnit`]: "iri",
  "http://schema.org/unitText": "text",
  "https://schema.org/unitText": "text",
  "http://schema.org/unitCode": "code",
  "https://schema.org/unitCode": "code",
};

/** Importer options; all optional. */
export const DEFAULTS = {
  /** Language tags read as the "English or untagged first" preference (BCP 47 primary subtag). */
  preferredLanguage: "en",
};

/**
 * n3's parser class, required on the first RDF file of a process: n3 and its stream modules
 * cost about a fifth of a second of every command's start otherwise (`show`, `ask` read no RDF).
 */
let parserClass: typeof N3Parser | undefined;
function n3Parser(options: ConstructorParameters<typeof N3Parser>[0]): N3Parser {
  parserClass ??= (createRequire(import.meta.url)("n3") as typeof import("n3")).Parser;
  return new parserClass(options);
}

/** Marks labels the parser took from the file (vs. ones it generated). */
const MARK = "\u0001";

/** A synchronous stand-in for a readable stream: n3's lexer registers its handlers, we push. */
class PushSource {
  private data?: (s: string) => void;
  private end?: () => void;
  on(event: string, fn: (...args: never[]) => void): this {
    if (event === "data") this.data = fn as unknown as (s: string) => void;
    else if (event === "end") this.end = fn as unknown as () => void;
    return this;
  }
  push(text: string): void {
    this.data?.(text);
  }
  finish(): void {
    this.end?.();
  }
}

function preferred(lang: string): boolean {
  return lang === "" || lang.toLowerCase().split("-")[0] === DEFAULTS.preferredLanguage;
}

/** Blank-node labels of one file mapped to catalog ids (kept when the file is read a second time). */
class BlankNames {
  private readonly w: CatalogWriter;
  private readonly ids = new Map<string, string>();
  private anon = 0;

  constructor(w: CatalogWriter) {
    this.w = w;
  }

  /** The catalog id of blank node `value` (its file label, suffixed when taken; `_:anonN` for generated ones). */
  id(value: string): string {
    let id = this.ids.get(value);
    if (id !== undefined) return id;
    const base = value.startsWith(MARK) ? `_:${value.slice(1)}` : `_:anon${++this.anon}`;
    id = base;
    for (let k = 2; this.w.hasEntity(id); k++) id = `${base}-${k}`;
    this.ids.set(value, id);
    this.w.entity(id);
    return id;
  }
}

/**
 * Maps one file's triples onto the catalog (contract "RDF mapping"). A triple the mapping
 * rejects is passed to `reject` with its message instead.
 */
class TripleMapper {
  private readonly w: CatalogWriter;
  private readonly names: BlankNames;
  /** Entities whose current label is in a non-preferred language. */
  private readonly provisional = new Set<string>();

  constructor(w: CatalogWriter, names: BlankNames) {
    this.w = w;
    this.names = names;
  }

  private node(t: Term): string {
    return t.termType === "BlankNode" ? this.names.id(t.value) : t.value;
  }

  quad(q: Quad, reject: (message: string) => void): void {
    const w = this.w;
    const s = this.node(q.subject);
    const p = q.predicate.value;
    const o = q.object;
    const unit = UNIT_VOCABULARY[p];
    if (unit !== undefined && (o.termType === "Literal" || o.termType === "NamedNode")) {
      if (o.value.trim() !== "") w.predicateUnit(s, o.value.trim(), o.termType === "NamedNode" ? "iri" : unit === "iri" ? "text" : unit);
      return;
    }
    if (o.termType === "NamedNode" || o.termType === "BlankNode") {
      const target = this.node(o);
      if (p === VOCABULARY.type) w.type(s, target);
      else if (p === VOCABULARY.subClassOf) w.subclass(s, target);
      else w.edge(s, p, target);
      return;
    }
    if (o.termType !== "Literal") {
      reject(`unsupported object term (${o.termType}); expected an IRI, a blank node or a literal`);
      return;
    }
    const value = o.value;
    const lang = o.language;
    const dt = o.datatype.value;
    if (p === VOCABULARY.label || p === VOCABULARY.prefLabel || p === VOCABULARY.altLabel) {
      if (value.trim() === "") {
        reject(`empty label (${p === VOCABULARY.altLabel ? "skos:altLabel" : p === VOCABULARY.label ? "rdfs:label" : "skos:prefLabel"} of ${s} is "")`);
        return;
      }
      if (p === VOCABULARY.altLabel) w.alias(s, value);
      else if (preferred(lang)) {
        if (this.provisional.delete(s)) w.label(s, value, true);
        else w.label(s, value);
      } else {
        const had = w.hasLabel(s);
        w.label(s, value);
        if (!had) this.provisional.add(s);
      }
      return;
    }
    if ((p === VOCABULARY.comment || p === VOCABULARY.description || p === VOCABULARY.descriptionHttps) && preferred(lang)) {
      if (value.trim() !== "") w.description(s, value);
      return;
    }
    w.attribute(s, p, value, dt === XSD_STRING || dt === LANG_STRING ? null : dt, lang === "" ? null : lang);
  }
}

/** Ends the quick N-Triples pass at its first problem of any kind. */
class Restart extends Error {}

/** Imports one N-Triples (`nt`) or Turtle (`ttl`) file. */
export function importRdf(ctx: LoadContext, file: string, format: "nt" | "ttl"): void {
  const names = new BlankNames(ctx.writer);
  if (format === "nt" && readQuick(ctx, file, names)) return;
  readTracked(ctx, file, format, names);
}

/**
 * N-Triples without line tracking: true when the whole file was read without a problem.
 * Each line of the plain shape is read by ntriples-lines.ts (no general parser, no token
 * events); any other line goes to an n3 parser of its own. At the first syntax error,
 * rejected triple or bad line it stops and returns false, having reported nothing; the
 * caller then reads the file again with {@link readTracked}, which finds and reports the
 * same problems with their lines. What the quick pass wrote is rolled back with the failed load.
 */
function readQuick(ctx: LoadContext, file: string, names: BlankNames): boolean {
  ctx.line = 0; // not tracked here: warnings find their lines afterwards (names.ts locateWarnings)
  const mapper = new TripleMapper(ctx.writer, names);
  const startStatements = ctx.statements;
  const restart = (): never => {
    throw new Restart();
  };
  let bytes = 0;
  const general = (line: string): void => {
    let quads: Quad[];
    try {
      quads = n3Parser({ format: "N-Triples", blankNodePrefix: MARK }).parse(line + "\n");
    } catch {
      restart();
    }
    for (const q of quads!) {
      ctx.tick(bytes);
      mapper.quad(q, restart);
    }
  };
  try {
    readBlocks(
      file,
      (block) => {
        bytes = block.bytesRead;
        const text = block.text;
        for (let start = 0; start < text.length; ) {
          let end = text.indexOf("\n", start);
          if (end < 0) end = text.length;
          const line = text.slice(start, end);
          start = end + 1;
          const t = readPlainLine(line, MARK);
          if (t === null) continue;
          if (t === undefined) general(line);
          else {
            ctx.tick(bytes);
            mapper.quad(t as unknown as Quad, restart);
          }
        }
      },
      restart,
    );
    return true;
  } catch (e) {
    if (!(e instanceof Restart)) throw e;
    ctx.statements = startStatements;
    return false;
  }
}

/**
 * Reads a file with line tracking (n3's token events), reporting every problem at its line;
 * N-Triples resumes after each bad line, Turtle stops at its first syntax error.
 */
function readTracked(ctx: LoadContext, file: string, format: "nt" | "ttl", names: BlankNames): void {
  const mapper = new TripleMapper(ctx.writer, names);
  let bytes = 0;
  let line = 1;
  let offset = 0; // added to the parser's line numbers (N-Triples resumes with a new parser)
  let dead = false; // Turtle after a syntax error
  const reject = (message: string): void => ctx.error(file, line, message);
  const quad = (q: Quad): void => {
    ctx.tick(bytes);
    ctx.line = line;
    mapper.quad(q, reject);
  };

  const makeParser = (): PushSource => {
    const src = new PushSource();
    const parser = n3Parser({ format: format === "nt" ? "N-Triples" : "Turtle", blankNodePrefix: MARK });
    parser.parse(src as never, {
      onToken: (t: { line: number; type: string }) => {
        line = t.line + offset;
        if (t.type === ".") stmtOpen = false;
        else if (!stmtOpen && t.type !== "eof" && t.type !== "comment") {
          stmtOpen = true;
          stmtStart = line;
        }
      },
      onQuad: (err: Error | null, q: Quad | null) => {
        if (err) onSyntax(err);
        else if (q) quad(q);
      },
    } as never);
    return src;
  };

  let resumeAt = 0; // N-Triples: the line after the last syntax error
  // N-Triples: where the statement being read began; a statement left open on an earlier
  // line (no final ".") is reported there, and reading resumes on the line after it
  let stmtOpen = false;
  let stmtStart = 0;
  const onSyntax = (err: Error): void => {
    const ctxLine = (err as { context?: { line?: number } }).context?.line;
    const at = Math.min(ctxLine !== undefined ? ctxLine + offset : line, Math.max(lastLine, 1));
    const token = (err as { context?: { token?: { type?: string; value?: string } } }).context?.token;
    let msg = err.message.replace(/ on line \d+\.?$/, "").replace(/\.$/, "");
    if (/but got\s*$/.test(msg)) msg = msg.replace(/\s*$/, ` "${token?.type ?? "end of input"}"`);
    else if (/^Invalid IRI$/.test(msg) && token?.value) msg += ` <${token.value}>`;
    const hint = format === "nt" ? "expected an N-Triples statement: <subject> <predicate> <object> ." : "Turtle syntax";
    dead = true;
    if (format === "nt" && stmtOpen && stmtStart < at) {
      ctx.error(file, stmtStart, `syntax error: the statement does not end with "." on its line (${hint})`);
      resumeAt = stmtStart + 1;
    } else {
      ctx.error(file, at, `syntax error: ${msg} (${hint})`);
      resumeAt = at + 1;
    }
    stmtOpen = false;
  };

  let src = makeParser();
  let lastLine = 1;
  readBlocks(
    file,
    (block) => {
      bytes = block.bytesRead;
      lastLine = block.firstLine + block.lineCount - 1;
      if (dead && format === "ttl") return;
      let text = block.text;
      let first = block.firstLine;
      const endLine = block.firstLine + block.lineCount;
      // feed; after an N-Triples syntax error restart on the next line
      for (;;) {
        src.push(text);
        if (!dead || format === "ttl") return;
        if (resumeAt >= endLine) {
          // the error was on the block's last line(s)
          dead = false;
          offset = resumeAt - 1;
          src = makeParser();
          return;
        }
        const skip = Math.max(0, resumeAt - first);
        if (resumeAt < first) resumeAt = first;
        let pos = 0;
        for (let k = 0; k < skip; k++) pos = text.indexOf("\n", pos) + 1;
        text = text.slice(pos);
        first = resumeAt;
        offset = resumeAt - 1;
        dead = false;
        src = makeParser();
        if (text === "") return;
      }
    },
    (ln, kind, detail) => ctx.error(file, ln, kind === "utf8" ? `not valid UTF-8: ${detail}` : detail, "catalog/encoding"),
  );
  if (!dead) src.finish();
}
