/**
 * The engine behind the screen: a pipeline Session wrapped so the screen gets plain
 * {@link TuiResult}s and {@link EntityCard}s. `buildTuiResult` and `buildCard` are the only
 * places that read the Session's outcome and the catalog for the screen; components never do.
 *
 * `inProcessEngine` runs the Session in this thread (tests, small catalogs): each call yields
 * to the event loop first (setImmediate), so the screen paints "asking…" before the work.
 * `worker-engine.ts` runs the same code in a worker thread so the screen never freezes.
 */
import type { Catalog } from "../../catalog/index.js";
import { Composer, type Composition } from "../../compose/index.js";
import type { EntityRef } from "../../model/index.js";
import { Session, type AskOutcome, type SessionProgress } from "../../pipeline/index.js";
import type { AblationView, ComposeView, CoverageRow, EntityCard, OpenProgress, PinView, SuggestionView, TuiEngine, TuiResult } from "./view-types.js";

/** Options of the engines. */
export const DEFAULTS = {
  /** Neighbours listed on an entity card. */
  cardNeighbours: 200,
  /** Answers given a coverage row. */
  coverageRows: 10,
} as const;

// The explanation parts the screen shows, stated structurally (the explain stage's
// CoverageTable, AblationEntry and SuggestedClue satisfy them).
interface CoverageLike {
  readonly clues: readonly EntityRef[];
  readonly rows: readonly { readonly answer: EntityRef; readonly cells: readonly { readonly reached: boolean; readonly hops: number | null; readonly relations: readonly { readonly id?: string; readonly label?: string }[] }[] }[];
  readonly maxHops?: number;
}
interface AblationLike {
  readonly clue: EntityRef;
  readonly role: string;
  readonly topWithout: EntityRef | null;
  readonly verdictWithout?: { readonly status: string };
  readonly pullsTowards?: EntityRef | null;
}
interface SuggestionLike {
  readonly text: string;
  readonly rulesOut?: readonly string[];
  readonly triple?: { readonly subject: string; readonly predicate: string; readonly object: string; readonly literal?: boolean };
  readonly verified?: boolean;
}
interface ExplanationLike {
  readonly coverage?: CoverageLike;
  readonly ablation?: readonly AblationLike[];
  readonly suggestions?: readonly SuggestionLike[];
  readonly labels?: Readonly<Record<string, string>>;
}

/** Session progress as the screen's one-line progress. */
export function progressOf(p: SessionProgress): OpenProgress {
  const phase: Record<string, string> = {
    catalog: "opening the catalog",
    index: "relation index",
    linker: "building the name index",
    model: "reading types and relations",
    ready: "starting the screen",
  };
  const ix = p.index;
  if (ix) {
    const what = ix.phase.startsWith("snapshot-load") ? "loading relation index" : ix.phase.startsWith("snapshot-save") ? "saving relation index" : `building relation index (${ix.phase})`;
    const fraction = ix.done !== undefined && ix.total ? Math.min(1, ix.done / ix.total) : undefined;
    return fraction !== undefined ? { phase: what, fraction } : { phase: what };
  }
  return { phase: phase[p.phase] ?? p.phase };
}

/** Label lookups over a catalog, cached per engine. */
class Labels {
  private readonly relations = new Map<string, string>();
  private readonly entities = new Map<string, string>();
  constructor(private readonly cat: Catalog) {
    for (const p of cat.predicates()) this.relations.set(p.id, p.label);
  }
  relation(id: string): string {
    return this.relations.get(id) ?? id;
  }
  entity(id: string): string {
    let l = this.entities.get(id);
    if (l === undefined) {
      const n = this.cat.numOf(id);
      l = n === undefined ? id : this.cat.ref(n).label;
      this.entities.set(id, l);
    }
    return l;
  }
}

function explanationOf(outcome: AskOutcome): ExplanationLike | undefined {
  const ex: ExplanationLike | undefined = outcome.explanation;
  return ex;
}

/** The screen's view of one answered question. */
export function buildTuiResult(session: Session, outcome: AskOutcome, labels: Labels, millis: number): TuiResult {
  const r = outcome.result;
  const ex = explanationOf(outcome);
  const lab: Record<string, string> = { ...(ex?.labels ?? {}) };
  const ent = (id: string) => (lab[id] = labels.entity(id));
  for (const m of r.mentions) {
    lab[m.entity.id] = m.entity.label;
    for (const a of m.alternatives) lab[a.id] = a.label;
  }
  for (const a of r.answers) {
    lab[a.id] = a.label;
    for (const t of a.types) ent(t);
    for (const p of a.paths) {
      ent(p.from);
      for (const st of p.steps) {
        lab[st.relation] = labels.relation(st.relation);
        ent(st.from);
        ent(st.to);
      }
    }
  }
  for (const t of r.verdict.tiedWith) ent(t);
  const clues = outcome.ranked.clues.map((c) => ({ id: c.id, label: c.label, mention: c.mention, weight: c.weight }));
  for (const c of clues) lab[c.id] = c.label;

  // coverage: the explanation's table when there is one, else the ranking's per-clue parts
  let coverage: CoverageRow[];
  if (ex?.coverage && ex.coverage.rows.length > 0) {
    const maxHops = ex.coverage.maxHops;
    const colIndex = ex.coverage.clues.map((c) => clues.findIndex((k) => k.id === c.id));
    coverage = ex.coverage.rows.slice(0, DEFAULTS.coverageRows).map((row) => ({
      id: row.answer.id,
      label: row.answer.label,
      cells: clues.map((_, j) => {
        const cell = row.cells[colIndex.indexOf(j)];
        if (!cell || !cell.reached) return { reached: false, text: maxHops !== undefined ? `not within ${maxHops}` : "not reached" };
        const rels = cell.relations.map((x) => x.label ?? (x.id !== undefined ? labels.relation(x.id) : "?")).join("/");
        return { reached: true, ...(cell.hops !== null ? { hops: cell.hops } : {}), text: `${cell.hops ?? "?"}h ${rels}` };
      }),
    }));
  } else {
    const byNode = new Map(outcome.ranked.candidates.map((c) => [c.node, c]));
    const colMax = clues.map((_, j) => Math.max(0, ...outcome.ranked.candidates.slice(0, DEFAULTS.coverageRows).map((c) => c.perClue[j] ?? 0)));
    coverage = r.answers.slice(0, DEFAULTS.coverageRows).map((a) => {
      const num = session.catalog.numOf(a.id);
      const cand = num === undefined ? undefined : byNode.get(num);
      return {
        id: a.id,
        label: a.label,
        cells: clues.map((c, j) => {
          const part = cand?.perClue[j] ?? 0;
          const strength = colMax[j]! > 0 ? part / colMax[j]! : 0;
          const hops = a.paths.filter((p) => p.from === c.id).reduce((m, p) => Math.min(m, p.steps.length), Infinity);
          const reached = strength >= 0.01 || hops < Infinity;
          return { reached, strength, ...(hops < Infinity ? { hops } : {}), text: hops < Infinity ? `${hops}h` : reached ? `${Math.round(strength * 100)}%` : "not reached" };
        }),
      };
    });
  }

  const ablation: AblationView[] = ex?.ablation
    ? ex.ablation.map((e) => ({
        clue: e.clue.id,
        label: e.clue.label,
        effect: e.role,
        ...(e.topWithout ? { topWithout: e.topWithout } : {}),
        text:
          (e.topWithout ? `best would be ${e.topWithout.label}` : "nothing would be ranked") +
          (e.verdictWithout ? ` (${e.verdictWithout.status})` : "") +
          (e.pullsTowards ? ` · alone it favours ${e.pullsTowards.label}` : ""),
      }))
    : [];
  for (const a of ablation) lab[a.clue] = a.label;

  const suggestions: SuggestionView[] = (ex?.suggestions ?? []).map((s) => {
    const t = s.triple;
    const fact = t ? `${labels.entity(t.subject)} ${labels.relation(t.predicate)} ${t.literal ? t.object : labels.entity(t.object)}` : undefined;
    // the fact's other end (not the best answer itself), for its entity card
    const topId = r.answers[0]?.id;
    const entity = t && !t.literal ? (t.subject === topId ? t.object : t.subject) : undefined;
    if (entity) ent(entity);
    return {
      text: s.text,
      ...(s.rulesOut ? { rulesOut: s.rulesOut.length } : {}),
      ...(fact ? { fact: fact + (s.verified ? " · checked" : "") } : {}),
      ...(entity ? { entity } : {}),
    };
  });

  return { result: r, labels: lab, clues, coverage, ablation, suggestions, notes: [...(r.notes ?? [])], millis };
}

/** The card of an entity id, or null when the catalog has no such entity. */
export function buildCard(cat: Catalog, id: string): EntityCard | null {
  const num = cat.numOf(id) ?? cat.byLabelOrId(id)[0];
  if (num === undefined) return null;
  const e = cat.entity(num);
  return {
    id: e.id,
    label: e.label,
    aliases: e.aliases,
    types: e.types,
    description: e.description,
    attributes: e.attributes.map((a) => ({ label: a.label, value: a.value })),
    neighbours: cat.neighbours(num, DEFAULTS.cardNeighbours).map((n) => ({ direction: n.direction, relation: n.relation, relationLabel: n.relationLabel, id: n.id, label: n.label })),
  };
}

/** The screen's view of a composition (compose stage): each proposal's question, facts and proof as lines. */
export function buildComposeView(c: Composition): ComposeView {
  return {
    target: { id: c.target.id, label: c.target.label },
    proposals: c.proposals.map((p) => ({
      question: p.question,
      verified: p.verified,
      ...(p.reason ? { reason: p.reason } : {}),
      facts: p.clues.filter((k) => k.kind !== "type").map((k) => (k.kind === "attribute" ? `${k.attribute!.label} = ${k.attribute!.value}` : `${k.path ?? k.entity!.label}${k.salience !== undefined ? `  (salience ${Math.round(k.salience * 100)}%)` : ""}`)),
      proof: p.clues.map((k) => (k.kind === "type" ? `${k.entity!.label} ${k.candidates}` : String(k.candidates))).join(" → "),
    })),
    notes: c.notes,
    millis: c.timings.total,
  };
}

/** A one-line title for a session's catalog. */
export function titleOf(session: Session, db: string | undefined): string {
  const c = session.counts();
  const name = db === undefined ? "demo catalog" : db.split(/[\\/]/).pop()!;
  return `${name} · ${c.entities.toLocaleString("en")} entities · ${c.edges.toLocaleString("en")} edges${session.store ? ` in ${session.store.endpoint}` : ""}`;
}

/** Session-backed engine operations, shared by the in-process and the worker engines. */
export class SessionEngineCore {
  private readonly labels: Labels;
  private composer: Composer | undefined;
  constructor(
    readonly session: Session,
    readonly title: string,
    /** Time budget per question in milliseconds (0: none; absent: Session.ask's default). */
    readonly timeLimitMs?: number,
  ) {
    this.labels = new Labels(session.catalog);
  }
  /** Answers a question (through Session.askAsync: an attached catalog pulls from its store). */
  async ask(question: string, pins: readonly PinView[], top: number): Promise<TuiResult> {
    const t0 = performance.now();
    const outcome = await this.session.askAsync(question, { top, pins, ...(this.timeLimitMs !== undefined ? { timeLimitMs: this.timeLimitMs } : {}) });
    return buildTuiResult(this.session, outcome, this.labels, performance.now() - t0);
  }
  /** An entity card (an attached catalog pulls the entity's edges first). */
  async card(id: string): Promise<EntityCard | null> {
    const num = this.session.catalog.numOf(id);
    if (num !== undefined) await this.session.around([num], 0);
    return buildCard(this.session.catalog, id);
  }
  /** Questions whose only answer is entity `id` (the composer is made on first use). */
  async compose(id: string): Promise<ComposeView | null> {
    const num = this.session.catalog.numOf(id);
    if (num === undefined) return null;
    this.composer ??= new Composer(this.session);
    return buildComposeView(await this.composer.compose(num));
  }
}

const tick = () => new Promise<void>((resolve) => setImmediate(resolve));

/** Where the engine's catalog comes from. */
export interface EngineSource {
  /** Catalog file; the demo catalog when absent. */
  readonly db?: string;
  /** Time budget per question in milliseconds (`--time-limit`; 0: none). */
  readonly timeLimitMs?: number;
}

/** Opens a Session in this thread, after letting the screen paint once. */
export async function inProcessEngine(source: EngineSource, onProgress?: (p: OpenProgress) => void): Promise<TuiEngine> {
  await tick();
  const session = Session.open({ ...(source.db !== undefined ? { db: source.db } : {}), onProgress: (p) => onProgress?.(progressOf(p)) });
  const core = new SessionEngineCore(session, titleOf(session, source.db), source.timeLimitMs);
  // one request at a time, in order (an attached catalog's requests await its store, and one pull must not interleave with another)
  let queue: Promise<unknown> = Promise.resolve();
  const serial = <T>(f: () => Promise<T>): Promise<T> => {
    const r = queue.then(async () => {
      await tick();
      return f();
    });
    queue = r.catch(() => undefined);
    return r;
  };
  return {
    title: core.title,
    ask: (question, pins, top) => serial(() => core.ask(question, pins, top)),
    card: (id) => serial(() => core.card(id)),
    compose: (id) => serial(() => core.compose(id)),
    close() {
      session.close();
    },
  };
}
