/**
 * Evaluation question sets (issue 16): natural questions over real open datasets, each with a
 * SPARQL 1.1 query (W3C Recommendation 2013) whose answers, computed by an independent engine —
 * oxigraph (npm `oxigraph` 0.5.11, a SPARQL engine in Rust/WebAssembly) over the very N-Triples
 * file tiepoint loads — are the gold.
 *
 * File layout (`test/fixtures/eval/SET.tsv`, UTF-8, tab-separated, a header row):
 * `id  phenomena  question  sparql  note` — `phenomena` is a comma list of {@link PHENOMENA}
 * keys, `sparql` one line (the set's prefixes, {@link SetSpec.prefixes}, are declared before
 * it), `note` free text (may be empty).
 *
 * Gold kinds, read from the query's results:
 * - `entities`: every binding of the first projected variable is an IRI; the set of them is
 *   the gold (empty: no answer expected).
 * - `count`: a single binding of a variable named `count` holding a number; the number is the
 *   gold, compared with `count.value` of the answer document.
 *
 * Expected verdict ({@link expectedVerdict}): `entities` — none for 0 answers, unique for 1,
 * tied for 2 or more; `count` — unique (the number is the answer and the counted set is the
 * one the query defines), none when the count is 0.
 *
 * The split ({@link splitIds}): one seeded shuffle per set, stratified by a question's first
 * phenomenon, half of each stratum (rounded up) to `dev`, the rest to `holdout`; the shuffle
 * is Fisher–Yates driven by the Lehmer generator x ← 48271·x mod (2³¹ − 1) (Park & Miller
 * 1988, multiplier of Park, Miller & Stockmeyer 1993).
 */
import { readFileSync } from "node:fs";
import { createRequire } from "node:module";
import { TiepointError } from "../model/index.js";

/** The twelve phenomena of issue 16, by key (the order of the issue). */
export const PHENOMENA: readonly { key: string; title: string }[] = [
  { key: "relation-head", title: "1 a relation noun heads the question" },
  { key: "three-hop", title: "2 chains of three hops, a described middle node" },
  { key: "modifier", title: "3 modifiers as constraints" },
  { key: "name-form", title: "4 names not written as the catalog writes them" },
  { key: "compare", title: "5 comparing named entities" },
  { key: "superlative", title: "6 superlatives, ordinals, counts over a set" },
  { key: "negation", title: "7 negation over a relation" },
  { key: "literal", title: "8 conditions on text, exact, negative and unit values" },
  { key: "direction", title: "9 direction" },
  { key: "description", title: "10 an entity named by what it is" },
  { key: "plural", title: "11 plural questions ask for the set" },
  { key: "ignored", title: "12 words to report as ignored" },
];
const PHENOMENON_KEYS = new Set(PHENOMENA.map((p) => p.key));

/** One question of a set. */
export interface EvalQuestion {
  readonly set: string;
  readonly id: string;
  readonly phenomena: readonly string[];
  readonly question: string;
  readonly sparql: string;
  readonly note: string;
  readonly file: string;
  readonly line: number;
}

/** A question's gold answer. */
export type Gold = { readonly kind: "entities"; readonly ids: readonly string[] } | { readonly kind: "count"; readonly value: number };

/** The verdicts a question may expect (contract.md statuses). */
export type ExpectedVerdict = "unique" | "tied" | "none";

/** The tag column of a question set file: its name and allowed values. */
export interface TagVocabulary {
  readonly column: string;
  readonly keys: ReadonlySet<string>;
}

/** The tags of issue 16's sets: the phenomena. */
export const PHENOMENON_TAGS: TagVocabulary = { column: "phenomena", keys: PHENOMENON_KEYS };

/** Reads a question set file; a bad line is a one-line error naming the file and line. `phenomena` holds the tags of `tags`' column. */
export function readQuestionSet(file: string, set: string, tags: TagVocabulary = PHENOMENON_TAGS): EvalQuestion[] {
  const lines = readFileSync(file, "utf8").split("\n");
  const header = lines[0]?.split("\t") ?? [];
  const want = ["id", tags.column, "question", "sparql", "note"];
  if (header.join("\t") !== want.join("\t")) throw new TiepointError("eval/questions", `header must be ${want.join(" TAB ")}`, { file, line: 1 });
  const out: EvalQuestion[] = [];
  const ids = new Set<string>();
  lines.forEach((text, i) => {
    if (i === 0 || text.trim() === "") return;
    const line = i + 1;
    const f = text.split("\t");
    if (f.length !== 5) throw new TiepointError("eval/questions", `expected 5 tab-separated fields, got ${f.length}`, { file, line });
    const [id, ph, question, sparql, note] = f as [string, string, string, string, string];
    if (!/^[a-z]+\d+$/.test(id)) throw new TiepointError("eval/questions", `bad id "${id}"`, { file, line });
    if (ids.has(id)) throw new TiepointError("eval/questions", `duplicate id "${id}"`, { file, line });
    ids.add(id);
    const phenomena = ph.split(",").map((s) => s.trim());
    for (const p of phenomena) if (!tags.keys.has(p)) throw new TiepointError("eval/questions", `unknown ${tags.column} value "${p}"`, { file, line });
    if (question.trim() === "" || sparql.trim() === "") throw new TiepointError("eval/questions", "empty question or sparql", { file, line });
    out.push({ set, id, phenomena, question, sparql, note, file, line });
  });
  return out;
}

/** The SPARQL prologue declaring `prefixes`. */
export function prologue(prefixes: Readonly<Record<string, string>>): string {
  return Object.entries(prefixes)
    .map(([p, iri]) => `PREFIX ${p}: <${iri}>`)
    .join("\n");
}

interface OxTerm {
  readonly termType: string;
  readonly value: string;
}
interface OxStore {
  load(data: string, options: { format: string }): void;
  query(q: string): Iterable<Map<string, OxTerm>> | boolean;
  readonly size: number;
}

const require = createRequire(import.meta.url);

/** The oxigraph version used for gold answers. */
export function oxigraphVersion(): string {
  return (require("oxigraph/package.json") as { version: string }).version;
}

/** An oxigraph store holding `triples` (N-Triples text). */
export function goldStore(triples: string): OxStore {
  const ox = require("oxigraph") as { Store: new () => OxStore };
  const store = new ox.Store();
  store.load(triples, { format: "application/n-triples" });
  return store;
}

/** Runs a question's query and reads its gold (see the file header); throws on a malformed query or result. */
export function goldOf(store: OxStore, q: EvalQuestion, prefixes: Readonly<Record<string, string>>): Gold {
  let rows: Map<string, OxTerm>[];
  try {
    const r = store.query(`${prologue(prefixes)}\n${q.sparql}`);
    if (typeof r === "boolean") throw new Error("an ASK query has no answers");
    rows = [...r];
  } catch (e) {
    throw new TiepointError("eval/sparql", `${q.id}: ${(e as Error).message.split("\n")[0]}`, { file: q.file, line: q.line });
  }
  const first = rows[0];
  if (rows.length === 1 && first?.has("count")) {
    const v = first.get("count")!;
    const n = Number(v.value);
    if (v.termType !== "Literal" || !Number.isFinite(n)) throw new TiepointError("eval/sparql", `${q.id}: ?count is not a number`, { file: q.file, line: q.line });
    return { kind: "count", value: n };
  }
  const ids = new Set<string>();
  for (const row of rows) {
    const t = [...row.values()][0];
    if (t === undefined) continue;
    if (t.termType !== "NamedNode") throw new TiepointError("eval/sparql", `${q.id}: answer ${t.value} is not an IRI`, { file: q.file, line: q.line });
    ids.add(t.value);
  }
  return { kind: "entities", ids: [...ids].sort() };
}

/** The verdict a gold answer calls for (see the file header). */
export function expectedVerdict(gold: Gold): ExpectedVerdict {
  if (gold.kind === "count") return gold.value > 0 ? "unique" : "none";
  return gold.ids.length === 0 ? "none" : gold.ids.length === 1 ? "unique" : "tied";
}

/** The committed split file's shape. */
export interface SplitFile {
  readonly method: string;
  readonly seed: number;
  readonly sets: Readonly<Record<string, { readonly dev: readonly string[]; readonly holdout: readonly string[] }>>;
}

/** Fisher–Yates over a copy, Lehmer-driven (see the file header). */
export function seededShuffle<T>(items: readonly T[], seed: number): T[] {
  const a = items.slice();
  let s = seed % 2147483647 || 1;
  for (let i = a.length - 1; i > 0; i--) {
    s = (s * 48271) % 2147483647;
    const j = s % (i + 1);
    [a[i], a[j]] = [a[j]!, a[i]!];
  }
  return a;
}

/** The dev/holdout split of one set's questions (stratified by first phenomenon; ids sorted within each half). */
export function splitIds(questions: readonly EvalQuestion[], seed: number): { dev: string[]; holdout: string[] } {
  const strata = new Map<string, string[]>();
  for (const q of questions) {
    const k = q.phenomena[0]!;
    strata.set(k, [...(strata.get(k) ?? []), q.id]);
  }
  const dev: string[] = [];
  const holdout: string[] = [];
  for (const k of [...strata.keys()].sort()) {
    const shuffled = seededShuffle(strata.get(k)!, seed);
    const half = Math.ceil(shuffled.length / 2);
    dev.push(...shuffled.slice(0, half));
    holdout.push(...shuffled.slice(half));
  }
  return { dev: dev.sort(), holdout: holdout.sort() };
}
