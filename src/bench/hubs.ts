/**
 * The hub-catalog case of `npm run bench -- --size H` (issue 19): whole questions over a real
 * catalog whose hubs carry 20,000 or more edges, timed per phase like the generated sizes.
 *
 * Generated catalogs spread their edges by a bounded power law; real ones have a few entities
 * that most others point at (in the Debian package index of README "Benchmarks": the priority
 * `optional`, the architectures, `libc6` with ~22,000 reverse dependencies). The questions are
 * written from the catalog alone, by templates over its relation and type labels — no name of
 * any catalog is known here:
 *
 * - a hub: every entity with at least `minDegree` adjacency entries, most entries first; per
 *   hub, its relation with the most subjects pointing at it (the hub as object), and the most
 *   common direct type of those subjects;
 * - "Which T r h?" for each hub h (its subjects are the answers: thousands of them);
 * - "Which T r1 h1 and r2 h2?" for each pair of hubs whose subjects share type T and overlap;
 * - "Which T r h and r2 x?" for `perHub` subjects s of each hub (evenly spaced by num), x the
 *   object of s with the fewest entries (another relation than r to h): a hub beside a small clue;
 * - "s r which T?" for `perHub` other subjects s of each hub: a small clue whose answers include
 *   the hub, T the hub's own type.
 *
 * The warm-up questions (asked first, not counted) are more of the last kind, from subjects the
 * measured questions do not use.
 */
import { existsSync } from "node:fs";
import { Session } from "../pipeline/index.js";
import { timeQuestions } from "./phases.js";

/** Options of {@link hubQuestions}; all optional. */
export const HUB_DEFAULTS = {
  /** Adjacency entries that make an entity a hub (issue 19: hubs of 20,000+ edges). */
  minDegree: 20_000,
  /** Hubs used, most entries first. */
  maxHubs: 6,
  /** Questions per hub of each of the two one-subject kinds. */
  perHub: 5,
  /** Warm-up questions (not counted). */
  warmUp: 10,
} as const;

/** One hub: its num, entries, and the relation and subject type most of its entries come by. */
export interface Hub {
  readonly node: number;
  readonly label: string;
  readonly degree: number;
  /** The relation most subjects point at the hub with. */
  readonly relation: number;
  /** Its subjects over that relation, ascending. */
  readonly subjects: readonly number[];
  /** The most common direct type of those subjects (-1: untyped). */
  readonly subjectType: number;
}

/** The questions of the hub case and the hubs they were written from. */
export interface HubQuestions {
  readonly hubs: readonly Hub[];
  readonly questions: readonly { readonly question: string; readonly kind: string }[];
  readonly warmUp: readonly string[];
}

/** The most frequent value of a list (ties: the smallest), or -1 for an empty list. */
function mode(xs: Iterable<number>): number {
  const n = new Map<number, number>();
  for (const x of xs) n.set(x, (n.get(x) ?? 0) + 1);
  let best = -1;
  let count = 0;
  for (const [x, c] of n) if (c > count || (c === count && x < best)) [best, count] = [x, c];
  return best;
}

/** `k` items of `xs` at evenly spaced positions, skipping the first `offset` of each gap. */
function spread<T>(xs: readonly T[], k: number, offset = 0): T[] {
  const out: T[] = [];
  if (xs.length === 0) return out;
  const gap = xs.length / (k + 1);
  for (let i = 1; i <= k; i++) {
    const at = Math.min(xs.length - 1, Math.floor(i * gap) + offset);
    if (!out.includes(xs[at]!)) out.push(xs[at]!);
  }
  return out;
}

/** Writes the hub case's questions from `session`'s catalog (see the file header). */
export function hubQuestions(session: Session, options: Partial<typeof HUB_DEFAULTS> = {}): HubQuestions {
  const o = { ...HUB_DEFAULTS, ...options };
  const index = session.index;
  const relLabel = new Map(session.catalog.predicates().map((p) => [p.num, p.label]));
  const label = (n: number) => session.ref(n).label;
  const typeLabel = (t: number) => (t >= 0 ? label(t) : "entity");
  const big: { node: number; degree: number }[] = [];
  for (let u = 0; u < index.nodeCount; u++) if (index.degree(u) >= o.minDegree) big.push({ node: u, degree: index.degree(u) });
  big.sort((a, b) => b.degree - a.degree || a.node - b.node);
  const hubs: Hub[] = [];
  for (const { node, degree } of big.slice(0, o.maxHubs)) {
    // the entries where the hub is the object of the stored triple (the walk reaches it against the direction)
    const byRel = new Map<number, number[]>();
    index.forEach(node, (v, rel, inverse) => {
      if (!inverse) return;
      const list = byRel.get(rel) ?? [];
      list.push(v);
      byRel.set(rel, list);
    });
    let relation = -1;
    let subjects: number[] = [];
    for (const [rel, list] of byRel) if (list.length > subjects.length || (list.length === subjects.length && rel < relation)) [relation, subjects] = [rel, list];
    if (relation < 0) continue;
    subjects = [...new Set(subjects)].sort((a, b) => a - b);
    hubs.push({ node, label: label(node), degree, relation, subjects, subjectType: mode(subjects.map((s) => index.typesOf(s)[0] ?? -1)) });
  }
  const questions: { question: string; kind: string }[] = [];
  const verb = (h: Hub) => relLabel.get(h.relation) ?? "is linked to";
  for (const h of hubs) questions.push({ kind: "one hub", question: `Which ${typeLabel(h.subjectType)} ${verb(h)} ${h.label}?` });
  for (let i = 0; i < hubs.length; i++) {
    for (let j = i + 1; j < hubs.length; j++) {
      const [a, b] = [hubs[i]!, hubs[j]!];
      if (a.subjectType !== b.subjectType) continue;
      const inB = new Set(b.subjects);
      if (!a.subjects.some((s) => inB.has(s))) continue;
      questions.push({ kind: "two hubs", question: `Which ${typeLabel(a.subjectType)} ${verb(a)} ${a.label} and ${verb(b)} ${b.label}?` });
    }
  }
  for (const h of hubs) {
    for (const s of spread(h.subjects, o.perHub)) {
      // the object of s with the fewest entries, over another relation than the hub's
      let x = -1;
      let xRel = -1;
      index.forEach(s, (v, rel, inverse) => {
        if (inverse || v === h.node || hubs.some((g) => g.node === v)) return;
        if (x < 0 || index.degree(v) < index.degree(x) || (index.degree(v) === index.degree(x) && v < x)) [x, xRel] = [v, rel];
      });
      if (x < 0) continue;
      questions.push({ kind: "hub and a small clue", question: `Which ${typeLabel(h.subjectType)} ${verb(h)} ${h.label} and ${relLabel.get(xRel) ?? "is linked to"} ${label(x)}?` });
    }
  }
  const hubType = (h: Hub) => typeLabel(index.typesOf(h.node)[0] ?? -1);
  for (const h of hubs) for (const s of spread(h.subjects, o.perHub, 1)) questions.push({ kind: "a hub among the answers", question: `${label(s)} ${verb(h)} which ${hubType(h)}?` });
  const warmUp: string[] = [];
  for (const h of hubs) for (const s of spread(h.subjects, Math.ceil(o.warmUp / Math.max(hubs.length, 1)), 2)) if (warmUp.length < o.warmUp) warmUp.push(`${label(s)} ${verb(h)} which ${hubType(h)}?`);
  return { hubs, questions, warmUp };
}

/**
 * The hub case as a bench phase: opens the catalog at `db`, writes the questions, asks the
 * warm-up ones, then times each question once (phases.ts `timeQuestions`: whole question and
 * per-phase median and p95, CPU time, digest). Returns the record of the `ask` phase plus the
 * hubs, the question kinds and the catalog's counts.
 */
export function phaseHubs(db: string, options: Partial<typeof HUB_DEFAULTS> = {}): Record<string, unknown> {
  if (!existsSync(db)) return { error: `no catalog at ${db} (npm run bench:conditions builds the Debian one; or give --hubs-db PATH)` };
  const t0 = performance.now();
  const session = Session.open({ db });
  const openSeconds = (performance.now() - t0) / 1000;
  try {
    const made = hubQuestions(session, options);
    const counts = session.counts();
    const kinds: Record<string, number> = {};
    for (const q of made.questions) kinds[q.kind] = (kinds[q.kind] ?? 0) + 1;
    const timed = timeQuestions(
      session,
      made.questions.map((q) => ({ question: q.question, expected: [] })),
      made.warmUp,
    );
    return {
      db,
      entities: counts.entities,
      edges: counts.edges,
      openSeconds,
      hubs: made.hubs.map((h) => ({ label: h.label, degree: h.degree, subjects: h.subjects.length })),
      kinds,
      ...timed,
    };
  } finally {
    session.close();
  }
}
