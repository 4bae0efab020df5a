/**
 * Cue chains: which relation cues belong to which clue, and in which order (and direction) a
 * path from that clue should take them.
 *
 * Method: (1) attribution — every place a cued relation stands in the question (a "step",
 * several cues on the same word being alternatives of one step) is attached to the nearest
 * clue mention in the string, the attachment-by-proximity rule of English surface parsing
 * ("right association", Kimball 1973, "Seven principles of surface structure parsing in
 * natural language", Cognition 2(1)), not across a coordination ("wrote R *and* leads P":
 * "leads" belongs to P); (2) order — a clue's steps are taken nearest first:
 * in a right-branching chain of relative clauses and of-phrases ("the X that R1 the Y that
 * R2 C", "the R1 of the R2 of C") each relation word joins the noun phrase next to it, so
 * the relation word next to the clue is the first hop out of it and the farthest the last
 * — except that a relation word followed by a clue with only function words between ("studied
 * *at* M", "directed by Q") takes that clue, its object, first
 * (Quirk et al. 1985, "A Comprehensive Grammar of the English Language", §17.10 ff.,
 * relative clauses as postmodifiers); (3) direction — each step's stored direction from
 * the clue's position (subject left of the verb, SVO, with the voice flip of the cue word;
 * see {@link expectedInverse}): in a right-branching chain the noun phrase a hop starts
 * from stands on the same side of the relation word as the clue.
 *
 * The chain is a relation-path pattern (a regular path query of fixed length, Mendelzon &
 * Wood 1995) that the ranking matches against the paths from the clue to each candidate.
 * (4) intermediate types — a type noun standing between two relation words ("the *corer*
 * aboard", "a *document* that cites") names the node between those hops, so the step
 * carries that type (the type nouns are found like the answer type: Porter-stem keys of
 * the catalog's type labels and aliases, type-words.ts).
 * (5) coordinated clues — mentions joined only by a coordination ("borders both *A and B*",
 * "*A, B or C*") are conjuncts of one noun phrase and fill the same slot of the sentence
 * (Quirk et al. 1985, §13.1 ff., coordination of noun phrases), so each of them takes the
 * steps attributed to any of them, ordered and directed from the group's span.
 * (6) a described conjunct — a clue coordinated with a noun phrase described by a relative
 * clause ("depends on both A *and the package that* B is needed by") — gives the clue inside
 * the clause its own steps first, then those of the clue it is coordinated with: the described
 * noun fills that clue's slot.
 * Pure string positions: no catalog names or words are involved.
 */
import type { Analysis } from "./analyze.js";
import type { Condition } from "./conditions.js";
import type { RelationCue } from "./relation-cues.js";
import { isFunctionWord, words } from "./words.js";

/** Options of {@link cueChains}; all optional. */
export interface CueChainOptions {
  /** Cues with a lower match score make no step (weak partial matches would add bogus hops). @default 0.75 */
  readonly minScore?: number;
}

/** Defaults of {@link CueChainOptions}. */
export const DEFAULTS = { minScore: 0.75 } as const;

/** Coordinating conjunctions and list punctuation (common practice: they join clauses of equal rank). */
const COORDINATION = /\b(?:and|or|but|nor)\b|[,;]/i;

/**
 * The text between two conjoined noun phrases and nothing else: conjunctions, list
 * punctuation, articles and the focusing "also" ("A, B and also the C"); at least one
 * conjunction or comma.
 */
const CONJUNCT_GAP = /^(?:\s|,|;|&|\b(?:and|or|nor|as well as|also|the|a|an)\b)*$/i;
const HAS_CONJUNCTION = /,|;|&|\b(?:and|or|nor|as well as)\b/i;

/**
 * The text between a clue and a clue inside a described noun phrase coordinated with it: a
 * conjunction, a determiner, the phrase's head words and a relative word opening the clause
 * the second clue stands in ("automake *and the package that* m4 is needed by"; Quirk et al.
 * 1985 §13.1 ff. and §17.9 ff.).
 */
const DESCRIBED_CONJUNCT = /^\s*,?\s*(?:and|or|as well as)\s+(?:also\s+)?(?:the|a|an)\s+[^,;:.!?]*?\b(?:that|which|who|whom)\s+(?:[^,;:.!?\s]+\s+)?$/i;

/** The text from the end of a relation phrase to a following clue: only function words (no content word, no punctuation). */
function argumentGap(gap: string): boolean {
  if (/[,;:.!?()]/.test(gap)) return false;
  return gap.trim().split(/\s+/).every((w) => w === "" || isFunctionWord(w.toLowerCase()));
}

/** True when the mention at `s` is a possessive ("Peru's", "Peru’s", "the Moll's"). */
function possessive(text: string, s: { start: number; end: number }): boolean {
  return /['’]s$/i.test(text.slice(s.start, s.end)) || /^['’]s\b/i.test(text.slice(s.end, s.end + 3));
}

/** One way to take a chain step: a relation and its stored direction. */
export interface StepOption {
  /** Predicate num. */
  readonly relation: number;
  /** True: walk against the stored triple (the clue side is its object). */
  readonly inverse: boolean;
  /** Index into `Analysis.relationCues`. */
  readonly cue: number;
}

/** One hop of a chain: the relation word at `at`, with its possible relations. */
export interface ChainStep {
  /** UTF-16 offset of the relation word. */
  readonly at: number;
  /** The relations this word cues (alternatives), ordered by cue index. */
  readonly options: readonly StepOption[];
  /** Type nums the node reached by this hop should have (a type noun before the next hop's word); empty: any. */
  readonly types: readonly number[];
  /**
   * "whose *only* neighbour is C", "whose *sole* dependencies are A and B": the node reached by
   * this hop has exactly this many edges of the hop's relations back towards the clue side
   * (query-graph.ts `exclusiveSteps`). Absent: no count.
   */
  readonly only?: number;
  /**
   * Conditions on the node this hop reaches, an inner node of the query graph ("the capital of
   * the *largest* country in R"; query-graph.ts `attachConditions`): the ranking keeps the
   * entities at that node that satisfy them before the next hop. Absent: none.
   */
  readonly conditions?: readonly Condition[];
}

/** The relation-path pattern implied for one clue. */
export interface CueChain {
  /** Index into `Analysis.clues`. */
  readonly clue: number;
  /** Hops out of the clue, nearest relation word first (may be empty). */
  readonly steps: readonly ChainStep[];
  /**
   * The clues coordinated with this one ("both A and B"), itself included, ascending; they
   * share one pattern, which must hold from each of them. Absent when the clue stands alone.
   */
  readonly conjuncts?: readonly number[];
}

/**
 * The relation-path pattern of each clue (same order as `analysis.clues`). A cue whose
 * places all lie nearer other clues belongs only to those; the ranking uses that to leave a
 * dropped clue's cue words out (ablation).
 */
export function cueChains(analysis: Pick<Analysis, "question" | "mentions" | "clues" | "relationCues" | "typeWords">, options: CueChainOptions = {}): CueChain[] {
  const minScore = options.minScore ?? DEFAULTS.minScore;
  const spans = analysis.clues.map((c) => {
    const m = analysis.mentions[c.mention];
    return { start: m?.start ?? 0, end: m?.end ?? 0 };
  });
  // characters between the word and the clue; a coordination in between ("R1 C1 and R2 C2")
  // closes the attachment, so it costs more than any distance within the question
  const text = analysis.question ?? "";
  // characters from the word at `at` to a span; `argument` applies the object rule below
  // a clue right of a relation phrase is measured from the phrase's end ("the home port *of* M")
  const phraseEnd = new Map(relationPhraseSpans(analysis).map((p) => [p.start, p.end]));
  const spanDistance = (s: { start: number; end: number }, at: number, argument: boolean) => {
    const after = Math.min(Math.max(phraseEnd.get(at) ?? at, at), s.start);
    const d = at >= s.end ? at - s.end : at < s.start ? s.start - after : 0;
    const gap = at >= s.end ? text.slice(s.end, at) : at < s.start ? text.slice(after, s.start) : "";
    if (COORDINATION.test(gap)) return d + 1e6;
    // a verbal compound "N-Ving"/"N-Ved" ("Arabic-speaking", "Oslo-based"): the noun before
    // the hyphen is the participle's argument (Quirk et al. 1985, App. I.44 ff., verbal compounds)
    if (argument && at >= s.end && /^\s*[-‐‑]\s*$/.test(gap)) return -1;
    // a relation word whose object follows it with only function words between ("studied
    // *at* M", "works for Y", "cited by Z") takes that clue as its argument
    // (not a possessive clue: "the capital of *Peru's* neighbour E" — Peru's only determines E)
    if (argument && at < s.start && argumentGap(gap) && !possessive(text, s)) return 0;
    return d;
  };
  const distance = (c: number, at: number) => spanDistance(spans[c]!, at, true);
  // steps per clue, keyed by word offset
  const perClue = analysis.clues.map(() => new Map<number, StepOption[]>());
  if (analysis.clues.length === 0) return [];
  analysis.relationCues.forEach((cue: RelationCue, i) => {
    if (cue.score < minScore) return;
    const places = cue.occurrences ?? [{ start: cue.start, flip: cue.flip }];
    for (const p of places) {
      let best = 0;
      for (let c = 1; c < spans.length; c++) if (distance(c, p.start) < distance(best, p.start)) best = c;
      const clueStart = spans[best]!.start;
      const inverse = clueStart > p.start !== p.flip;
      const list = perClue[best]!.get(p.start) ?? [];
      if (!list.some((o) => o.relation === cue.relation && o.inverse === inverse)) list.push({ relation: cue.relation, inverse, cue: i });
      perClue[best]!.set(p.start, list);
    }
  });
  // (5) groups of coordinated clue mentions, in string order; each member takes the group's steps
  const order = spans.map((_, c) => c).sort((a, b) => spans[a]!.start - spans[b]!.start || a - b);
  const groupOf = spans.map((_, c) => [c]);
  for (let k = 1; k < order.length; k++) {
    const a = order[k - 1]!;
    const b = order[k]!;
    const gap = spans[a]!.end <= spans[b]!.start ? text.slice(spans[a]!.end, spans[b]!.start) : "";
    if (gap !== "" && CONJUNCT_GAP.test(gap) && HAS_CONJUNCTION.test(gap)) {
      const merged = [...groupOf[a]!, ...groupOf[b]!.filter((x) => !groupOf[a]!.includes(x))];
      for (const x of merged) groupOf[x] = merged;
    }
  }
  const groupSpan = groupOf.map((g) => ({ start: Math.min(...g.map((x) => spans[x]!.start)), end: Math.max(...g.map((x) => spans[x]!.end)) }));
  const shared = perClue.map((own, c) => {
    const g = groupOf[c]!;
    if (g.length === 1) return own;
    const all = new Map<number, StepOption[]>();
    for (const x of g) {
      for (const [at, opts] of perClue[x]!) {
        const list = all.get(at) ?? [];
        for (const o of opts) if (!list.some((y) => y.relation === o.relation && y.inverse === o.inverse)) list.push(o);
        all.set(at, list);
      }
    }
    return all;
  });
  // a group member's steps are ordered from the group's span (the coordination inside it costs nothing)
  const groupDistance = (c: number, at: number) => (groupOf[c]!.length === 1 ? distance(c, at) : spanDistance(groupSpan[c]!, at, false));
  // a type noun inside a relation phrase ("home *port*") names the relation, not a node between hops
  const cueSpans = relationPhraseSpans(analysis);
  const typeWords = (analysis.typeWords ?? []).filter((t) => !cueSpans.some((s) => t.start >= s.start && t.end <= s.end));
  // (6) a described conjunct ("depends on both automake *and the package that m4 is needed
  // by*"): the clue inside the relative clause reaches the conjunct's noun by its own steps,
  // and that noun fills the slot of the clue it is coordinated with, so the steps of that
  // clue's group follow
  const describedBy = new Map<number, number>();
  for (let k = 1; k < order.length; k++) {
    const a = order[k - 1]!;
    const b = order[k]!;
    if (groupOf[a]!.includes(b) || spans[a]!.end > spans[b]!.start) continue;
    if (DESCRIBED_CONJUNCT.test(text.slice(spans[a]!.end, spans[b]!.start))) describedBy.set(b, a);
  }
  const byDistance = (c: number, steps: Iterable<[number, StepOption[]]>) => [...steps].sort((x, y) => groupDistance(c, x[0]) - groupDistance(c, y[0]) || x[0] - y[0]);
  return shared.map((steps, c) => {
    const host = describedBy.get(c);
    const ordered = byDistance(c, steps.entries());
    if (host !== undefined) ordered.push(...byDistance(host, [...shared[host]!.entries()].filter(([at]) => !steps.has(at))));
    const chainSteps = ordered.map(([at, opts], i) => {
      // the node this hop reaches: a type noun strictly between this word and the next hop's
      const next = ordered[i + 1]?.[0];
      const lo = next === undefined ? at : Math.min(at, next);
      const hi = next === undefined ? at : Math.max(at, next);
      const types = [...new Set(typeWords.filter((t) => t.start > lo && t.start < hi).flatMap((t) => t.types))].sort((a, b) => a - b);
      return { at, options: [...opts].sort((x, y) => x.cue - y.cue), types };
    });
    const g = groupOf[c]!;
    return g.length > 1 ? { clue: c, steps: chainSteps, conjuncts: [...g].sort((a, b) => a - b) } : { clue: c, steps: chainSteps };
  });
}

/**
 * The character spans of each place of each relation cue: from the place's first word on, the
 * following words that are words of the cue ("home port" of a cue with words home, port).
 */
function relationPhraseSpans(analysis: Pick<Analysis, "question" | "relationCues">): { start: number; end: number }[] {
  const ws = words(analysis.question ?? "");
  const out: { start: number; end: number }[] = [];
  for (const cue of analysis.relationCues) {
    const own = new Set(cue.words);
    for (const p of cue.occurrences ?? [{ start: cue.start, flip: cue.flip }]) {
      let k = ws.findIndex((w) => w.start === p.start);
      if (k < 0) continue;
      const start = ws[k]!.start;
      while (k + 1 < ws.length && own.has(ws[k + 1]!.text)) k++;
      out.push({ start, end: ws[k]!.end });
    }
  }
  return out;
}
