/**
 * Synthetic catalog generator: a typed multi-relational graph with a heavy-tailed degree
 * distribution, written as RDF 1.1 N-Triples, plus a question file whose expected answers are
 * computed exactly from the generated edges.
 *
 * Method: every edge draws a relation kind by weight, a subject from the relation's domain and
 * an object from its range. Ranks inside a class are drawn from a bounded power law
 * (Rng.zipf; objects with exponent 0.9, subjects 0.3) and mapped to entities by a fixed
 * multiplicative permutation, so each class has a few hubs holding a large share of the edges
 * (Zipf-sampled endpoints in the manner of Chung–Lu expected-degree graphs:
 * [Reference] F. Chung, L. Lu, "Connected components in random graphs with given expected
 * degree sequences", Annals of Combinatorics 6, 2002).
 * Streaming: lines are written in ~1 MB chunks; the only whole-graph state is three typed
 * arrays (subject, relation, object) and the CSR arrays built from them for the questions.
 * Deterministic: the same options give the same bytes (xoshiro128** seeded by `seed`).
 */
import { closeSync, mkdirSync, openSync, writeSync } from "node:fs";
import { join } from "node:path";
import { TiepointError } from "../model/index.js";
import { hash32, Rng } from "./random.js";
import { inventedName, personName } from "./names.js";
import { ATTRIBUTES, LEAVES, leafRun, RELATIONS, TYPES, typeOfRun } from "./schema.js";

/** Defaults of {@link generateCatalog}. */
export const DEFAULTS = {
  /** Condition questions written to conditions.tsv (at most `questions`). */
  conditionQuestions: 30,
  /** Smallest and largest set a condition question is over. */
  conditionSetMin: 100,
  conditionSetMax: 5000,
  entities: 10_000,
  edges: 50_000,
  seed: 1,
  /** Questions written to questions.tsv. */
  questions: 100,
  /** Share of entities that borrow the label of an entity of another class. */
  sharedLabelShare: 0.02,
  /** Share of entities given an extra alias beyond the ones every class has. */
  aliasShare: 0.3,
  /** Power-law exponent of subject ranks. */
  subjectExponent: 0.3,
  /** Power-law exponent of object ranks (hubs). */
  objectExponent: 0.9,
  /** Largest expected-answer set a generated question may have. */
  maxAnswers: 10,
} as const;

/** Options of {@link generateCatalog}; all but `out` optional. */
export interface GenerateOptions {
  /** Output folder (created when missing). */
  readonly out: string;
  /** Number of entities (≥ 100). @default 10000 */
  readonly entities?: number;
  /** Number of relation edges. @default 50000 */
  readonly edges?: number;
  /** Random seed. @default 1 */
  readonly seed?: number;
  /** Number of questions. @default 100 */
  readonly questions?: number;
  /** Share of entities with a borrowed label. @default 0.02 */
  readonly sharedLabelShare?: number;
  /** Object-rank power-law exponent. @default 0.9 */
  readonly objectExponent?: number;
  /** Subject-rank power-law exponent. @default 0.3 */
  readonly subjectExponent?: number;
  /** Largest expected-answer set per question. @default 10 */
  readonly maxAnswers?: number;
  /** Called now and then with a phase name and a fraction done. */
  readonly onProgress?: (phase: string, done: number) => void;
}

/** What {@link generateCatalog} wrote. */
export interface GenerateResult {
  /** The N-Triples files, in load order (schema, entities, edges). */
  readonly files: readonly string[];
  /** The question file (`question<TAB>id|id…`, the check format). */
  readonly questions: string;
  /**
   * Questions with conditions over large sets (the check format): superlatives, comparisons
   * and counts over the subjects of one relation to one entity, sets of at least
   * `DEFAULTS.conditionSetMin` members, gold computed from the generated values.
   */
  readonly conditionQuestions: string;
  readonly conditionQuestionCount: number;
  readonly entities: number;
  /** Edge lines written (a few may repeat an earlier triple; the catalog keeps one). */
  readonly edges: number;
  readonly questionCount: number;
  /** The largest in+out degree of any entity (edge lines counted). */
  readonly maxDegree: number;
  /** Entities sharing their label with an entity of another class. */
  readonly sharedLabels: number;
  readonly seconds: number;
}

/** IRI prefixes used by generated catalogs. */
export const IRI = {
  entity: "urn:tp:e:",
  type: "urn:tp:t:",
  relation: "urn:tp:r:",
  attribute: "urn:tp:a:",
} as const;

const RDF_TYPE = "<http://www.w3.org/1999/02/22-rdf-syntax-ns#type>";
const RDFS_LABEL = "<http://www.w3.org/2000/01/rdf-schema#label>";
const RDFS_COMMENT = "<http://www.w3.org/2000/01/rdf-schema#comment>";
const RDFS_SUBCLASS = "<http://www.w3.org/2000/01/rdf-schema#subClassOf>";
const SKOS_ALT = "<http://www.w3.org/2004/02/skos/core#altLabel>";

/** Buffered synchronous writer of one file. */
class Sink {
  private readonly fd: number;
  private parts: string[] = [];
  private size = 0;
  constructor(path: string) {
    this.fd = openSync(path, "w");
  }
  write(s: string): void {
    this.parts.push(s);
    this.size += s.length;
    if (this.size > 1 << 20) this.flush();
  }
  flush(): void {
    if (this.parts.length) writeSync(this.fd, this.parts.join(""));
    this.parts = [];
    this.size = 0;
  }
  close(): void {
    this.flush();
    closeSync(this.fd);
  }
}

function lit(s: string): string {
  return `"${s.replace(/\\/g, "\\\\").replace(/"/g, '\\"').replace(/\n/g, "\\n")}"`;
}

function intOption(name: string, v: number | undefined, dflt: number, min: number): number {
  const x = v ?? dflt;
  if (!Number.isInteger(x) || x < min) throw new TiepointError("gen/options", `--${name} must be an integer ≥ ${min}, got ${v}`);
  return x;
}

/** Compressed sparse rows of one direction: the neighbours of u are at [off[u], off[u+1]). */
interface Csr {
  readonly off: Int32Array;
  readonly nbr: Int32Array;
  readonly rel: Uint8Array;
}

function buildCsr(n: number, from: Int32Array, to: Int32Array, rel: Uint8Array): Csr {
  const off = new Int32Array(n + 1);
  for (let i = 0; i < from.length; i++) off[from[i]! + 1]!++;
  for (let u = 0; u < n; u++) off[u + 1]! += off[u]!;
  const pos = off.slice(0, n);
  const nbr = new Int32Array(from.length);
  const r = new Uint8Array(from.length);
  for (let i = 0; i < from.length; i++) {
    const p = pos[from[i]!]!++;
    nbr[p] = to[i]!;
    r[p] = rel[i]!;
  }
  return { off, nbr, rel: r };
}

/** Distinct neighbours of u via relation r, ascending. */
function nbrs(c: Csr, u: number, r: number): number[] {
  const out: number[] = [];
  for (let p = c.off[u]!; p < c.off[u + 1]!; p++) if (c.rel[p] === r) out.push(c.nbr[p]!);
  out.sort((a, b) => a - b);
  return out.filter((x, i) => i === 0 || out[i - 1] !== x);
}

/**
 * Generates a synthetic catalog into `options.out`: schema.nt, entities.nt, edges.nt and
 * questions.tsv. Same options → same bytes.
 */
export function generateCatalog(options: GenerateOptions): GenerateResult {
  const t0 = performance.now();
  const N = intOption("entities", options.entities, DEFAULTS.entities, 100);
  const M = intOption("edges", options.edges, DEFAULTS.edges, 0);
  const seed = intOption("seed", options.seed, DEFAULTS.seed, 0);
  const Q = intOption("questions", options.questions, DEFAULTS.questions, 0);
  const maxAnswers = intOption("max-answers", options.maxAnswers, DEFAULTS.maxAnswers, 1);
  if (N > 2 ** 30) throw new TiepointError("gen/options", `--entities must be at most ${2 ** 30}, got ${N}`);
  const shareShared = options.sharedLabelShare ?? DEFAULTS.sharedLabelShare;
  const sObj = options.objectExponent ?? DEFAULTS.objectExponent;
  const sSub = options.subjectExponent ?? DEFAULTS.subjectExponent;
  const progress = options.onProgress ?? (() => undefined);
  mkdirSync(options.out, { recursive: true });
  const rng = new Rng(seed);

  // --- classes: contiguous entity ranges per leaf
  const leafStart = new Int32Array(LEAVES.length + 1);
  {
    let acc = 0;
    const sizes = LEAVES.map((l) => Math.floor((N * l.share) / 100));
    sizes[0]! += N - sizes.reduce((a, b) => a + b, 0);
    sizes.forEach((s, i) => {
      leafStart[i] = acc;
      acc += s;
    });
    leafStart[LEAVES.length] = acc;
  }
  const leafOf = (e: number): number => {
    let lo = 0;
    let hi = LEAVES.length - 1;
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if (leafStart[mid]! <= e) lo = mid;
      else hi = mid - 1;
    }
    return lo;
  };

  // --- relations: domain and range runs with their permutation multipliers
  const relRuns = RELATIONS.map((r) => {
    const [dlo, dhi] = leafRun(r.domain);
    const [rlo, rhi] = leafRun(r.range);
    return { dlo, dhi, rlo, rhi, dStart: leafStart[dlo]!, dSize: leafStart[dhi + 1]! - leafStart[dlo]!, rStart: leafStart[rlo]!, rSize: leafStart[rhi + 1]! - leafStart[rlo]! };
  });
  const permMul = (size: number): number => (size % 1_000_003 === 0 ? 999_983 : 1_000_003);
  const totalWeight = RELATIONS.reduce((a, r) => a + r.weight, 0);
  const cumWeight = RELATIONS.map(
    (
      (acc) => (r) =>
        (acc += r.weight / totalWeight)
    )(0),
  );

  // --- labels: base labels are distinct by construction; a few entities borrow another class's
  const twin = (e: number): number => {
    if (hash32(e, 7) % 10_000 >= shareShared * 10_000) return e;
    const t = hash32(e, 9) % N;
    return leafOf(t) === leafOf(e) ? e : t;
  };
  const shared = new Uint8Array(N);
  let sharedLabels = 0;
  for (let e = 0; e < N; e++) {
    const t = twin(e);
    if (t !== e) {
      shared[e] = 1;
      shared[t] = 1;
      sharedLabels++;
    }
  }
  const SITE = ["Ridge", "Basin", "Shoal", "Fen", "Crater", "Sound", "Flats"];
  const KIND = ["profiler", "spectrometer", "magnetometer", "sounder", "corer", "sampler"];
  const COMPANY = ["Works", "Instruments", "Systems", "Marine"];
  const ARTICLE = ["Studies of %", "% revisited", "Notes on %", "The % record"];
  const baseLabel = (e: number): string => {
    const leaf = LEAVES[leafOf(e)]!.key;
    const h = hash32(e, 3);
    switch (leaf) {
      case "Researcher":
      case "Engineer": {
        const p = personName(e);
        return `${p.given} ${p.surname}`;
      }
      case "Lab":
        return `${inventedName(e)} Laboratory`;
      case "Company":
        return `${inventedName(e)} ${COMPANY[h % COMPANY.length]}`;
      case "Instrument":
        return `${inventedName(e)} ${KIND[h % KIND.length]}`;
      case "Report":
        return `${inventedName(e)} field report`;
      case "Article":
        return ARTICLE[h % ARTICLE.length]!.replace("%", inventedName(e));
      case "Site":
        return `${inventedName(e)} ${SITE[h % SITE.length]}`;
      case "Project":
        return `Project ${inventedName(e)}`;
      case "Event":
        return `${inventedName(e)} Workshop`;
      default:
        return inventedName(e); // Vessel, Town
    }
  };
  const label = (e: number): string => baseLabel(twin(e));

  // --- schema.nt
  const files = ["schema.nt", "entities.nt", "edges.nt"].map((f) => join(options.out, f));
  {
    const s = new Sink(files[0]!);
    for (const t of TYPES) {
      const iri = `<${IRI.type}${t.key}>`;
      s.write(`${iri} ${RDFS_LABEL} ${lit(t.label)} .\n`);
      for (const a of t.aliases) s.write(`${iri} ${SKOS_ALT} ${lit(a)} .\n`);
      if (t.parent) s.write(`${iri} ${RDFS_SUBCLASS} <${IRI.type}${t.parent}> .\n`);
      s.write(`${iri} ${RDFS_COMMENT} ${lit(`The class of every ${t.label} in the generated catalog.`)} .\n`);
    }
    for (const r of RELATIONS) {
      const iri = `<${IRI.relation}${r.key}>`;
      s.write(`${iri} ${RDFS_LABEL} ${lit(r.label)} .\n`);
      for (const a of r.aliases) s.write(`${iri} ${SKOS_ALT} ${lit(a)} .\n`);
    }
    for (const a of ATTRIBUTES) {
      const iri = `<${IRI.attribute}${a.key}>`;
      s.write(`${iri} ${RDFS_LABEL} ${lit(a.label)} .\n`);
      for (const x of a.aliases) s.write(`${iri} ${SKOS_ALT} ${lit(x)} .\n`);
    }
    s.close();
  }

  // --- edges.nt (and the typed arrays)
  const src = new Int32Array(M);
  const dst = new Int32Array(M);
  const rel = new Uint8Array(M);
  {
    const s = new Sink(files[2]!);
    const relIri = RELATIONS.map((r) => `> <${IRI.relation}${r.key}> <${IRI.entity}`);
    for (let i = 0; i < M; i++) {
      const u = rng.next();
      let r = 0;
      while (r < cumWeight.length - 1 && u >= cumWeight[r]!) r++;
      const run = relRuns[r]!;
      let a: number;
      let b: number;
      do {
        a = run.dStart + ((rng.zipf(run.dSize, sSub) * permMul(run.dSize)) % run.dSize);
        b = run.rStart + ((rng.zipf(run.rSize, sObj) * permMul(run.rSize)) % run.rSize);
      } while (a === b);
      src[i] = a;
      dst[i] = b;
      rel[i] = r;
      s.write(`<${IRI.entity}${a}${relIri[r]}${b}> .\n`);
      if ((i & 0xfffff) === 0) progress("edges", i / M);
    }
    s.close();
  }
  progress("index", 0);
  const out = buildCsr(N, src, dst, rel);
  const inn = buildCsr(N, dst, src, rel);
  let maxDegree = 0;
  for (let e = 0; e < N; e++) maxDegree = Math.max(maxDegree, out.off[e + 1]! - out.off[e]! + inn.off[e + 1]! - inn.off[e]!);

  // --- entities.nt
  {
    const s = new Sink(files[1]!);
    const typeIri = LEAVES.map((l) => `<${IRI.type}${l.key}>`);
    const leafLabel = LEAVES.map((l) => TYPES.find((t) => t.key === l.key)!.label);
    const attrsByLeaf = LEAVES.map((l) => ATTRIBUTES.filter((a) => a.leaves.includes(l.key)));
    for (let e = 0; e < N; e++) {
      const iri = `<${IRI.entity}${e}>`;
      const leaf = leafOf(e);
      const lab = label(e);
      s.write(`${iri} ${RDF_TYPE} ${typeIri[leaf]} .\n${iri} ${RDFS_LABEL} ${lit(lab)} .\n`);
      const h = hash32(e, 5);
      const key = LEAVES[leaf]!.key;
      // class-specific alias forms
      if (key === "Researcher" || key === "Engineer") {
        if (h % 1000 < DEFAULTS.aliasShare * 1000) {
          const [g, ...rest] = lab.split(" ");
          if (rest.length) s.write(`${iri} ${SKOS_ALT} ${lit(`${g!.charAt(0)}. ${rest.join(" ")}`)} .\n`);
        }
      } else if (key === "Lab") s.write(`${iri} ${SKOS_ALT} ${lit(lab.replace(/ Laboratory$/, " Lab"))} .\n`);
      else if (key === "Vessel") s.write(`${iri} ${SKOS_ALT} ${lit(`RV ${lab}`)} .\n`);
      else if (key === "Project") s.write(`${iri} ${SKOS_ALT} ${lit(lab.replace(/^Project /, "").slice(0, 4).toUpperCase())} .\n`);
      else if (key === "Instrument" && h % 1000 < DEFAULTS.aliasShare * 1000) s.write(`${iri} ${SKOS_ALT} ${lit(`${lab.slice(0, 2).toUpperCase()}-${h % 900 + 100}`)} .\n`);
      // a description naming one real neighbour, for context
      let desc: string;
      const cap = leafLabel[leaf]!.charAt(0).toUpperCase() + leafLabel[leaf]!.slice(1);
      if (out.off[e + 1]! > out.off[e]!) {
        const p = out.off[e]!;
        desc = `${cap} that ${RELATIONS[out.rel[p]!]!.verb} ${label(out.nbr[p]!)}.`;
      } else if (inn.off[e + 1]! > inn.off[e]!) {
        const p = inn.off[e]!;
        desc = `${cap}; ${label(inn.nbr[p]!)} ${RELATIONS[inn.rel[p]!]!.verb} it.`;
      } else desc = `${cap} with no recorded links.`;
      s.write(`${iri} ${RDFS_COMMENT} ${lit(desc)} .\n`);
      for (const a of attrsByLeaf[leaf]!) {
        const v = a.min + (hash32(e, 11 + a.key.length * 13 + a.key.charCodeAt(0)) % (a.max - a.min + 1));
        s.write(`${iri} <${IRI.attribute}${a.key}> "${v}" .\n`);
      }
      if ((e & 0xfffff) === 0) progress("entities", e / N);
    }
    s.close();
  }

  // --- questions.tsv
  progress("questions", 0);
  const qPath = join(options.out, "questions.tsv");
  const qs = new Sink(qPath);
  const seen = new Set<string>();
  const typeLabelOfRun = (lo: number, hi: number): string => typeOfRun(lo, hi)?.label ?? "thing";
  const isPerson = (lo: number, hi: number) => typeOfRun(lo, hi)?.key === "Person";
  const cut = (a: [number, number], b: [number, number]): [number, number] | null => {
    const lo = Math.max(a[0], b[0]);
    const hi = Math.min(a[1], b[1]);
    return lo <= hi ? [lo, hi] : null;
  };
  const domRun = (r: number): [number, number] => [relRuns[r]!.dlo, relRuns[r]!.dhi];
  const rngRun = (r: number): [number, number] => [relRuns[r]!.rlo, relRuns[r]!.rhi];
  const inRun = (e: number, run: [number, number]) => e >= leafStart[run[0]]! && e < leafStart[run[1] + 1]!;
  const ids = (xs: readonly number[]) => xs.map((x) => `${IRI.entity}${x}`).join("|");
  let written = 0;
  const emit = (q: string, answers: readonly number[]): void => {
    if (seen.has(q)) return;
    seen.add(q);
    qs.write(`${q}\t${ids(answers)}\n`);
    written++;
  };
  const qrng = new Rng(seed ^ 0x5bd1e995);
  const maxTries = Q * 400;
  for (let tries = 0; written < Q && tries < maxTries && M > 0; tries++) {
    const i = qrng.int(M);
    const kind = written % 4;
    const a = src[i]!;
    const r1 = rel[i]!;
    const b = dst[i]!;
    const R1 = RELATIONS[r1]!;
    if (kind === 0) {
      // one hop, against the stored direction: which X r1 b?
      if (shared[b]) continue;
      const xs = nbrs(inn, b, r1);
      if (xs.length > maxAnswers) continue;
      const [lo, hi] = domRun(r1);
      const who = isPerson(lo, hi) && qrng.next() < 0.5 ? "Who" : `Which ${typeLabelOfRun(lo, hi)}`;
      emit(`${who} ${R1.verb} ${label(b)}?`, xs);
    } else if (kind === 1) {
      // one hop, along the stored direction: a r1 which Y?
      if (shared[a]) continue;
      const ys = nbrs(out, a, r1);
      if (ys.length > maxAnswers) continue;
      const [lo, hi] = rngRun(r1);
      emit(`${label(a)} ${R1.verb} which ${typeLabelOfRun(lo, hi)}?`, ys);
    } else if (kind === 2) {
      // two clues: which X r1 b and r2 c?
      const deg = out.off[a + 1]! - out.off[a]!;
      if (deg < 2) continue;
      const p = out.off[a]! + qrng.int(deg);
      const r2 = out.rel[p]!;
      const c = out.nbr[p]!;
      if (c === b || shared[b] || shared[c]) continue;
      const A = nbrs(inn, b, r1);
      const B = nbrs(inn, c, r2);
      const setA = new Set(A);
      const xs = B.filter((x) => setA.has(x) && x !== b && x !== c);
      if (xs.length === 0 || xs.length > maxAnswers || xs.length >= A.length || xs.length >= B.length) continue;
      const run = cut(domRun(r1), domRun(r2));
      if (!run) continue;
      const R2 = RELATIONS[r2]!;
      const who = isPerson(run[0], run[1]) && qrng.next() < 0.5 ? "Who" : `Which ${typeLabelOfRun(run[0], run[1])}`;
      const q = r1 === r2 ? `${who} ${R1.verb} both ${label(b)} and ${label(c)}?` : `${who} ${R1.verb} ${label(b)} and ${R2.verb} ${label(c)}?`;
      emit(q, xs);
    } else {
      // two hops: which X r0 a Y that r1 b?  (x r0 y, y r1 b)
      if (shared[b]) continue;
      const din = inn.off[a + 1]! - inn.off[a]!;
      if (din === 0) continue;
      const p = inn.off[a]! + qrng.int(din);
      const r0 = inn.rel[p]!;
      const yRun = cut(rngRun(r0), domRun(r1));
      if (!yRun) continue;
      const ys = nbrs(inn, b, r1).filter((y) => inRun(y, yRun));
      if (ys.length > 50) continue;
      const xsSet = new Set<number>();
      for (const y of ys) for (const x of nbrs(inn, y, r0)) if (x !== b) xsSet.add(x);
      const xs = [...xsSet].sort((u, v) => u - v);
      if (xs.length === 0 || xs.length > maxAnswers) continue;
      const [lo, hi] = domRun(r0);
      const who = isPerson(lo, hi) && qrng.next() < 0.5 ? "Who" : `Which ${typeLabelOfRun(lo, hi)}`;
      emit(`${who} ${RELATIONS[r0]!.verb} a ${typeLabelOfRun(yRun[0], yRun[1])} that ${R1.verb} ${label(b)}?`, xs);
    }
  }
  qs.close();

  // --- conditions.tsv: superlative, comparison and count questions over sets of hundreds
  const cPath = join(options.out, "conditions.tsv");
  const cs = new Sink(cPath);
  const attrsOfLeaf = LEAVES.map((l) => ATTRIBUTES.filter((a) => a.leaves.includes(l.key)));
  // the value the entities file states (same formula as there)
  const valueOf = (e: number, a: (typeof ATTRIBUTES)[number]): number => a.min + (hash32(e, 11 + a.key.length * 13 + a.key.charCodeAt(0)) % (a.max - a.min + 1));
  const plural = (w: string) => (/[^aeiou]y$/.test(w) ? `${w.slice(0, -1)}ies` : /(s|sh|ch|x)$/.test(w) ? `${w}es` : `${w}s`);
  const cWant = Math.min(Q, DEFAULTS.conditionQuestions);
  const cSeen = new Set<string>();
  let cWritten = 0;
  const crng = new Rng(seed ^ 0x2c1b3c6d);
  for (let tries = 0; cWritten < cWant && tries < cWant * 400 && M > 0; tries++) {
    const i = crng.int(M);
    const b = dst[i]!;
    const r1 = rel[i]!;
    if (shared[b]) continue;
    const key = `${b}:${r1}`;
    if (cSeen.has(key)) continue;
    cSeen.add(key);
    const xs = nbrs(inn, b, r1);
    if (xs.length < DEFAULTS.conditionSetMin || xs.length > DEFAULTS.conditionSetMax) continue;
    // an attribute every member's class carries (one leaf class per relation domain run)
    const leaves = [...new Set(xs.map(leafOf))];
    const common = attrsOfLeaf[leaves[0]!]!.filter((a) => leaves.every((l) => attrsOfLeaf[l]!.includes(a)));
    const a = common[crng.int(Math.max(common.length, 1))];
    if (!a) continue;
    const [lo, hi] = domRun(r1);
    const type = typeLabelOfRun(lo, hi);
    const verb = RELATIONS[r1]!.verb;
    const vals = xs.map((x) => valueOf(x, a));
    const kind = cWritten % 3;
    if (kind === 0) {
      const largest = crng.next() < 0.5;
      const best = largest ? Math.max(...vals) : Math.min(...vals);
      cs.write(`Which ${type} that ${verb} ${label(b)} has the ${largest ? "largest" : "smallest"} ${a.label}?\t${ids(xs.filter((_, k) => vals[k] === best))}\n`);
    } else {
      // the threshold: the set's median value, so about half the set passes
      const t = [...vals].sort((u, v) => u - v)[vals.length >> 1]!;
      const pass = xs.filter((_, k) => vals[k]! > t);
      if (pass.length === 0) continue;
      cs.write(kind === 1 ? `Which ${plural(type)} that ${verb} ${label(b)} have a ${a.label} above ${t}?\t${ids(pass)}\n` : `How many ${plural(type)} that ${verb} ${label(b)} have a ${a.label} above ${t}?\t${ids(pass)}\n`);
    }
    cWritten++;
  }
  cs.close();
  progress("done", 1);
  return {
    files,
    questions: qPath,
    conditionQuestions: cPath,
    conditionQuestionCount: cWritten,
    entities: N,
    edges: M,
    questionCount: written,
    maxDegree,
    sharedLabels,
    seconds: (performance.now() - t0) / 1000,
  };
}
