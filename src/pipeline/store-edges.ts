/**
 * The relation edges of an attached catalog, pulled from its SPARQL store per question
 * ===================================================================================
 *
 * An attached catalog (pipeline/attach.ts) holds names, types and attributes; its edges stay
 * in the store. Per question this module pulls the neighbourhood the question's stages read
 * and puts it where those stages read edges from, so that linking, reading, ranking,
 * explanation and verdict run the same code as for a loaded catalog:
 *
 * - into per-entity adjacency lists in memory (pulled-edges.ts), which answer the catalog's
 *   edge reads (the linker's, `show`'s, the entity card's) for this session's catalog, in the
 *   order the catalog's `edge` table would give;
 * - into a relation index over the pulled edges (`RelationIndex.withPulledEdges`) whose
 *   degrees are the store's own counts (binding file), so the walk's hub damping and every
 *   degree test are those of the whole graph.
 *
 * What is pulled, for one question (each row of an entity is all its edges, both directions):
 *
 * 1. the rows the linker reads (its candidates' context texts, link sets and relation checks),
 *    found by recording which entities it asks about, then linking again on the pulled rows;
 * 2. ring by ring from the linked clue entities, `DEFAULTS.rings` rings: the rows of the
 *    neighbours of the previous ring — except hubs, entities with more than `DEFAULTS.hubCap`
 *    edges by the store's count, whose rows are not pulled (they stay reachable as the end of
 *    a pulled edge, with their true degree); a hub clue's neighbours are pulled all the same
 *    when their rows, by the store's counts, number at most `DEFAULTS.hubRows`;
 * 3. when a clue reaches none of the `answerRings` best answers' paths: `rings` rings around those
 *    answers too, so that a path from the clue meets them in the middle (up to 2·rings + 2 hops);
 * 4. whatever the final run still asked for (why-not entities, suggestion checks), once more.
 *
 * Each request asks for the rows of a batch of entities with two VALUES blocks (as subject,
 * as object); a batch holds at most `pageSize` rows by the store's counts (the size the attach
 * found the store answers whole) and `maxValues` entities. A batch must return exactly the
 * rows the counts promise: fewer with the store's cut signal, or exactly a full page, means the
 * store's row limit cut it (the batch is split and asked again); any other difference means
 * the store changed since the attach (an error asking for `attach --refresh`). An entity
 * with more than `maxRow` edges is never pulled, and the answer says so in a note.
 *
 * Rows are read as SPARQL 1.1 Query Results CSV (catalog/sparql/csv.ts), the blank-node ends
 * told apart by `isBlank` columns. The session keeps every row it pulled (up to `cacheEdges`
 * edges, the oldest rows leaving first): a later question that needs the same entity's row
 * takes it from there without a request. Which rows a question takes does not depend on the
 * cache (the rings are grown the same way); only the order of its edges in the index may (a
 * cached row comes in the order it was first answered), which breaks exact ties only.
 */
import { Catalog, SparqlClient, UNIT_VOCABULARY, VOCABULARY, iriRef, labelFromId, nodeId, csvNode, csvTrue, shownEndpoint, type NeighbourInfo, type StoreBinding } from "../catalog/index.js";
import { linkQuestion, type Pin } from "../linking/index.js";
import { RelationIndex } from "../ranking/index.js";
import { TiepointError } from "../model/index.js";
import { inGraph } from "./attach.js";
import { PulledEdges } from "./pulled-edges.js";
import type { EdgeAccess, EdgeContext, EdgeCounts, QuestionRun, StoreDescription } from "./edge-access.js";
import type { QueryGraph } from "../analysis/index.js";

/** Pull limits (README "Attaching a SPARQL store"). */
export const DEFAULTS = {
  /** Rings of neighbours pulled around the linked clue entities (the reading's exact matches come from the store itself, step 3). */
  rings: 2,
  /** A ring after the first is pulled only when its rows (the store's counts) number at most this many (else the walk's mass leaves the pulled region there, transition.ts). */
  ringRows: 5000,
  /** Entities with more edges than this (the store's count) are not expanded in the rings. */
  hubCap: 1000,
  /** A hub clue (or answer) is expanded all the same when its neighbours' rows, by the store's counts, number at most this many. */
  hubRows: 20_000,
  /** Entities with more edges than this are never pulled (their edges reach the question only from their neighbours' rows). */
  maxRow: 50_000,
  /** Entities per VALUES block. */
  maxValues: 1000,
  /** Requests in flight at once (a store serves a few HTTP threads; Virtuoso's default ServerThreads is 10, the test server's 4). */
  parallel: 2,
  /** Passes for what the final run still asked for. */
  extraRounds: 2,
  /** Best answers whose own rings are pulled when a clue does not reach them (the path search then meets in the middle). */
  answerRings: 3,
  /** Rows of the reading's exact-match query asked of the store (its variables' entities are pulled, hubs not). */
  matchCap: 2000,
  /** Edges the session keeps of the rows it pulled (12 bytes each), for the next questions; the oldest rows go first. */
  cacheEdges: 1_000_000,
};

/** Options of a store session. */
export interface StoreOptions {
  readonly timeoutMs?: number;
  readonly credentials?: string;
}

/** Figures of the last question's pulls. */
export interface PullFigures {
  requests: number;
  rows: number;
  entities: number;
  ms: number;
  /** Hubs left unexpanded, and entities over `maxRow`. */
  hubs: number;
  tooLarge: number;
  /** The reading's exact-match query returned `matchCap` rows (more matches may exist). */
  matchesCut?: boolean;
  /** Rings not pulled for `ringRows`. */
  ringsCut?: number;
  /** Rows taken from the session's cache (pulled by an earlier question) instead of the store. */
  cached?: number;
}

/** The columns of an edge-row pull (`rowsQuery`): the triple, and whether its ends are blank nodes (CSV writes terms as plain text). */
const ROW_VARS = ["s", "p", "o", "sb", "ob"];

const NOT_EDGES = [VOCABULARY.type, VOCABULARY.subClassOf, ...Object.keys(UNIT_VOCABULARY)];

/** The store side of an attached catalog's session: its {@link EdgeAccess}. */
export class StoreEdges implements EdgeAccess {
  readonly binding: StoreBinding;
  readonly client: SparqlClient;
  private readonly catalog: Catalog;
  private readonly numOf = new Map<string, number>();
  private readonly predicateNum = new Map<string, number>();
  /** 1 + the largest predicate num (the edge keys' radix). */
  private relSpan = 1;
  private readonly idStmt;
  private readonly numStmt;
  private readonly numsStmt;
  private readonly textStmt;
  private readonly cardStmt;
  /** Predicate id and label by num. */
  private readonly predicateOf = new Map<number, { id: string; label: string }>();
  /** The question's pulled edges, for the catalog's edge reads. */
  private readonly edges = new PulledEdges();
  private readonly pulled = new Set<number>();
  private demand = new Set<number>();
  private src: number[] = [];
  private rel: number[] = [];
  private dst: number[] = [];
  /** Edges taken for this question, as numbers ((src · relations + rel) · nodes + dst, exact below 2^53) or, past that, strings. */
  private readonly seen = new Set<number | string>();
  figures: PullFigures = { requests: 0, rows: 0, entities: 0, ms: 0, hubs: 0, tooLarge: 0 };
  private readonly skipped = new Set<number>();
  /** The rows pulled so far in this session, per entity: its edges as flat (src, rel, dst) triples; oldest first (Map order). */
  private readonly rowCache = new Map<number, Int32Array>();
  private cachedEdges = 0;

  /** Answers `catalog`'s edge reads from the pulled edges (pulled-edges.ts), recording which entities' rows they ask for. */
  constructor(catalog: Catalog, binding: StoreBinding, options: StoreOptions = {}) {
    this.catalog = catalog;
    this.binding = binding;
    this.client = new SparqlClient(binding.endpoint, { ...options, pageSize: binding.pageSize });
    const db = catalog.db;
    this.idStmt = db.prepare("SELECT id FROM main.entity WHERE num = ?").pluck();
    this.numStmt = db.prepare("SELECT num FROM main.entity WHERE id = ?").pluck();
    this.numsStmt = db.prepare("SELECT e.id, e.num FROM json_each(?) j JOIN main.entity e ON e.id = j.value").raw(true);
    this.textStmt = db.prepare("SELECT label, description FROM main.entity WHERE num = ?").raw(true);
    this.cardStmt = db.prepare("SELECT id, label FROM main.entity WHERE num = ?").raw(true);
    for (const [num, id, label] of db.prepare("SELECT num, id, label FROM main.predicate").raw(true).all() as [number, string, string | null][]) {
      this.predicateNum.set(id, num);
      this.predicateOf.set(num, { id, label: label ?? labelFromId(id) });
      this.relSpan = Math.max(this.relSpan, num + 1);
    }
    // the edge reads of the linker (and show) record which entities' rows a question needs
    const record = (num: number) => {
      if (!this.pulled.has(num)) this.demand.add(num);
    };
    const e = this.edges;
    Object.defineProperties(catalog, {
      neighbourNums: { value: (num: number, limit = 1000) => (record(num), e.neighbourNums(num, limit)) },
      neighbourTexts: { value: (num: number, limit = 50) => (record(num), e.neighbourNums(num, limit).map((n) => this.textStmt.get(n) as [string | null, string | null])) },
      hasRelationEdge: { value: (num: number, rel: number) => (record(num), e.hasRelation(num, rel)) },
      neighbours: { value: (num: number, limit = 200) => (record(num), this.neighbours(num, limit)) },
      hasEdge: { value: (s: string, p: string, o: string) => this.hasEdge(s, p, o) },
      edges: { value: () => e.ordered() },
    });
  }

  /** `Catalog.neighbours` over the pulled edges: both directions, each by relation id then entity id (its `ORDER BY`), at most `limit` each. */
  private neighbours(num: number, limit: number): NeighbourInfo[] {
    const side = (pairs: readonly number[], direction: "out" | "in"): NeighbourInfo[] => {
      const rows: NeighbourInfo[] = [];
      for (let i = 0; i < pairs.length; i += 2) {
        const p = this.predicateOf.get(pairs[i]!)!;
        const [id, label] = this.cardStmt.get(pairs[i + 1]!) as [string, string | null];
        rows.push({ relation: p.id, relationLabel: p.label, direction, id, label: label ?? labelFromId(id) });
      }
      const cmp = (a: string, b: string) => (a < b ? -1 : a > b ? 1 : 0);
      return rows.sort((a, b) => cmp(a.relation, b.relation) || cmp(a.id, b.id)).slice(0, limit);
    };
    return [...side(this.edges.outPairs(num), "out"), ...side(this.edges.inPairs(num), "in")];
  }

  /** `Catalog.hasEdge` over the pulled edges. */
  private hasEdge(s: string, p: string, o: string): boolean {
    const sn = this.numOfId(s);
    const on = this.numOfId(o);
    const pn = this.predicateNum.get(p);
    return sn !== undefined && on !== undefined && pn !== undefined && this.edges.has(sn, pn, on);
  }

  /** Forgets the previous question's edges. */
  reset(): void {
    this.edges.clear();
    this.pulled.clear();
    this.demand.clear();
    this.skipped.clear();
    this.src = [];
    this.rel = [];
    this.dst = [];
    this.seen.clear();
    this.figures = { requests: 0, rows: 0, entities: 0, ms: 0, hubs: 0, tooLarge: 0 };
  }

  /** The entities asked about and not pulled since the last call. */
  takeDemand(): number[] {
    const d = [...this.demand].filter((n) => !this.pulled.has(n));
    this.demand = new Set();
    return d;
  }

  /** The store's degree of an entity. */
  degree(num: number): number {
    return this.binding.degree[num] ?? 0;
  }

  /** The num of an entity id, if the catalog has it. */
  numOfId(id: string): number | undefined {
    return this.numOf.get(id) ?? (this.numStmt.get(id) as number | undefined);
  }

  private entityNum(id: string): number {
    let n = this.numOf.get(id);
    if (n === undefined) {
      n = this.numStmt.get(id) as number | undefined;
      if (n === undefined) throw new TiepointError("store/changed", `SPARQL endpoint ${shownEndpoint(this.binding.endpoint)}: an edge names ${id}, which the catalog does not know (the store changed since the attach); run attach --db ${this.catalog.path} --refresh`);
      this.numOf.set(id, n);
    }
    return n;
  }

  /** Pulls the complete rows of `nums` (those not pulled yet and not over `maxRow`), batched. */
  async pull(nums: Iterable<number>): Promise<void> {
    const t0 = performance.now();
    const todo: number[] = [];
    for (const n of nums) {
      if (this.pulled.has(n)) continue;
      const d = this.degree(n);
      const id = this.idStmt.get(n) as string | undefined;
      if (d === 0 || id === undefined || id.startsWith("_:")) {
        this.pulled.add(n); // nothing to pull (no edges), or a blank node the store cannot be asked about by name
        continue;
      }
      if (d > DEFAULTS.maxRow) {
        if (!this.skipped.has(n)) this.figures.tooLarge++;
        this.skipped.add(n);
        continue;
      }
      if (this.adopt(n)) continue;
      todo.push(n);
    }
    todo.sort((a, b) => a - b);
    const batches: number[][] = [];
    let cur: number[] = [];
    let rows = 0;
    for (const n of todo) {
      const d = this.degree(n);
      if (cur.length > 0 && (rows + d > this.client.pageSize || cur.length >= DEFAULTS.maxValues)) {
        batches.push(cur);
        cur = [];
        rows = 0;
      }
      cur.push(n);
      rows += d;
    }
    if (cur.length > 0) batches.push(cur);
    // an entity with more edges than the store answers whole is pulled alone, in pages
    let next = 0;
    const worker = async () => {
      while (next < batches.length) {
        const b = batches[next++]!;
        await (b.length === 1 && this.degree(b[0]!) > this.client.pageSize ? this.pullPaged(b[0]!) : this.pullBatch(b));
      }
    };
    await Promise.all(Array.from({ length: Math.min(DEFAULTS.parallel, batches.length) }, worker));
    this.figures.ms += performance.now() - t0;
  }

  /** The query for the edge rows of `batch` (as subject and as object). */
  private rowsQuery(batch: readonly number[]): string {
    const values = batch.map((n) => iriRef(this.idStmt.get(n) as string)).join(" ");
    const G = (body: string) => inGraph(this.binding.graph, body);
    const notEdges = NOT_EDGES.map(iriRef).join(", ");
    return `SELECT ?s ?p ?o (isBlank(?s) AS ?sb) (isBlank(?o) AS ?ob) WHERE { { VALUES ?s { ${values} } ${G("?s ?p ?o")} } UNION { VALUES ?o { ${values} } ${G("?s ?p ?o")} } FILTER(!isLiteral(?o) && ?p NOT IN (${notEdges})) }`;
  }

  /** The rows of one entity with more edges than one answer of the store holds: paged, checked against the store's count (client `paged`). */
  private async pullPaged(num: number): Promise<void> {
    const before = this.client.requests;
    const rows: string[][] = [];
    await this.client.paged(this.rowsQuery([num]), (q) => this.client.csvRows(q, ROW_VARS), (row) => row.join("\u0000"), this.degree(num), "?s ?p ?o", (page) => rows.push(...page), () => (rows.length = 0));
    this.figures.requests += this.client.requests - before;
    this.figures.rows += rows.length;
    this.take(rows, [num]);
    this.pulled.add(num);
    this.figures.entities++;
  }

  private async pullBatch(batch: readonly number[]): Promise<void> {
    const expected = batch.reduce((s, n) => s + this.degree(n), 0);
    const before = this.client.requests;
    const rows: string[][] = [];
    const r = await this.client.selectCsv(this.rowsQuery(batch), ROW_VARS, (f) => rows.push(f));
    this.figures.requests += this.client.requests - before;
    this.figures.rows += r.rows;
    if (r.rows !== expected) {
      const cut = r.cutAt !== undefined || (r.rows < expected && r.rows === this.client.pageSize);
      if (cut || r.rows < expected) {
        if (cut && batch.length > 1) {
          // the store's row limit cut the answer: smaller batches
          this.client.pageSize = Math.max(1, Math.min(this.client.pageSize, r.cutAt ?? r.rows));
          const half = Math.ceil(batch.length / 2);
          await this.pullBatch(batch.slice(0, half));
          await this.pullBatch(batch.slice(half));
          return;
        }
        if (cut) {
          // one entity's edges exceed the store's row limit: pull them in pages of what it answers
          this.client.pageSize = Math.max(1, Math.min(this.client.pageSize, r.cutAt ?? r.rows));
          this.figures.rows -= r.rows;
          await this.pullPaged(batch[0]!);
          return;
        }
      }
      throw new TiepointError("store/changed", `SPARQL endpoint ${shownEndpoint(this.binding.endpoint)}: the store returned ${r.rows} edge rows where the attach counted ${expected} (the store changed since the attach); run attach --db ${this.catalog.path} --refresh`);
    }
    this.take(rows, batch);
    for (const n of batch) this.pulled.add(n);
    this.figures.entities += batch.length;
  }

  /** Adds pulled edge rows (each edge once) to the pulled edges (the catalog's edge reads and the pulled arrays), and keeps the rows of `entities` (those pulled) in the session's cache. */
  private take(rows: readonly string[][], entities: readonly number[]): void {
    const mine = new Set(entities);
    // the nums of the ids not seen before in this session, in one statement (not one lookup per id)
    const unknown = new Set<string>();
    // each end's id made once (both passes read it)
    const ids: string[] = new Array(rows.length * 2);
    rows.forEach(([sv, , ov, sb, ob], i) => {
      ids[2 * i] = nodeId(csvNode(sv!, csvTrue(sb!)));
      ids[2 * i + 1] = nodeId(csvNode(ov!, csvTrue(ob!)));
    });
    for (const id of ids) if (!this.numOf.has(id)) unknown.add(id);
    if (unknown.size > 0) for (const [id, num] of this.numsStmt.all(JSON.stringify([...unknown])) as [string, number][]) this.numOf.set(id, num);
    const per = new Map<number, number[]>();
    const keep = (n: number, s: number, p: number, o: number) => {
      let l = per.get(n);
      if (!l) per.set(n, (l = []));
      l.push(s, p, o);
    };
    for (let i = 0; i < rows.length; i++) {
      const pv = rows[i]![1];
      const s = this.entityNum(ids[2 * i]!);
      const o = this.entityNum(ids[2 * i + 1]!);
      const p = this.predicateNum.get(pv!);
      if (p === undefined) throw new TiepointError("store/changed", `SPARQL endpoint ${shownEndpoint(this.binding.endpoint)}: an edge uses relation ${pv!}, which the catalog does not know (the store changed since the attach); run attach --db ${this.catalog.path} --refresh`);
      this.addEdge(s, p, o);
      if (mine.has(s)) keep(s, s, p, o);
      if (mine.has(o) && o !== s) keep(o, s, p, o);
    }
    for (const n of entities) this.remember(n, per.get(n) ?? []);
  }

  /** One edge into the question's pulled edges (once). */
  private addEdge(s: number, p: number, o: number): void {
    const nodes = this.binding.degree.length;
    const rels = this.relSpan;
    const numeric = (s * rels + p) * nodes + o;
    const key = Number.isSafeInteger(numeric) && nodes * nodes * rels < Number.MAX_SAFE_INTEGER ? numeric : `${s} ${p} ${o}`;
    if (this.seen.has(key)) return;
    this.seen.add(key);
    this.src.push(s);
    this.rel.push(p);
    this.dst.push(o);
    this.edges.add(s, p, o);
  }

  /** Keeps an entity's row for the session (the oldest rows leave when more than `cacheEdges` edges are kept). */
  private remember(num: number, triples: readonly number[]): void {
    const edges = triples.length / 3;
    if (edges > DEFAULTS.cacheEdges) return;
    const old = this.rowCache.get(num);
    if (old) {
      this.rowCache.delete(num);
      this.cachedEdges -= old.length / 3;
    }
    for (const [k, v] of this.rowCache) {
      if (this.cachedEdges + edges <= DEFAULTS.cacheEdges) break;
      this.rowCache.delete(k);
      this.cachedEdges -= v.length / 3;
    }
    this.rowCache.set(num, Int32Array.from(triples));
    this.cachedEdges += edges;
  }

  /** Takes an entity's row from the session's cache (no request); false when it is not there. */
  private adopt(num: number): boolean {
    const r = this.rowCache.get(num);
    if (!r) return false;
    this.rowCache.delete(num); // most recently used last
    this.rowCache.set(num, r);
    for (let i = 0; i < r.length; i += 3) this.addEdge(r[i]!, r[i + 1]!, r[i + 2]!);
    this.pulled.add(num);
    this.figures.entities++;
    this.figures.cached = (this.figures.cached ?? 0) + 1;
    return true;
  }

  /**
   * The reading's exact matches, asked of the store: the query graph (analysis query-graph.ts)
   * written as one SPARQL SELECT — each edge's relation options a UNION, in their stored
   * direction, the clue entities as IRIs — returning the entities bound to its variables and
   * its answer, at most `matchCap` rows. Only readings with a variable (two hops or more): a
   * one-hop reading's matches are in the clue's own row. Undefined when the reading cannot be
   * written (an edge with no relation word, a blank-node clue).
   */
  async readingMatches(reading: QueryGraph): Promise<number[] | undefined> {
    if (!reading.nodes.some((n) => n.kind === "variable") || reading.edges.length === 0) return undefined;
    const term = (i: number): string | undefined => {
      const n = reading.nodes[i]!;
      if (n.kind !== "constant") return `?n${i}`;
      return n.name.startsWith("_:") ? undefined : iriRef(n.name);
    };
    const relId = new Map([...this.predicateNum].map(([id, num]) => [num, id]));
    const parts: string[] = [];
    for (const e of reading.edges) {
      const from = term(e.from);
      const to = term(e.to);
      if (from === undefined || to === undefined || e.options.length === 0) return undefined;
      const alts = e.options.map((o) => {
        const id = relId.get(o.relation);
        return id === undefined ? undefined : inGraph(this.binding.graph, o.inverse ? `${to} ${iriRef(id)} ${from}` : `${from} ${iriRef(id)} ${to}`);
      });
      if (alts.some((a) => a === undefined)) return undefined;
      parts.push(alts.length === 1 ? alts[0]! : alts.map((a) => `{ ${a} }`).join(" UNION "));
    }
    const vars = reading.nodes.map((n, i) => (n.kind === "constant" ? "" : `?n${i}`)).filter(Boolean);
    const before = this.client.requests;
    const r = await this.client.select(`SELECT DISTINCT ${vars.join(" ")} WHERE { ${parts.join(" . ")} } LIMIT ${DEFAULTS.matchCap}`);
    this.figures.requests += this.client.requests - before;
    this.figures.rows += r.rows.length;
    if (r.rows.length >= DEFAULTS.matchCap || r.cutAt !== undefined) this.figures.matchesCut = true;
    const out = new Set<number>();
    for (const row of r.rows) {
      for (const t of Object.values(row)) {
        if (t.type === "literal") continue;
        const num = this.numOfId(nodeId(t));
        if (num !== undefined && this.degree(num) <= DEFAULTS.hubCap) out.add(num);
      }
    }
    return [...out];
  }

  /** Neighbours of `nums` in the pulled rows. */
  neighboursOf(nums: ReadonlySet<number>): Set<number> {
    const out = new Set<number>();
    for (let i = 0; i < this.src.length; i++) {
      if (nums.has(this.src[i]!)) out.add(this.dst[i]!);
      if (nums.has(this.dst[i]!)) out.add(this.src[i]!);
    }
    return out;
  }

  /** The relation index of the pulled edges over `base`'s nodes and types, with the store's degrees. */
  index(base: RelationIndex): RelationIndex {
    const n = this.src.length;
    return RelationIndex.withPulledEdges(base, base.relationCount, { src: Int32Array.from(this.src), rel: Int32Array.from(this.rel), dst: Int32Array.from(this.dst), n }, this.binding.degree);
  }
  /** True when `ring` (the `r`-th, 0 the clues) may be pulled: the first two always, later ones when their rows fit in `ringRows`. */
  ringFits(ring: ReadonlySet<number>, r: number): boolean {
    if (r <= 1) return true;
    let rows = 0;
    for (const n of ring) if (!this.pulled.has(n)) rows += this.degree(n);
    if (rows <= DEFAULTS.ringRows) return true;
    this.figures.ringsCut = (this.figures.ringsCut ?? 0) + 1;
    return false;
  }

  /** The next ring around `ring`: the neighbours of its members that are no hubs (a hub clue's row is pulled, its neighbours' rows are not), not in `visited` (which it extends), hubs left out. */
  nextRing(ring: ReadonlySet<number>, visited: Set<number>): Set<number> {
    const next = new Set<number>();
    // a hub in the ring (a clue or an answer: later rings hold no hubs) is expanded when its
    // neighbours' own rows, by the store's counts, fit in `hubRows` (a section of a thousand
    // small packages does; a library every package depends on does not)
    const sources = new Set([...ring].filter((n) => this.degree(n) <= DEFAULTS.hubCap || this.neighbourRows(n, visited) <= DEFAULTS.hubRows));
    for (const v of this.neighboursOf(sources)) {
      if (visited.has(v)) continue;
      visited.add(v);
      if (this.degree(v) > DEFAULTS.hubCap) {
        this.figures.hubs++;
        continue;
      }
      next.add(v);
    }
    return next;
  }

  /** The rows (store counts) of `num`'s pulled neighbours not in `visited`, hubs left out (they are never expanded as neighbours). */
  private neighbourRows(num: number, visited: ReadonlySet<number>): number {
    let rows = 0;
    for (const v of this.neighboursOf(new Set([num]))) {
      const d = this.degree(v);
      if (!visited.has(v) && d <= DEFAULTS.hubCap) rows += d;
    }
    return rows;
  }

  /** Notes for the answer: what the pull left out. */
  notes(): string[] {
    const out: string[] = [];
    if (this.figures.tooLarge > 0) out.push(`${this.figures.tooLarge} entit${this.figures.tooLarge === 1 ? "y has" : "ies have"} more than ${DEFAULTS.maxRow.toLocaleString("en-US")} edges in the store and ${this.figures.tooLarge === 1 ? "was" : "were"} not pulled: their edges count only where a neighbour's row holds them (README "Attaching a SPARQL store")`);
    if (this.figures.matchesCut) out.push(`the reading's exact matches in the store number more than ${DEFAULTS.matchCap.toLocaleString("en-US")}; the edges of the first ${DEFAULTS.matchCap.toLocaleString("en-US")} were pulled (README "Attaching a SPARQL store")`);
    return out;
  }

  /** The store, as `stats` and titles show it (never credentials). */
  get store(): StoreDescription {
    return { endpoint: shownEndpoint(this.binding.endpoint), graph: this.binding.graph, attachedAt: this.binding.attachedAt };
  }

  /** The store's own counts, taken during the attach (no request). */
  counts(): EdgeCounts {
    return { edges: this.binding.edges, degree: this.binding.degree, relationEdges: this.binding.relationEdges };
  }

  /** The rows of `nums` and `rings` rings of neighbours around them (hubs not expanded), as a relation index; the catalog's edge reads see the same rows. */
  async around(ctx: EdgeContext, nums: readonly number[], rings: number): Promise<RelationIndex> {
    this.reset();
    let ring = new Set(nums);
    await this.pull(ring);
    const visited = new Set(ring);
    for (let r = 0; r < rings && ring.size > 0; r++) {
      ring = this.nextRing(ring, visited);
      if (!this.ringFits(ring, r + 1)) break;
      await this.pull(ring);
    }
    return this.index(ctx.index);
  }

  /**
   * One question of an attached catalog: pulls the neighbourhood its stages read (the steps of
   * the file header), running `run` — the session's own pipeline — on the pulled index.
   */
  async forQuestion<O extends QuestionRun>(ctx: EdgeContext, question: string, pinned: readonly Pin[] | undefined, run: (index: RelationIndex) => O): Promise<O> {
    const t0 = performance.now();
    this.reset();
    ctx.linker.forgetEdges();
    const pins = pinned !== undefined ? { pins: pinned } : {};
    // 1. the linker's reads: record, pull, read again
    let link = linkQuestion(question, ctx.linker, pins);
    for (let round = 0; round < 3; round++) {
      const need = this.takeDemand();
      if (need.length === 0) break;
      await this.pull(need);
      ctx.linker.forgetEdges();
      link = linkQuestion(question, ctx.linker, pins);
    }
    // 2. rings around the linked clue entities and their alternatives (a clue linked with low confidence seeds them too, ranking's clueSeeds)
    let ring = new Set<number>();
    for (const m of link.mentions) {
      for (const ref of [m.entity, ...m.alternatives]) {
        const num = this.numOfId(ref.id);
        if (num !== undefined) ring.add(num);
      }
    }
    // the reading's exact matches, asked of the store while the rings are pulled; their rows go with the last ring
    const reading = ctx.readingOf?.(question, pinned);
    const matches = reading ? this.readingMatches(reading) : Promise.resolve(undefined);
    matches.catch(() => undefined); // awaited below; a failure is reported there
    await this.pull(ring);
    const visited = new Set(ring);
    for (let r = 0; r < DEFAULTS.rings && ring.size > 0; r++) {
      ring = this.nextRing(ring, visited);
      if (!this.ringFits(ring, r + 1)) break;
      if (r + 1 < DEFAULTS.rings) await this.pull(ring);
      else break;
    }
    await this.pull([...(ring.size > 0 && this.figures.ringsCut === undefined ? ring : []), ...((await matches) ?? [])]);
    // 3. the pipeline on the pulled neighbourhood; what it still asked for, and the rings of
    // answers a clue does not reach, are pulled and it runs again
    let out: O;
    let answersExpanded = false;
    for (let round = 0; ; round++) {
      ctx.linker.forgetEdges();
      this.takeDemand();
      out = run(this.index(ctx.index));
      const need = new Set(this.takeDemand());
      if (!answersExpanded) {
        answersExpanded = true;
        const clues = out.result.mentions.length;
        const unreached = out.result.answers.slice(0, DEFAULTS.answerRings).filter((a) => new Set(a.paths.map((p) => p.from)).size < clues);
        if (unreached.length > 0) {
          let around = new Set<number>();
          for (const a of unreached) {
            const num = this.numOfId(a.id);
            if (num !== undefined) around.add(num);
          }
          const seen = new Set(around);
          for (const n of around) need.add(n);
          for (let r = 0; r < DEFAULTS.rings && around.size > 0; r++) {
            await this.pull(need);
            need.clear();
            around = this.nextRing(around, seen);
            if (!this.ringFits(around, r + 1)) break;
            for (const n of around) need.add(n);
          }
        }
      }
      if (need.size === 0 || round >= DEFAULTS.extraRounds) break;
      await this.pull(need);
    }
    const notes = this.notes();
    const total = performance.now() - t0;
    return {
      ...out,
      result: notes.length > 0 ? { ...out.result, notes: [...(out.result.notes ?? []), ...notes] } : out.result,
      timings: { ...out.timings, total },
    };
  }
}
