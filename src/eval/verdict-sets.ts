/**
 * The verdict set of issue 17: questions chosen to test the verdict, each tagged with one kind
 * (below), over two real open datasets (the world and debian catalogs of eval-sets.ts) and the
 * bundled demo catalog. Layout as the question sets (question-set.ts), with a `kind` column in
 * place of `phenomena`; gold from SPARQL in oxigraph (demo: over demo-triples.ts), the expected
 * verdict from the gold (question-set.ts `expectedVerdict`); split once like them
 * (`npm run eval:split -- --verdicts --set NAME`, test/fixtures/verdict/split.json).
 */
import { join } from "node:path";
import { demoCatalogPath } from "../catalog/index.js";
import { builtCatalog, repoRoot, setByName, type BuiltCatalog } from "./eval-sets.js";
import { DEMO_PREFIXES, demoTriples } from "./demo-triples.js";
import { readQuestionSet, type EvalQuestion, type TagVocabulary } from "./question-set.js";

/** The kinds of issue 17's "Must show", in its order. */
export const VERDICT_KINDS: readonly { key: string; title: string }[] = [
  { key: "unique", title: "clearly unique" },
  { key: "several", title: "2–4 right answers" },
  { key: "senses-open", title: "several senses of one name, nothing to choose" },
  { key: "senses-chosen", title: "several senses, the rest of the question chooses" },
  { key: "unknown-name", title: "a name not in the catalog" },
  { key: "unknown-code", title: "a code not in the catalog" },
  { key: "misspelt-two", title: "a misspelling near two names" },
  { key: "off-relation", title: "a clue linked by a relation the question does not ask about" },
];

/** The tag column of verdict set files. */
export const VERDICT_TAGS: TagVocabulary = { column: "kind", keys: new Set(VERDICT_KINDS.map((k) => k.key)) };

/** The committed split of the verdict sets, relative to the repository root. */
export const VERDICT_SPLIT_FILE = "test/fixtures/verdict/split.json";

/** One verdict set: its file, prefixes, source and catalog (tiepoint's file and the gold engine's triples). */
export interface VerdictSetSpec {
  readonly name: string;
  readonly file: string;
  readonly prefixes: Readonly<Record<string, string>>;
  readonly source: () => string;
  readonly catalog: (cacheDir?: string) => BuiltCatalog;
}

function onEvalSet(name: string): VerdictSetSpec {
  const spec = setByName(name);
  return { name, file: `test/fixtures/verdict/${name}.tsv`, prefixes: spec.prefixes, source: spec.source, catalog: (dir) => builtCatalog(spec, dir) };
}

/** Every verdict set. */
export const VERDICT_SETS: readonly VerdictSetSpec[] = [
  onEvalSet("world"),
  onEvalSet("debian"),
  {
    name: "demo",
    file: "test/fixtures/verdict/demo.tsv",
    prefixes: DEMO_PREFIXES,
    source: () => "the bundled demo catalog (data/*.jsonl; invented)",
    catalog: (dir) => ({ db: demoCatalogPath(dir !== undefined ? { cacheDir: dir } : {}), triples: demoTriples() }),
  },
];

/** The questions of a verdict set. */
export function verdictQuestionsOf(spec: VerdictSetSpec): EvalQuestion[] {
  return readQuestionSet(join(repoRoot(), spec.file), spec.name, VERDICT_TAGS);
}
