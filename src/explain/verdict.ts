/**
 * The verdict: one decider
 * ========================
 *
 * Whether the best answer is the only one that fits the question, decided in this one place
 * for every question (issue 17) from four inputs: the ranking's candidates with their path
 * evidence (explain.ts), the question's reading as the ranking evaluated it (analysis
 * query-graph.ts: `Ranked.matched` entities satisfy every clue's relation-path pattern), the
 * outcome of its conditions (ranking conditions.ts: filters, orderings, counts) and the link
 * facts (clue mentions not found, clue mentions whose chosen sense is not clearly ahead of the
 * next, each evaluated by the pipeline under that other sense). Rules, first match wins:
 *
 * 1. `none` — no clue was linked and no condition picks entities on its own; every clue's
 *    mention is not found (no catalog entity matches its words: the linker's floor, a code
 *    whose digits the linked name does not carry, or a name matched only in part when no
 *    entity satisfies the reading); no candidate was ranked; no clue reaches
 *    the best candidate within N hops.
 * 2. Conditions. No clue: the entities that pass the conditions decide (0 `none`, 1 `unique`,
 *    2 or more `tied`). The conditions removed every candidate: `none` when entities
 *    satisfied the reading, `weak` otherwise. A count: the number is the answer, so the
 *    verdict says whether the counted set is certain — `none` for 0, `unique` when every
 *    clue was found, no clue is in doubt (rule 4) and the reading matched, `weak` (naming
 *    why) otherwise; never `tied`. A superlative or ordinal: `tied` with the candidates that
 *    share the asked value, else `unique`.
 * 3. The reading: when every clue is constrained by a pattern of at most `maxSteps` hops and
 *    entities satisfy the whole reading, 2 or more of them are `tied` (a plural question asks
 *    for the set; a singular one has no single answer) and exactly one is `unique`; evidence
 *    along relations the question does not name never ties with it or breaks their tie.
 *    An entity that satisfies the reading counts as reached by every clue (the reading's
 *    patterns reach it) even when the path search found no path to it — as for another sense
 *    of a clue's own mention, which is a seed of that clue.
 * 4. Link doubt, on top of rules 2–3 and 6: a clue mention whose next sense has at least
 *    `senseRatio` × the chosen sense's confidence is in doubt. When the question read with
 *    that other sense has answers that fit its reading and are not among this verdict's (nor
 *    the mention's chosen entity itself: a question does not ask for what it names — "the
 *    capital of Luxembourg" read as the city gives the country back),
 *    the verdict is `tied` with them (`senses` says which sense each comes from); when the
 *    other sense fits nothing and this reading matched, the question itself chose the sense
 *    and nothing changes; otherwise a `unique` becomes `weak`, naming the mention. A next
 *    sense between `faintRatio` and `senseRatio` × the chosen one's confidence ties only
 *    through answers of its own (never `weak`), and not when a noun in close apposition
 *    restricts the name ("the engineer Ilse Varrick": the linker read that noun, the
 *    reading does not; pipeline link-facts.ts).
 * 5. Some clue's mention is not found (not all), or a name written like one (a capital, a
 *    digit) matches nothing and is no clue: `weak`, naming it — the answer rests on the rest.
 * 6. The score rules, when the reading decides nothing (no entity satisfies it, or a clue is
 *    unconstrained) — only here does evidence along relations the question does not name count,
 *    and only when the best answer does not satisfy the reading: when it does (a clue held
 *    only by a neighbour constraint — "a South American country" —, which orders the answers
 *    but cannot decide the set: the question may mean a longer path), its rivals below are only
 *    the candidates that satisfy the reading too; a plural question asks for the set, so there
 *    every candidate that satisfies the reading is `tied` with it;
 *    - `tied` — the best answer is reached by every clue and other candidates fit about
 *      equally well: either their score is at least `tieRatio` × the best score with the
 *      same clue coverage (and their paths follow the cued relations wherever the best
 *      answer's do), or their evidence is structurally equivalent (the relation pattern of
 *      every clue's best path reaches them too, see relation-pattern.ts) and their score is
 *      at least `equivalentFloor` × the best.
 *    - `weak` — some clue does not reach the best answer within N hops, or not along the
 *      relation-path pattern the question's wording names for that clue (ranking
 *      `chainMissOf`), or another candidate's evidence dominates it (every clue reaches the
 *      other in no more hops, and some clue in fewer along relations the question names —
 *      unless the other fits the question's pattern less well, ranking `chainFit`), or its
 *      relative lead over the runner-up is below `weakMargin`.
 *    - `unique` — otherwise: one answer clearly ahead and supported by every clue.
 *
 * `margin` = (s₁ − s₂) / s₁, the relative lead of the best score s₁ over s₂, the best score
 * among the other candidates that the ranking counts as covering as many clues and whose
 * best paths follow the question's cued relations wherever the best answer's do (1 when
 * there is none); 0 for a tie of the reading, of the senses or of a condition, 1 for a
 * condition's single answer.
 *
 * Thresholds. `senseRatio` 0.5: the linker's confidences are normalised over a mention's
 * candidates (linking collective-disambiguation.ts), so a next sense with half the chosen
 * one's confidence leaves odds of 2 : 1 or closer — not clearly ahead, a guess a quiz writer
 * cannot rely on. `faintRatio` 0.25 (odds up to 4 : 1): those confidences also carry each
 * entity's prominence in the catalog, which says nothing about the sense a quiz writer
 * meant, so a sense that far behind is still read again, and ties when the question's
 * reading gives it answers of its own. On the demo catalog "Dr Brenn" in "What did Dr Brenn
 * design?" (Mira 0.79, Tomas 0.20; both designed something) is such a case; "Harnesk" as a
 * vessel against the town (0.96 / 0.04) and "Mornmere" (0.86 / 0.12) are below it, and
 * "Kingston" in "Which Caribbean country has Kingston as its capital?" (0.80 / 0.19) is read
 * again and its other sense fits nothing the question asks. Measured on the dev half
 * of the verdict set (README "Verdicts"). `tieRatio` 0.9 and `weakMargin` 0.15: score-ratio ties and relative margins are common
 * practice in answer ranking (cf. the "margin" confidence of Scheffer et al., "Active hidden
 * Markov models for information extraction", IDA 2001: the gap between the two best
 * hypotheses); `equivalentFloor` 0.25 is tiepoint's own (README "Verdicts").
 */
import type { Condition, QueryGraph } from "../analysis/index.js";
import type { EntityRef, SenseAnswer, Verdict, VerdictMention } from "../model/index.js";
import type { ConditionOutcome } from "../ranking/index.js";

/** Options of {@link decideVerdict}; all optional. */
export interface VerdictOptions {
  /** A rival with score ≥ tieRatio × best and the same coverage is tied. @default 0.9 */
  readonly tieRatio?: number;
  /** A structurally equivalent rival with score ≥ equivalentFloor × best is tied. @default 0.25 */
  readonly equivalentFloor?: number;
  /** A lead below this relative margin makes the answer weak. @default 0.15 */
  readonly weakMargin?: number;
  /** A mention whose next sense has at least this share of the chosen one's confidence is not clearly ahead. @default 0.5 */
  readonly senseRatio?: number;
  /** From this share up to `senseRatio`, the next sense ties through answers of its own only. @default 0.25 */
  readonly faintRatio?: number;
  /** Longest clue pattern (hops) that counts as a constraint of the reading (rank's `chainMaxSteps`). @default 3 */
  readonly maxSteps?: number;
}

/** The defaults of {@link VerdictOptions}. */
export const DEFAULTS = { tieRatio: 0.9, equivalentFloor: 0.25, weakMargin: 0.15, senseRatio: 0.5, faintRatio: 0.25, maxSteps: 3 } as const;

/** A ranked candidate as the verdict sees it. */
export interface VerdictCandidate {
  readonly node: number;
  readonly id: string;
  readonly label: string;
  readonly score: number;
  /** Per clue: reached within N hops. Undefined when not computed (beyond the top rows). */
  readonly reached?: readonly boolean[];
  /** The ranking's clue coverage count, when known. */
  readonly covered?: number;
  /** Per clue: hops of the best path (null when not reached), when computed. */
  readonly hops?: readonly (number | null)[];
  /** Per clue: true when the best path walks only relations cued by the question, when computed. */
  readonly cued?: readonly boolean[];
  /** The ranking's relation-path pattern factor (1: the path the question's wording implies reaches it), when known. */
  readonly chainFit?: number;
  /** Clues (indexes into the clue list) whose relation-path pattern misses this candidate, when checked (best candidate only). */
  readonly chainMissed?: readonly number[];
}

/** A clue mention as the verdict names it. */
export type MentionFacts = VerdictMention;

/** A clue mention in doubt between two senses, and what the question gives under the other one. */
export interface SenseDoubt {
  /** The mention as linked (its `next` is the other sense). */
  readonly mention: MentionFacts & { readonly next: EntityRef & { readonly confidence: number } };
  /** The answers of the question read with the other sense that fit that reading (empty: none fits); null: not evaluated. */
  readonly answers: readonly EntityRef[] | null;
  /** A noun in close apposition restricts the name's sense ("the engineer Ilse Varrick"; pipeline link-facts.ts). */
  readonly modified?: boolean;
}

/** How the question was read and linked, and what its conditions did (absent parts: not known, their rules are skipped). */
export interface VerdictContext {
  /** The reading (analysis query-graph.ts) and how the ranking evaluated it. */
  readonly reading?: {
    readonly graph: Pick<QueryGraph, "chains" | "plural">;
    /** The entities that satisfy the whole reading (ranking `Ranked.matched`; those the conditions removed do not count). */
    readonly matched: ReadonlySet<number>;
    readonly fallback: boolean;
    /** Clues whose pattern the ranking left open (ranking `Ranked.open`). */
    readonly open: number;
  };
  /** The question's conditions and their outcome (ranking conditions.ts). */
  readonly conditions?: { readonly list: readonly Condition[]; readonly outcome: ConditionOutcome };
  /** Clue mentions not found (no catalog entity matches their words). */
  readonly notFound?: readonly MentionFacts[];
  /** Clue mentions matched by part of a name only (linking match `partial`): not found when the reading fits nothing. */
  readonly partial?: readonly MentionFacts[];
  /** Names written like one (a capital, a digit) that nothing in the catalog matches and that are no clue (linking `notFound`, not linked). */
  readonly unlinked?: readonly MentionFacts[];
  /** Clue mentions in doubt between two senses. */
  readonly doubts?: readonly SenseDoubt[];
  /** Id and label of a node (conditions name entities by node). */
  readonly ref: (node: number) => EntityRef;
}

/** What the verdict is decided from. */
export interface VerdictInput {
  /** Clue labels, in clue order. */
  readonly clues: readonly string[];
  /** Candidates, best first. */
  readonly candidates: readonly VerdictCandidate[];
  /** Nodes whose evidence is structurally equivalent to the best answer's (null: unknown). */
  readonly equivalent: ReadonlySet<number> | null;
  /** The N of "within N hops". */
  readonly maxHops: number;
  /** The reading, conditions and link facts (absent: the score rules alone, as for a clue ablation). */
  readonly context?: VerdictContext;
}

const fmt = (x: number): string => x.toFixed(2);
const pct = (x: number): string => `${Math.round(x * 100)} %`;
const quoted = (m: MentionFacts): string => `'${m.text}'`;
/** Two senses' names, told apart by id when they share a label. */
const senseNames = (a: EntityRef | null, b: EntityRef): [string, string] =>
  a && a.label === b.label ? [`${a.label} [${a.id}]`, `${b.label} [${b.id}]`] : [a?.label ?? "?", b.label];

/** "no catalog entity matches 'KX-999'; nearest: KX-114, 6 %" */
export function notFoundText(m: MentionFacts): string {
  return `no catalog entity matches ${quoted(m)}${m.entity ? `; nearest: ${m.entity.label}${m.confidence !== undefined ? `, ${pct(m.confidence)}` : ""}` : ""}`;
}

/** A list of labels, at most five named. */
/**
 * `c` with `reached` replaced. A candidate may read its id and label on demand through getters
 * of its class (explain.ts `NamedCandidate`); an object spread would copy only own fields and
 * drop them, so the copy keeps the prototype.
 */
function withReached(c: VerdictCandidate, reached: readonly boolean[]): VerdictCandidate {
  return Object.assign(Object.create(Object.getPrototypeOf(c) as object) as VerdictCandidate, c, { reached });
}

function names(list: readonly { label: string }[]): string {
  return list.slice(0, 5).map((c) => c.label).join(", ") + (list.length > 5 ? `, … (${list.length} in all)` : "");
}

/** Decides the verdict (see the file header for the rules). */
export function decideVerdict(input: VerdictInput, options: VerdictOptions = {}): Verdict {
  const o = { ...DEFAULTS, ...options };
  for (const [k, v] of Object.entries(o)) {
    if (k === "maxSteps") continue;
    if (!(v >= 0 && v <= 1)) throw new RangeError(`explain/verdict: ${k} must be in [0, 1], got ${String(v)}`);
  }
  const ctx = input.context;
  if (!ctx) return scoreVerdict(input, o);
  const r = ctx.reading;
  const readingFits = r === undefined || (!r.fallback && r.matched.size > 0);
  // a name matched only in part, with nothing of the reading fitting it, is no good candidate either
  const notFound = [...(ctx.notFound ?? []), ...(readingFits ? [] : (ctx.partial ?? []))];
  // 1. every clue's name is missing from the catalog
  if (input.clues.length > 0 && notFound.length >= input.clues.length) {
    const m = notFound[0]!;
    const reason = notFound.length === 1 ? notFoundText(m) : `no catalog entity matches any clue (${notFound.map(quoted).join(", ")})`;
    return { status: "none", margin: 0, tiedWith: [], reason, mention: m };
  }
  const ratio = (d: SenseDoubt) => d.mention.next.confidence / Math.max(d.mention.confidence ?? 1, 1e-9);
  // a faint doubt counts only through answers of its own, and not when an apposition chose the sense
  const doubts = (ctx.doubts ?? []).filter((d) => ratio(d) >= o.senseRatio || (ratio(d) >= o.faintRatio && !d.modified && (d.answers?.length ?? 0) > 0));
  const strong = new Set(doubts.filter((d) => ratio(d) >= o.senseRatio));
  const base = baseVerdict(input, ctx, o);
  if (base.decided) return base.verdict;
  let v = base.verdict;
  // 4. link doubt
  if (v.status === "unique" || v.status === "tied") v = withDoubts(v, doubts, strong, input, base.readingMatched);
  // 5. a clue not found, or a name of the question nothing matches
  const missing = [...notFound, ...(ctx.unlinked ?? [])];
  if (missing.length > 0 && v.status !== "none") {
    const m = missing[0]!;
    return { status: "weak", margin: v.margin, tiedWith: v.tiedWith, reason: `${notFoundText(m)}; the answer rests on the other clues`, mention: m };
  }
  return v;
}

/** Rules 1–3 and 6; `decided`: no later rule applies (a `none`, a count). */
function baseVerdict(input: VerdictInput, ctx: VerdictContext, o: Required<VerdictOptions>): { verdict: Verdict; decided: boolean; readingMatched: boolean } {
  const cond = ctx.conditions;
  const out = (verdict: Verdict, decided = false, readingMatched = false) => ({ verdict, decided, readingMatched });
  const r = ctx.reading;
  const readingMatched = r !== undefined && !r.fallback && r.matched.size > 0;
  if (cond) {
    const oc = cond.outcome;
    const cands = oc.ranked.candidates;
    const attributeApplied = oc.applied.some((a) => a.attribute !== null);
    if (input.clues.length === 0 && !oc.count && !oc.tiedWith && attributeApplied) {
      // no clue: the attribute conditions alone decide; every entity that passes fits equally
      // (all of them are `fit`: the ranking holds only the first ones)
      const all = oc.fit;
      if (all.length === 0) return out({ status: "none", margin: 0, tiedWith: [], reason: "no entity of the expected type satisfies the conditions" }, true);
      if (all.length === 1) return out({ status: "unique", margin: 1, tiedWith: [], reason: "the only entity of the expected type that satisfies the conditions" });
      return out({ status: "tied", margin: 0, tiedWith: all.slice(1).map((n) => ctx.ref(n).id), reason: `${all.length} entities of the expected type satisfy the conditions` });
    }
    if (input.clues.length > 0 && oc.fit.length === 0 && cands.length > 0 && !oc.count) {
      if ((oc.ranked.matched ?? 0) > 0 && !oc.ranked.fallback) {
        return out({ status: "none", margin: 0, tiedWith: [], reason: "no entity that satisfies the reading of the question satisfies the conditions" }, true);
      }
      return out({ status: "weak", margin: 0, tiedWith: [], reason: "no candidate that fits every clue satisfies the conditions" }, true);
    }
    if (oc.count) return out(countVerdict(oc.count.value, input, ctx, o, readingMatched), true);
    const sup = cond.list.findIndex((c) => c.kind === "superlative" && oc.applied.some((a) => a.condition === c && a.attribute !== null));
    if (sup >= 0 && cands.length > 0 && oc.tiedWith !== undefined) {
      const label = oc.applied.find((a) => a.condition === cond.list[sup])?.attribute?.label ?? "the attribute";
      if (oc.tiedWith.length > 0) {
        return out({ status: "tied", margin: 0, tiedWith: oc.tiedWith.map((n) => ctx.ref(n).id), reason: `${oc.tiedWith.length + 1} candidates share the same ${label}` }, false, readingMatched);
      }
      return out({ status: "unique", margin: 1, tiedWith: [], reason: `the only candidate at that place by ${label}` }, false, readingMatched);
    }
  }
  if (input.clues.length === 0) return out({ status: "none", margin: 0, tiedWith: [], reason: "no part of the question was linked to a catalog entity" }, true);
  // an entity that satisfies the reading is reached by every clue (the reading's patterns reach
  // it), even where the path search found no path: one that is itself another sense of a clue
  // ("Luxembourg", the city, for the mention "Luxembourg" read as the country) is a seed of it
  if (r && readingMatched && input.candidates.some((c) => r.matched.has(c.node) && c.reached?.some((x) => !x))) {
    input = { ...input, candidates: input.candidates.map((c) => (r.matched.has(c.node) && c.reached ? withReached(c, c.reached.map(() => true)) : c)) };
  }
  const scored = scoreVerdict(input, o);
  if (scored.status === "none") return out(scored, true);
  // 3. the reading
  if (r && readingMatched && constrained(r, input.clues.length, o.maxSteps)) {
    const set = input.candidates.filter((c) => r.matched.has(c.node));
    if (set.length >= 2) {
      return out(
        { status: "tied", margin: 0, tiedWith: set.slice(1).map((c) => c.id), reason: `${set.length} entities satisfy the reading${r.graph.plural ? " (the question asks for all of them)" : ""}: ${names(set)}` },
        false,
        true,
      );
    }
    if (set.length === 1) {
      return out(scored.status === "unique" ? scored : { status: "unique", margin: scored.margin, tiedWith: [], reason: `only ${set[0]!.label} satisfies the reading of the question` }, false, true);
    }
  }
  // 6 with a reading that matched but does not decide (a clue held only by a neighbour
  // constraint, or by a pattern longer than maxSteps): when the best answer satisfies the
  // reading, only the candidates that satisfy it too are its rivals — evidence along relations
  // the question does not name never ties with it
  const top = input.candidates[0];
  if (r && readingMatched && top && r.matched.has(top.node)) {
    const fitting = input.candidates.filter((c, i) => i === 0 || r.matched.has(c.node));
    // a plural question asks for the set: every candidate that satisfies the reading is an answer,
    // even when a neighbour constraint cannot prove the set complete (rule 3's "plural")
    if (r.graph.plural && fitting.length >= 2 && fitting.every((c) => r.matched.has(c.node))) {
      return out({ status: "tied", margin: 0, tiedWith: fitting.slice(1).map((c) => c.id), reason: `${fitting.length} entities satisfy the reading (the question asks for all of them): ${names(fitting)}` }, false, true);
    }
    if (fitting.length < input.candidates.length) return out(scoreVerdict({ ...input, candidates: fitting }, o), false, true);
  }
  return out(scored, false, readingMatched);
}

/** True when every clue is constrained by a relation-path pattern of at most `maxSteps` hops. */
function constrained(r: NonNullable<VerdictContext["reading"]>, clues: number, maxSteps: number): boolean {
  return r.graph.chains.length === clues && r.open === 0 && r.graph.chains.every((ch) => ch.steps.length <= maxSteps);
}

/** Rule 2 for a count: the number is the answer; the verdict says whether the counted set is certain. */
function countVerdict(n: number, input: VerdictInput, ctx: VerdictContext, o: Required<VerdictOptions>, readingMatched: boolean): Verdict {
  if (n === 0) return { status: "none", margin: 0, tiedWith: [], reason: "nothing fits every clue and condition: the count is 0" };
  const missing = ctx.notFound?.[0];
  if (missing) return { status: "weak", margin: 1, tiedWith: [], reason: `the count is ${n}, but ${notFoundText(missing)}`, mention: missing };
  const doubt = (ctx.doubts ?? []).find((d) => d.mention.next.confidence >= o.senseRatio * (d.mention.confidence ?? 1) && (d.answers === null || d.answers.length > 0));
  if (doubt) {
    const m = doubt.mention;
    const [one, two] = senseNames(m.entity, m.next);
    return { status: "weak", margin: 1, tiedWith: [], reason: `the count is ${n} when ${quoted(m)} is ${one}; it may also be ${two} (${pct(m.next.confidence)} against ${pct(m.confidence ?? 1)})`, mention: m };
  }
  if (input.clues.length > 0 && ctx.reading && !readingMatched) {
    return { status: "weak", margin: 1, tiedWith: [], reason: `the count is ${n}, but no entity satisfies the whole reading: the counted set is the ranking's best guess` };
  }
  return { status: "unique", margin: 1, tiedWith: [], reason: `the count is ${n} (the number is the answer)` };
}

/** Rule 4: the other senses of doubtful mentions. */
function withDoubts(v: Verdict, doubts: readonly SenseDoubt[], strong: ReadonlySet<SenseDoubt>, input: VerdictInput, readingMatched: boolean): Verdict {
  if (doubts.length === 0) return v;
  const top = input.candidates[0];
  const have = new Set([...(top ? [top.id] : []), ...v.tiedWith]);
  const senses: SenseAnswer[] = [];
  for (const d of doubts) {
    for (const a of d.answers ?? []) {
      // the entity the mention names under its chosen sense is no answer of the question that names it
      if (have.has(a.id) || a.id === d.mention.entity?.id) continue;
      have.add(a.id);
      senses.push({ id: a.id, label: a.label, mention: d.mention.text, sense: d.mention.next });
    }
  }
  if (senses.length > 0) {
    const d = doubts.find((x) => x.mention.text === senses[0]!.mention)!;
    const m = d.mention;
    const [one, two] = senseNames(m.entity, m.next);
    const reason = `${quoted(m)} may be ${one} (${pct(m.confidence ?? 1)}) or ${two} (${pct(m.next.confidence)}), and nothing else in the question chooses: read as ${two}, the answer is ${names(senses)}`;
    return { status: "tied", margin: 0, tiedWith: [...v.tiedWith, ...senses.map((s) => s.id)], reason: v.status === "tied" ? `${v.reason ?? ""}; ${reason}` : reason, mention: m, senses: [...(v.senses ?? []), ...senses] };
  }
  if (v.status !== "unique") return v;
  // the other sense fits nothing the question asks: when this reading matched, the question chose
  const open = doubts.find((d) => strong.has(d) && (d.answers === null || (d.answers.length === 0 && !readingMatched)));
  if (!open) return v;
  const m = open.mention;
  const [one, two] = senseNames(m.entity, m.next);
  return { status: "weak", margin: v.margin, tiedWith: [], reason: `the answer rests on reading ${quoted(m)} as ${one} (${pct(m.confidence ?? 1)}), not clearly ahead of ${two} (${pct(m.next.confidence)})`, mention: m };
}

/** The score rules (step 6 of the file header): the ranking's scores, clue reach and path evidence. */
function scoreVerdict(input: VerdictInput, o: Required<VerdictOptions>): Verdict {
  if (input.clues.length === 0) return { status: "none", margin: 0, tiedWith: [], reason: "no part of the question was linked to a catalog entity" };
  const top = input.candidates[0];
  if (!top || !(top.score > 0)) return { status: "none", margin: 0, tiedWith: [], reason: "no candidate of the expected type is reachable from the clues" };
  const reachedTop = top.reached ?? input.clues.map(() => true);
  if (!reachedTop.some((r) => r)) {
    return { status: "none", margin: 0, tiedWith: [], reason: `no clue reaches a candidate within ${input.maxHops} hops` };
  }
  const s1 = top.score;
  const cueBehind = (c: VerdictCandidate): boolean => {
    const a = top.cued;
    const b = c.cued;
    if (a === undefined || b === undefined || a.length !== b.length) return false;
    return a.every((x, i) => x || !b[i]) && a.some((x, i) => x && !b[i]);
  };
  const rival = input.candidates
    .slice(1)
    .find((c) => (c.covered === undefined || top.covered === undefined || c.covered >= top.covered) && !cueBehind(c));
  const s2 = rival?.score ?? 0;
  const margin = s1 > 0 ? Math.max(0, Math.min(1, (s1 - s2) / s1)) : 0;
  const sameCoverage = (c: VerdictCandidate): boolean => c.reached !== undefined && c.reached.every((r, i) => r === reachedTop[i]);
  const tied: VerdictCandidate[] = [];
  for (const c of input.candidates.slice(1)) {
    const ratio = c.score / s1;
    const close = ratio >= o.tieRatio && sameCoverage(c) && !cueBehind(c);
    const equivalent = input.equivalent !== null && input.equivalent.has(c.node) && ratio >= o.equivalentFloor;
    // a candidate off the question's relation-path pattern (ranking chainFit) does not fit as well
    if ((close || equivalent) && (c.chainFit ?? 1) >= (top.chainFit ?? 1)) tied.push(c);
  }
  const tiedWith = tied.map((c) => c.id);
  const missing = input.clues.filter((_, i) => !reachedTop[i]);
  if (missing.length > 0) {
    const which = missing.map((m) => `"${m}"`).join(", ");
    return { status: "weak", margin, tiedWith, reason: `${which} ${missing.length === 1 ? "does" : "do"} not reach ${top.label} within ${input.maxHops} hops` };
  }
  const offPattern = (top.chainMissed ?? []).filter((i) => i >= 0 && i < input.clues.length);
  if (offPattern.length > 0) {
    const which = offPattern.map((i) => `"${input.clues[i]}"`).join(", ");
    return { status: "weak", margin, tiedWith, reason: `${which} ${offPattern.length === 1 ? "does" : "do"} not reach ${top.label} along the relations the question names for ${offPattern.length === 1 ? "it" : "them"}` };
  }
  const topHops = top.hops;
  if (topHops !== undefined) {
    for (const c of input.candidates.slice(1)) {
      const h = c.hops;
      if (h === undefined || h.length !== topHops.length) continue;
      // a shorter path off the relation-path pattern the question implies is no better evidence
      if ((c.chainFit ?? 1) < (top.chainFit ?? 1)) continue;
      const noWorse = h.every((x, i) => x !== null && (topHops[i] === null || x <= topHops[i]!));
      const better = h.findIndex((x, i) => x !== null && topHops[i] !== null && x < topHops[i]! && c.cued?.[i] === true);
      if (noWorse && better >= 0) {
        return {
          status: "weak",
          margin,
          tiedWith,
          reason: `${c.label} fits "${input.clues[better]}" more directly than ${top.label} (${h[better]} hop${h[better] === 1 ? "" : "s"} against ${topHops[better]}) and every other clue as well`,
        };
      }
    }
  }
  if (tied.length > 0) {
    const names = tied.slice(0, 5).map((c) => c.label).join(", ") + (tied.length > 5 ? `, … (${tied.length} in all)` : "");
    return { status: "tied", margin, tiedWith, reason: `${names} fit${tied.length === 1 ? "s" : ""} the clues as well as ${top.label}` };
  }
  if (margin < o.weakMargin) {
    const next = rival!;
    return { status: "weak", margin, tiedWith, reason: `${top.label} leads ${next.label} by only ${fmt(margin)} (below ${fmt(o.weakMargin)})` };
  }
  return { status: "unique", margin, tiedWith, reason: `every clue reaches ${top.label}, and it leads by ${fmt(margin)}` };
}
