/**
 * The reading of a question: one query graph that says what the question asks.
 *
 * Method: staged query-graph generation (Yih, Chang, He & Gao 2015, "Semantic Parsing via
 * Staged Query Graph Generation: Question Answering with Knowledge Base", ACL), without its
 * learned scorers: (1) the topic entities are the linked clues (constants); (2) the core
 * chain runs from each clue outward along the relation words attributed to it
 * (cue-chains.ts: nearest word first, the head noun's relation last, so "the home port of
 * the vessel that X commands" reads X —commands→ ?v —home port→ ?answer), with a fresh
 * variable between two hops, typed by a type noun standing between their words;
 * coordinated clues ("both A and B") share the chain's variables; (3) constraints and
 * aggregations are attached to the answer node: literal comparisons, superlatives and
 * ordinals, counts, exclusions (conditions.ts), a value question or a comparison between
 * named entities. The candidate relations of each edge are scored by lexical fit against
 * the catalog's labels and aliases (relation-cues.ts) and the ranking evaluates the graph
 * over the catalog (a conjunctive regular path query, Mendelzon & Wood 1995): the entities
 * that satisfy it come first, and a reading with no match falls back to the PageRank alone.
 *
 * The graph also lists the question words it does not explain (not a function word, not in
 * a mention, not the answer type, a relation word, a type noun or a condition), so the
 * user sees what was ignored.
 */
import type { Analysis } from "./analyze.js";
import type { Condition, ConditionAnalysis, EntityComparison, IdentityQuestion, ValueQuestion } from "./conditions.js";
import { attachConditions } from "./attach-conditions.js";
import { cueChains, type CueChain, type CueChainOptions, type StepOption } from "./cue-chains.js";
import { DETERMINERS, EXCLUSIVE_WORDS, isPluralNoun, PLURAL_COPULAS, POSSESSIVE_DETERMINERS, RELATIVE_WORDS, SET_WORDS, SHARING_VERBS } from "./lexicon.js";
import type { QuestionModel } from "./question-model.js";
import type { ReadingDoc } from "../model/index.js";
import { isFunctionWord, words } from "./words.js";
import { expectedInverse, relationCues, type RelationCue } from "./relation-cues.js";

/** A node of the query graph. */
export interface QueryNode {
  /** "?answer", "?v1", …; a constant's entity id. */
  readonly name: string;
  readonly kind: "answer" | "variable" | "constant";
  /** Constants: index into `Analysis.clues`. */
  readonly clue?: number;
  /** Type nums the node must have (empty: any). */
  readonly types: readonly number[];
  /** Variables: conditions on the node ("the *largest* country"; attach-conditions.ts). */
  readonly conditions?: readonly Condition[];
}

/** An edge of the query graph, from the clue side (`from`) towards the answer (`to`). */
export interface QueryEdge {
  readonly from: number;
  readonly to: number;
  /** The relations the words allow, each with its stored direction (cue-chains.ts `StepOption`). */
  readonly options: readonly StepOption[];
  /** "forward"/"backward": the sentence says which way; "either": its options disagree; "any": no relation word. */
  readonly direction: "forward" | "backward" | "either" | "any";
  /** The question words of the relation. */
  readonly words: readonly string[];
  /** "whose only R is C": the `to` node has exactly this many edges of these relations (cue-chains.ts `ChainStep.only`). */
  readonly only?: number;
}

/** The reading of one question. */
export interface QueryGraph {
  /** Node 0 is the answer. */
  readonly nodes: readonly QueryNode[];
  readonly edges: readonly QueryEdge[];
  /** The per-clue relation-path patterns the graph was built from (same order as `Analysis.clues`); the ranking evaluates them. */
  readonly chains: readonly CueChain[];
  /** Conditions on the answer (comparisons, superlatives, exclusions, counts); those on an inner node are on its node and hop. */
  readonly conditions: readonly Condition[];
  readonly value?: ValueQuestion;
  readonly compare?: EntityComparison;
  /** An identity question: the answer is the described entity itself (conditions.ts `IdentityQuestion`). */
  readonly identity?: IdentityQuestion;
  /** True when the question asks for a set. */
  readonly plural: boolean;
  /**
   * The relation the answer-type noun names too ("the *home port* of …" in a catalog with a
   * type "port" and a relation "home port"), when a chain ends short of the answer type and
   * takes it as its last hop; its steps refer to it by the cue index `relationCues.length`.
   */
  readonly headCue?: RelationCue;
  /** Question words the reading does not use, in question order. */
  readonly ignored: readonly string[];
  /**
   * Per clue (same order as `Analysis.clues`), per relation cue (same order as
   * `Analysis.relationCues`): true when the sentence has the cue walked against the stored
   * triple from that clue, false for along it (relation-cues.ts `expectedInverse`: word order
   * and voice); the ranking's cue check reads it.
   */
  readonly cueDirections: readonly (readonly boolean[])[];
}

/** Options of {@link readQuestion}; all optional. */
export interface ReadOptions {
  /** Options of the chain attribution. */
  readonly chains?: CueChainOptions;
  /** Share of a relation's edges a type must have at one end to count as found there. @default 0.02 */
  readonly endShare?: number;
}

/** Defaults of {@link ReadOptions}. */
export const DEFAULTS = { endShare: 0.02 } as const;

/** Builds the query graph of an analysed question and its conditions. */
export function readQuestion(cond: ConditionAnalysis, model?: QuestionModel, options: ReadOptions = {}): QueryGraph {
  const analysis = cond.analysis;
  const share = options.endShare ?? DEFAULTS.endShare;
  let chains = model ? orientChains(cueChains(analysis, options.chains), analysis, model, share) : cueChains(analysis, options.chains);
  const head = model ? headRelation(analysis, model, share) : undefined;
  let headCue: RelationCue | undefined;
  if (head && model) {
    const extended = extendByHead(chains, analysis, model, head, share);
    if (extended !== chains) {
      chains = extended;
      headCue = head.cue;
    }
  }
  if (model) chains = bridgeAnswer(bridgeChains(chains, analysis, model, share), analysis, model, share);
  const unnamed = model ? unnamedHops(chains, analysis, model, share) : { chains, words: [] };
  chains = unnamed.chains;
  chains = exclusiveSteps(chains, analysis);
  // conditions on an inner node ("the capital of the *largest* country in R") go on its hop
  const attached = model ? attachConditions(chains, cond.conditions, analysis, model) : { chains, answer: [...cond.conditions] };
  chains = attached.chains;
  const cueOf = (i: number) => (i < 0 ? undefined : (analysis.relationCues[i] ?? headCue));
  const nodes: QueryNode[] = [{ name: "?answer", kind: "answer", types: analysis.answerTypes.map((t) => t.num) }];
  const edges: QueryEdge[] = [];
  const constant = analysis.clues.map((c, i) => {
    nodes.push({ name: c.id, kind: "constant", clue: i, types: [] });
    return nodes.length - 1;
  });
  const edgeOf = (from: number, to: number, opts: readonly StepOption[]): QueryEdge => {
    const inv = new Set(opts.map((o) => o.inverse));
    const direction = opts.length === 0 ? "any" : inv.size > 1 ? "either" : inv.has(true) ? "backward" : "forward";
    const ws = [...new Set(opts.flatMap((o) => cueOf(o.cue)?.words ?? []))];
    return { from, to, options: opts, direction, words: ws };
  };
  // coordinated clues share one chain of variables: build it once per group; an identity
  // question has no edge (the answer is the clue itself)
  const done = new Set<number>(cond.identity ? chains.map((_, c) => c) : []);
  chains.forEach((ch, c) => {
    if (done.has(c)) return;
    const group = ch.conjuncts ?? [c];
    for (const g of group) done.add(g);
    const members = group.map((g) => constant[g]!).filter((x) => x !== undefined);
    if (ch.steps.length === 0) {
      for (const m of members) edges.push(edgeOf(m, 0, []));
      return;
    }
    let prev: number[] = members;
    ch.steps.forEach((st, h) => {
      const last = h === ch.steps.length - 1;
      let to = 0;
      if (!last) {
        nodes.push({ name: `?v${nodes.filter((n) => n.kind === "variable").length + 1}`, kind: "variable", types: st.types, ...(st.conditions ? { conditions: st.conditions } : {}) });
        to = nodes.length - 1;
      }
      for (const p of prev) edges.push(st.only !== undefined ? { ...edgeOf(p, to, st.options), only: st.only } : edgeOf(p, to, st.options));
      prev = [to];
    });
  });
  return {
    nodes,
    edges,
    chains,
    conditions: attached.answer,
    ...(cond.value ? { value: cond.value } : {}),
    ...(cond.compare ? { compare: cond.compare } : {}),
    ...(cond.identity ? { identity: cond.identity } : {}),
    plural: asksForSet(analysis),
    ...(headCue ? { headCue } : {}),
    ignored: ignoredWords(analysis, cond, chains, [...(headCue?.words ?? []), ...unnamed.words]),
    cueDirections: analysis.clues.map((c) => analysis.relationCues.map((cue) => expectedInverse(cue, analysis.mentions[c.mention]?.start ?? 0))),
  };
}

/**
 * Each hop's direction checked against the catalog's relation ends (`relationEnds`: the
 * types at the subject and the object end of each relation): word order says a clue right
 * of a relation word is its object ("which country borders *X*"), but an of-phrase after a
 * relational noun makes it the subject ("the capital of *X*": X —capital→ ?answer). When the
 * node on the clue side of a hop (the clue's own types, or the type noun of the variable)
 * is found at only one end of the relation, that end decides; else the node on the answer
 * side (the expected answer type, or the variable's type) does; else the sentence's
 * direction stands. A structure the catalog can match beats one it cannot (Yih et al. 2015).
 */
function orientChains(chains: readonly CueChain[], analysis: Analysis, model: QuestionModel, share: number): CueChain[] {
  if (!model.relationEnds) return [...chains];
  const ends = model.relationEnds();
  const expand = (types: readonly number[]) => new Set(types.flatMap((t) => model.typeByNum.get(t)?.descendants ?? [t]));
  // which ends of `rel` hold some type of the set: [subject, object]
  const at = (rel: number, set: ReadonlySet<number>): [boolean, boolean] => {
    const total = Math.max(ends.edges(rel), 1);
    const has = (object: boolean) => ends.types(rel, object).some((e) => set.has(e.type) && e.count / total >= share);
    return [has(false), has(true)];
  };
  const answerSet = expand(analysis.answerTypes.map((t) => t.num));
  return chains.map((ch) => {
    const clue = analysis.clues[ch.clue];
    const clueTypes = new Set(clue && model.typesOf ? model.typesOf(clue.node) : []);
    const steps = ch.steps.map((st, h) => {
      const near = h === 0 ? clueTypes : expand(ch.steps[h - 1]!.types);
      const far = h === ch.steps.length - 1 ? answerSet : expand(st.types);
      const options = st.options.map((o) => {
        if (near.size > 0) {
          const [s, ob] = at(o.relation, near);
          if (s !== ob) return { ...o, inverse: ob };
        }
        if (far.size > 0) {
          const [s, ob] = at(o.relation, far);
          if (s !== ob) return { ...o, inverse: s };
        }
        return o;
      });
      const unique = options.filter((o, i) => options.findIndex((x) => x.relation === o.relation && x.inverse === o.inverse) === i);
      return { ...st, options: unique };
    });
    return { ...ch, steps };
  });
}

/**
 * A relational noun after a possessive and an exclusive word ("the country *whose only
 * neighbour* is South Africa", "*whose sole* dependencies are A and B") says how many such
 * relations the node it belongs to has: exactly as many as the clues it names (the
 * coordinated group's size). The count goes on the hop from those clues to that node
 * (`ChainStep.only`); the ranking keeps only nodes with that many edges of the hop's
 * relations (Quirk et al. 1985 §8.116, exclusive focus). "the only neighbour *of* X" is a
 * presupposition about X, not a test of the node, and sets nothing.
 */
function exclusiveSteps(chains: CueChain[], analysis: Analysis): CueChain[] {
  const ws = words(analysis.question);
  let changed = false;
  const out = chains.map((ch) => {
    const first = ch.steps[0];
    if (!first) return ch;
    const k = ws.findIndex((w) => w.start === first.at);
    if (k < 2 || !EXCLUSIVE_WORDS.has(ws[k - 1]!.norm) || !POSSESSIVE_DETERMINERS.has(ws[k - 2]!.norm)) return ch;
    changed = true;
    const n = ch.conjuncts?.length ?? 1;
    return { ...ch, steps: [{ ...first, only: n }, ...ch.steps.slice(1)] };
  });
  return changed ? out : chains;
}

/** True when the two type sets share a type. */
const meets = (a: ReadonlySet<number>, b: ReadonlySet<number>) => [...a].some((x) => b.has(x));

/** The types found at one end of a relation (on at least `share` of its edges), from the catalog's relation ends. */
function endTypes(model: QuestionModel, share: number): (rel: number, object: boolean) => Set<number> {
  const ends = model.relationEnds!();
  return (rel, object) => {
    const total = Math.max(ends.edges(rel), 1);
    return new Set(ends.types(rel, object).filter((e) => e.count / total >= share).map((e) => e.type));
  };
}

/** The catalog's relations that join types `from` to types `to`, each with the direction it is walked in (a bridging hop, cue -1). */
function joining(model: QuestionModel, typesAt: (rel: number, object: boolean) => Set<number>, from: ReadonlySet<number>, to: ReadonlySet<number>): StepOption[] {
  const out: StepOption[] = [];
  for (const r of model.relations) {
    if (meets(typesAt(r.num, false), from) && meets(typesAt(r.num, true), to)) out.push({ relation: r.num, inverse: false, cue: -1 });
    if (meets(typesAt(r.num, true), from) && meets(typesAt(r.num, false), to)) out.push({ relation: r.num, inverse: true, cue: -1 });
  }
  return out;
}

/** Most bridging relations a hop may offer (more would make the hop say nothing). */
const MAX_BRIDGES = 3;

/**
 * A hop the words did not name: when a clue's own types occur at neither end of the first
 * relation its words name ("the capital of the country that *pays with* the som": a currency
 * is at no end of `capital`), the catalog's relations that join the clue's types to that
 * relation's near end (the end that is not the answer's) make a first hop of their own (at
 * most `MAX_BRIDGES`; none or more: no bridge), so the structure can match: som —currency⁻¹→
 * ?v (country) —capital→ ?answer. A structure with matches beats one without (Yih et al.
 * 2015); the relations come from the catalog's relation ends only.
 */
function bridgeChains(chains: CueChain[], analysis: Analysis, model: QuestionModel, share: number): CueChain[] {
  if (!model.relationEnds || !model.typesOf) return chains;
  const typesAt = endTypes(model, share);
  const answerSet = new Set(analysis.answerTypes.flatMap((t) => model.typeByNum.get(t.num)?.descendants ?? [t.num]));
  return chains.map((ch) => {
    const clue = analysis.clues[ch.clue];
    const first = ch.steps[0];
    if (!clue || !first) return ch;
    const clueTypes = new Set(model.typesOf!(clue.node));
    if (clueTypes.size === 0) return ch;
    if (first.options.some((o) => meets(typesAt(o.relation, false), clueTypes) || meets(typesAt(o.relation, true), clueTypes))) return ch;
    // the near end of the named relation: the end that does not hold the far node's types
    const far = ch.steps.length === 1 ? answerSet : new Set(first.types.flatMap((t) => model.typeByNum.get(t)?.descendants ?? [t]));
    const need = new Set<number>();
    const oriented: StepOption[] = [];
    for (const o of first.options) {
      const [s, ob] = [typesAt(o.relation, false), typesAt(o.relation, true)];
      const farAtObject = far.size > 0 && meets(ob, far) && !meets(s, far);
      const farAtSubject = far.size > 0 && meets(s, far) && !meets(ob, far);
      if (!farAtSubject) for (const t of s) need.add(t);
      if (!farAtObject) for (const t of ob) need.add(t);
      oriented.push(farAtObject ? { ...o, inverse: false } : farAtSubject ? { ...o, inverse: true } : o);
    }
    const bridges = joining(model, typesAt, clueTypes, need);
    if (bridges.length === 0 || bridges.length > MAX_BRIDGES) return ch;
    const mid = [...need].sort((a, b) => a - b);
    return { ...ch, steps: [{ at: first.at, options: bridges, types: mid }, { ...first, options: oriented }, ...ch.steps.slice(1)] };
  });
}

/**
 * A last hop the words did not name: when the far end of a chain's last hop (by the catalog's
 * relation ends) holds none of the expected answer types ("In which *realm* is the home port
 * of …": a home port is a port), the catalog's relations that join that end's types to the
 * answer types make a last hop of their own (at most `MAX_BRIDGES`; none or more: no bridge):
 * … —home port→ ?v (port) —located in→ ?answer (realm). The mirror of {@link bridgeChains}
 * at the answer end; the relations come from the catalog's relation ends only.
 */
function bridgeAnswer(chains: CueChain[], analysis: Analysis, model: QuestionModel, share: number): CueChain[] {
  if (!model.relationEnds || analysis.answerTypes.length === 0) return chains;
  const typesAt = endTypes(model, share);
  const answerSet = new Set(analysis.answerTypes.flatMap((t) => model.typeByNum.get(t.num)?.descendants ?? [t.num]));
  return chains.map((ch) => {
    const last = ch.steps[ch.steps.length - 1];
    if (!last || last.options.length === 0 || last.options.some((o) => o.cue < 0)) return ch;
    const farTypes = new Set(last.options.flatMap((o) => [...typesAt(o.relation, !o.inverse)]));
    if (farTypes.size === 0 || meets(farTypes, answerSet)) return ch;
    const bridges = joining(model, typesAt, farTypes, answerSet);
    if (bridges.length === 0 || bridges.length > MAX_BRIDGES) return ch;
    const mid = last.types.length > 0 ? last.types : [...farTypes].sort((a, b) => a - b);
    return { ...ch, steps: [...ch.steps.slice(0, -1), { ...last, types: mid }, { at: last.at, options: bridges, types: [] }] };
  });
}

/**
 * A verb no relation label names, between two nodes of a chain: a content word opening a
 * relative clause ("the country that (completely) *surrounds* the one using the loti": a
 * relative word, at most one -ly adverb, then the word) that is no name, type noun, relation
 * word or condition, whose object is a type noun or "one" (not a name), standing between the places of two consecutive hops, is a relation of
 * its own between the node the earlier hop reaches (typed by that hop's far end in the
 * catalog) and the node the clause post-modifies (the earlier hop's type noun): the catalog's
 * relations that join those types make its options (at most `MAX_BRIDGES`; none or more: no
 * hop) — staged query-graph generation's relation step with the catalog's relation ends as
 * the only evidence (Yih et al. 2015), as in {@link bridgeChains}.
 */
function unnamedHops(chains: CueChain[], analysis: Analysis, model: QuestionModel, share: number): { chains: CueChain[]; words: string[] } {
  if (!model.relationEnds) return { chains, words: [] };
  const ws = words(analysis.question);
  const taken = [...analysis.mentions, ...(analysis.answerTypeWords ?? []), ...(analysis.typeWords ?? [])];
  const cuePlaces = new Set(analysis.relationCues.flatMap((c) => (c.occurrences ?? [{ start: c.start }]).map((o) => o.start)));
  const verbs = ws.filter((w, k) => {
    if (isFunctionWord(w.norm) || /^\d/.test(w.norm) || /ly$/.test(w.norm) || cuePlaces.has(w.start) || taken.some((t) => w.start < t.end && w.end > t.start)) return false;
    const before = ws[k - 1];
    const relative = (x: typeof before) => x !== undefined && RELATIVE_WORDS.has(x.norm);
    if (!(relative(before) || (before !== undefined && /ly$/.test(before.norm) && !isFunctionWord(before.norm) && relative(ws[k - 2])))) return false;
    // its object is a noun phrase headed by a type noun or the pro-form "one" ("surrounds *the
    // one* using …"), not a name (the name's own hop already says it: "pays with the som")
    let j = k + 1;
    while (j < ws.length && DETERMINERS.has(ws[j]!.norm)) j++;
    const object = ws[j];
    return object !== undefined && (object.norm === "one" || object.norm === "ones" || (analysis.typeWords ?? []).some((t) => t.start === object.start));
  });
  if (verbs.length === 0) return { chains, words: [] };
  const typesAt = endTypes(model, share);
  const expand = (ts: Iterable<number>) => new Set([...ts].flatMap((t) => model.typeByNum.get(t)?.descendants ?? [t]));
  const used: string[] = [];
  const out = chains.map((ch) => {
    let steps = [...ch.steps];
    // a first hop no word named (bridgeChains) stands where its clue does
    const clueAt = analysis.mentions[analysis.clues[ch.clue]?.mention ?? -1]?.start;
    const placeOf = (i: number) => (i === 0 && clueAt !== undefined && steps[0]!.options.every((o) => o.cue < 0) ? clueAt : steps[i]!.at);
    for (const w of verbs) {
      const h = steps.findIndex((_, i) => i + 1 < steps.length && Math.min(placeOf(i), placeOf(i + 1)) < w.start && w.start < Math.max(placeOf(i), placeOf(i + 1)));
      if (h < 0 || steps[h]!.types.length === 0) continue;
      const st = steps[h]!;
      const near = new Set(st.options.flatMap((o) => [...typesAt(o.relation, !o.inverse)]));
      const options = joining(model, typesAt, expand(near), expand(st.types));
      if (near.size === 0 || options.length === 0 || options.length > MAX_BRIDGES) continue;
      steps = [...steps.slice(0, h), { ...st, types: [...near].sort((a, b) => a - b) }, { at: w.start, options, types: st.types }, ...steps.slice(h + 1)];
      if (!used.includes(w.text)) used.push(w.text);
    }
    return steps.length === ch.steps.length ? ch : { ...ch, steps };
  });
  return { chains: used.length > 0 ? out : chains, words: used };
}

/** The relation the answer-type words name, with the end of it where the answer types are. */
interface HeadRelation {
  readonly cue: RelationCue;
  /** True: the answer types are at the relation's object end (the hop into the answer walks along the stored triple). */
  readonly answerAtObject: boolean;
}

/**
 * A relation named by the answer-type words themselves ("What is the *home port* of …",
 * "the *official currency* of …"): their content words matched against relation labels and
 * aliases as any relation word is (relation-cues.ts, score ≥ 0.75), kept when the catalog
 * puts the answer types at exactly one end of that relation.
 */
function headRelation(analysis: Analysis, model: QuestionModel, share: number): HeadRelation | undefined {
  if (!model.relationEnds || analysis.answerTypes.length === 0) return undefined;
  const ws = words(analysis.question);
  const spans = analysis.answerTypeWords ?? [];
  const typeIdx = ws.map((_, k) => k).filter((k) => !isFunctionWord(ws[k]!.norm) && spans.some((s) => ws[k]!.start >= s.start && ws[k]!.end <= s.end));
  if (typeIdx.length === 0) return undefined;
  // the type noun's pre-modifiers belong to the head phrase too ("*home* port": Quirk et al. 1985 §17.97 ff.)
  const inMention = (k: number) => analysis.mentions.some((m) => ws[k]!.start < m.end && ws[k]!.end > m.start);
  const idx = [...typeIdx];
  for (let k = typeIdx[0]! - 1; k >= 0 && idx.length < typeIdx.length + 2 && !isFunctionWord(ws[k]!.norm) && !inMention(k); k--) idx.unshift(k);
  const ends = model.relationEnds();
  const answerSet = new Set(analysis.answerTypes.flatMap((t) => model.typeByNum.get(t.num)?.descendants ?? [t.num]));
  for (const cue of relationCues(ws, idx, model)) {
    if (cue.score < 0.75) continue;
    const total = Math.max(ends.edges(cue.relation), 1);
    const has = (object: boolean) => ends.types(cue.relation, object).some((e) => answerSet.has(e.type) && e.count / total >= share);
    const [s, o] = [has(false), has(true)];
    if (s !== o) return { cue: { ...cue, occurrences: [{ start: cue.start, flip: false }] }, answerAtObject: o };
  }
  return undefined;
}

/**
 * Each chain whose last hop does not end at the answer types (by the catalog's relation
 * ends) takes the head relation as its last hop, when its end's types are found at the other
 * end of that relation: "the home port of the vessel that X commands" = X —commands→ ?v
 * —home port→ ?answer. A chain already ending with the head relation is left alone.
 */
function extendByHead(chains: CueChain[], analysis: Analysis, model: QuestionModel, head: HeadRelation, share: number): CueChain[] {
  const ends = model.relationEnds!();
  const expand = (types: Iterable<number>) => new Set([...types].flatMap((t) => model.typeByNum.get(t)?.descendants ?? [t]));
  const answerSet = expand(analysis.answerTypes.map((t) => t.num));
  const at = (rel: number, object: boolean, set: ReadonlySet<number>) => {
    const total = Math.max(ends.edges(rel), 1);
    return ends.types(rel, object).some((e) => set.has(e.type) && e.count / total >= share);
  };
  // types at the far end of a hop, as [types], from the catalog's relation ends
  const farTypes = (o: StepOption): Set<number> => new Set(ends.types(o.relation, !o.inverse).filter((e) => e.count / Math.max(ends.edges(o.relation), 1) >= share).map((e) => e.type));
  const cue = analysis.relationCues.length;
  let changed = false;
  const out = chains.map((ch) => {
    const last = ch.steps[ch.steps.length - 1];
    if (last && last.options.some((o) => o.relation === head.cue.relation)) return ch;
    let endTypes: Set<number>;
    if (last) {
      if (last.options.some((o) => at(o.relation, !o.inverse, answerSet))) return ch;
      endTypes = new Set(last.options.flatMap((o) => [...farTypes(o)]));
    } else {
      const clue = analysis.clues[ch.clue];
      endTypes = new Set(clue && model.typesOf ? model.typesOf(clue.node) : []);
    }
    // the chain's end must stand at the head relation's other end; a clue with no hop may
    // also stand at neither end (a bridging hop joins it, bridgeChains)
    const other = endTypes.size > 0 && at(head.cue.relation, !head.answerAtObject, expand(endTypes));
    const neither = !last && endTypes.size > 0 && !at(head.cue.relation, head.answerAtObject, expand(endTypes)) && !other;
    if (!other && !neither) return ch;
    changed = true;
    const lastTypes = last ? [...endTypes].sort((a, b) => a - b) : [];
    const steps = [...ch.steps.slice(0, -1), ...(last ? [{ ...last, types: last.types.length > 0 ? last.types : lastTypes }] : []), { at: head.cue.start, options: [{ relation: head.cue.relation, inverse: !head.answerAtObject, cue }], types: [] }];
    return { ...ch, steps };
  });
  return changed ? out : chains;
}

/**
 * True when the question asks for a set: a plural head noun ("which *countries*"), a plural
 * copula after the wh-word ("which *are* …", "what *were* …") or a universal determiner
 * ("list *all*"); lexicon.ts.
 */
function asksForSet(analysis: Analysis): boolean {
  const ws = words(analysis.question);
  const spans = analysis.answerTypeWords ?? [];
  const head = ws.filter((w) => spans.some((s) => w.start >= s.start && w.end <= s.end));
  if (head.slice(1).some((w) => isPluralNoun(w.norm))) return true;
  const first = head[0] ? ws.findIndex((w) => w.start === head[0]!.start) : -1;
  if (first >= 0 && (PLURAL_COPULAS.has(ws[first + 1]?.norm ?? "") || SET_WORDS.has(ws[first + 1]?.norm ?? ""))) return true;
  return false;
}

/** The question's words that no part of the reading uses (lexicon: function words never count). */
function ignoredWords(analysis: Analysis, cond: ConditionAnalysis, chains: readonly CueChain[], headWords?: readonly string[]): string[] {
  const ws = words(analysis.question);
  const spans: { start: number; end: number }[] = [
    ...analysis.mentions,
    ...(analysis.answerTypeWords ?? []),
    ...(analysis.typeWords ?? []),
    ...cond.conditions,
    ...(cond.value ? [cond.value] : []),
    ...(cond.compare ? [cond.compare] : []),
  ];
  const usedWords = new Set<string>();
  for (const ch of chains) for (const st of ch.steps) for (const o of st.options) for (const w of analysis.relationCues[o.cue]?.words ?? []) usedWords.add(w);
  for (const w of headWords ?? []) usedWords.add(w);
  // a cue that made no hop still weighs the walk: its words are used, at every place it stands
  const cuePlaces = new Set<number>();
  for (const c of analysis.relationCues) {
    for (const w of c.words) usedWords.add(w);
    for (const o of c.occurrences ?? []) cuePlaces.add(o.start);
  }
  const attributeWords = new Set<number>();
  for (const c of [...cond.conditions, ...(cond.value ? [cond.value] : []), ...(cond.compare ? [cond.compare] : [])]) {
    if ("choices" in c && c.choices.length > 0) for (const k of c.choices[0]!.wordIndexes) attributeWords.add(k);
  }
  const out: string[] = [];
  ws.forEach((w, k) => {
    if (isFunctionWord(w.norm) || w.norm === "s" || /^\d/.test(w.norm)) return;
    // the verb of a "shares X with Y" exclusion (conditions.ts; its span starts at "with")
    if (SHARING_VERBS.has(w.norm) && cond.conditions.some((c) => c.kind === "exclusion" && c.start > w.start)) return;
    if (attributeWords.has(k) || usedWords.has(w.text) || cuePlaces.has(w.start)) return;
    if (spans.some((s) => w.start < s.end && w.end > s.start)) return;
    out.push(w.text);
  });
  return out;
}

/** Id and label of an edge option's relation (a cue's, the head relation's, or the catalog's for a bridging hop). */
function relationRef(o: StepOption, g: QueryGraph, analysis: Analysis, model: QuestionModel): { id: string; label: string } {
  const c = o.cue >= 0 ? (analysis.relationCues[o.cue] ?? g.headCue) : undefined;
  if (c && c.relation === o.relation) return { id: c.id, label: c.label };
  const r = model.relations.find((x) => x.num === o.relation);
  return { id: r?.id ?? String(o.relation), label: r?.label ?? String(o.relation) };
}

/** The one-line rendering of a reading (`reading:` in the text output). */
export function readingText(g: QueryGraph, analysis: Analysis, model: QuestionModel): string {
  const typeLabel = (nums: readonly number[]) => (nums.length > 0 ? ` (${nums.map((t) => model.typeByNum.get(t)?.label ?? String(t)).join(" or ")})` : "");
  const nodeText = (i: number) => {
    const n = g.nodes[i]!;
    if (n.kind === "constant") return analysis.clues[n.clue!]?.label ?? n.name;
    if (n.conditions && n.conditions.length > 0) {
      const t = n.types.map((x) => model.typeByNum.get(x)?.label ?? String(x)).join(" or ");
      return `${n.name} (${[...(t ? [t] : []), ...n.conditions.map(conditionText)].join("; ")})`;
    }
    return `${n.name}${typeLabel(n.types)}`;
  };
  const relText = (e: QueryEdge) => [...new Set(e.options.map((o) => relationRef(o, g, analysis, model).label))].join("|") + (e.only !== undefined ? ` (only ${e.only})` : "");
  // each path is written from the answer back to its clue(s): "?answer ← capital — ?v1 ← borders — A & B"
  const into = new Map<number, QueryEdge[]>();
  for (const e of g.edges) into.set(e.to, [...(into.get(e.to) ?? []), e]);
  const paths: string[] = [];
  const write = (to: number, seen: Set<number>): string[] => {
    const incoming = (into.get(to) ?? []).filter((e) => !seen.has(e.from));
    if (incoming.length === 0) return [nodeText(to)];
    // edges with the same relation words from several constants: one coordinated group
    const groups = new Map<string, QueryEdge[]>();
    for (const e of incoming) {
      const key = `${relText(e)}|${e.direction}|${g.nodes[e.from]!.kind}`;
      groups.set(key, [...(groups.get(key) ?? []), e]);
    }
    const out: string[] = [];
    for (const list of groups.values()) {
      const e = list[0]!;
      const arrow = e.direction === "any" ? " ~ " : e.direction === "forward" ? ` ← ${relText(e)} — ` : e.direction === "backward" ? ` — ${relText(e)} → ` : ` — ${relText(e)} — `;
      const from = list.length > 1 && list.every((x) => g.nodes[x.from]!.kind === "constant") ? [list.map((x) => nodeText(x.from)).join(" & ")] : list.flatMap((x) => write(x.from, new Set([...seen, to])));
      for (const f of from) out.push(`${nodeText(to)}${arrow}${f}`);
    }
    return out;
  };
  if (g.edges.length > 0) {
    paths.push(...write(0, new Set()));
  } else paths.push(nodeText(0));
  const extras = constraintTexts(g, analysis);
  return [paths.join("; "), ...extras].join("; ");
}

/** One condition in words ("area > 500000", "largest by area", "not X (nor what is linked to it)", …). */
function conditionText(c: Condition): string {
  const attr = "choices" in c ? (c.choices[0]?.label ?? "no attribute") : "";
  if (c.kind === "comparison") return `${attr} ${c.operator} ${c.values.join(" and ")}`;
  if (c.kind === "superlative") return `${c.position > 1 ? `place ${c.position} ` : ""}${c.order === "max" ? "largest" : "smallest"} by ${attr}`;
  if (c.kind === "exclusion") return c.inverse !== undefined && c.mode === "not" ? c.words : `not ${c.label}${c.mode === "not" ? " (nor what is linked to it)" : ""}`;
  if (c.kind === "literal") return `${attr} ${c.negated ? "!=" : "="} ${c.value}`;
  if (c.kind === "absence") return c.words;
  return "count";
}

/** The conditions of a reading in words ("area > 500000", "largest by area", …). */
export function constraintTexts(g: QueryGraph, analysis: Analysis): string[] {
  const out: string[] = [];
  for (const c of g.conditions) out.push(conditionText(c));
  if (g.value) out.push(`value: ${g.value.choices[0]?.label ?? "no attribute"} of ${analysis.mentions[g.value.mention]?.entity.label ?? "?"}`);
  if (g.identity) out.push(`identity: ?answer = ${analysis.mentions[g.identity.mention]?.entity.label ?? "?"}`);
  if (g.compare) out.push(`compare: ${g.compare.mentions.map((m) => (g.compare!.described ? `(… ${analysis.mentions[m]?.entity.label ?? "?"})` : (analysis.mentions[m]?.entity.label ?? "?"))).join(" vs ")} by ${g.compare.choices[0]?.label ?? "no attribute"} (${g.compare.order === "max" ? "larger" : "smaller"} wins)`);
  if (g.plural) out.push("all that fit");
  return out;
}

/** The JSON document of a reading (`ask --json` `reading`; README "Reading"); `matched`/`fallback` come from the ranking. */
export function readingDoc(g: QueryGraph, analysis: Analysis, model: QuestionModel, evaluated?: { matched: number | null; fallback: boolean }): ReadingDoc {
  const typeIds = (nums: readonly number[]) => nums.map((t) => model.typeByNum.get(t)?.id ?? String(t));
  return {
    text: readingText(g, analysis, model),
    nodes: g.nodes.map((n) => {
      if (n.kind !== "constant") return { name: n.name, kind: n.kind, types: typeIds(n.types), ...(n.conditions && n.conditions.length > 0 ? { conditions: n.conditions.map(conditionText) } : {}) };
      const clue = analysis.clues[n.clue!]!;
      const m = analysis.mentions[clue.mention];
      return { name: n.name, kind: n.kind, entity: { id: clue.id, label: clue.label }, ...(m ? { text: m.text, confidence: m.confidence } : {}), types: [] };
    }),
    edges: g.edges.map((e) => ({
      from: e.from,
      to: e.to,
      relations: e.options.map((o) => ({ ...relationRef(o, g, analysis, model), inverse: o.inverse })),
      direction: e.direction,
      words: e.words,
      ...(e.only !== undefined ? { only: e.only } : {}),
    })),
    constraints: constraintTexts(g, analysis),
    plural: g.plural,
    ...(evaluated ? { matched: evaluated.matched, fallback: evaluated.fallback } : {}),
    ignored: g.ignored,
  };
}
