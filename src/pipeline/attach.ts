/**
 * `attach`: a catalog bound to a SPARQL 1.1 store
 * ===============================================
 *
 * Makes a catalog file whose relation edges stay in the store. It pulls, page by page (SPARQL
 * 1.1 Protocol, client in catalog/sparql/client.ts), what linking, the answer types and the
 * conditions read locally, and nothing else:
 *
 * 1. the predicates with their triple counts (literal objects and node objects apart);
 * 2. every triple with a literal object (labels, aliases, descriptions, attributes), every
 *    `rdf:type`, `rdfs:subClassOf` and unit triple, asked per predicate as CONSTRUCT pages
 *    answered in N-Triples (terms exact, nothing to parse here) — written to one temporary
 *    N-Triples file per predicate as the pages arrive and read by the same importer as `load`
 *    (contract "RDF mapping") in predicate order, so the catalog rows and the name index are
 *    the ones a local load of the same triples makes; the predicates and their pages are asked
 *    at the same time (the client keeps at most `parallel` requests in flight);
 * 3. per relation, how many edges each entity has out and in (`GROUP BY` in the store, read
 *    as CSV, every relation and end at the same time): every
 *    edge end becomes an entity of the catalog (a JSON Lines record `{"id": …}`), its degree
 *    (edges in + out, what the relation index counts) goes into the name index and the
 *    binding file, and the counts per relation end give the relation ends' direct types
 *    (`RelationIndex.endTable` over the store's edges) without pulling an edge.
 *
 * The catalog, its relation snapshot (types and subtypes, no edges), its name index and its
 * binding (`PATH.store`, catalog/sparql/binding.ts) are built under temporary names beside
 * PATH and renamed into place only when everything succeeded, the catalog last: a failed
 * attach or refresh leaves the previous files as they were (POSIX rename(2) is atomic).
 */
import { existsSync, mkdtempSync, openSync, closeSync, writeSync, renameSync, rmSync, unlinkSync, ftruncateSync } from "node:fs";
import { dirname, join, basename } from "node:path";
import {
  Catalog,
  SparqlClient,
  UNIT_VOCABULARY,
  VOCABULARY,
  bindingPath,
  iriRef,
  loadFiles,
  nodeId,
  numericColumnsPath,
  csvNode,
  csvTrue,
  readBinding,
  writeBinding,
  type StoreBinding,
} from "../catalog/index.js";
import { LexicalSnapshot } from "../linking/index.js";
import { snapshotPath } from "../ranking/index.js";
import { TiepointError } from "../model/index.js";
import { LoadPreparation } from "./prepare.js";

/** Options of {@link attachStore}. */
export interface AttachOptions {
  /** Only this named graph (else the store's default graph). */
  readonly graph?: string;
  readonly timeoutMs?: number;
  /** `user:password` for HTTP basic authentication (never stored). */
  readonly credentials?: string;
  /** Rows per request. */
  readonly pageSize?: number;
  /** Progress lines (stderr in the CLI). */
  readonly onProgress?: (line: string) => void;
  /** Replace an existing attached catalog (`--refresh`). */
  readonly refresh?: boolean;
}

/** What an attach pulled. */
export interface AttachReport {
  readonly entities: number;
  readonly labels: number;
  readonly literalTriples: number;
  readonly typeTriples: number;
  readonly relations: number;
  readonly edges: number;
  readonly requests: number;
  readonly rows: number;
  readonly seconds: number;
  readonly pageSize: number;
}

const SPECIAL = new Set<string>([VOCABULARY.type, VOCABULARY.subClassOf, ...Object.keys(UNIT_VOCABULARY)]);
const LABELS = new Set<string>([VOCABULARY.label, VOCABULARY.prefLabel, VOCABULARY.altLabel]);

/** The graph pattern `body` inside the attached graph (or as is). */
export function inGraph(graph: string | null | undefined, body: string): string {
  return graph ? `GRAPH ${iriRef(graph)} { ${body} }` : body;
}

/** One relation's per-entity counts at one end. */
interface EndCounts {
  readonly ids: string[];
  readonly counts: number[];
}

function removeQuietly(file: string): void {
  try {
    unlinkSync(file);
  } catch {
    /* not there */
  }
}

/** The files of a catalog path (catalog, relation snapshot, name index, numeric columns, binding). */
function catalogFiles(path: string): string[] {
  return [path, snapshotPath(path), LexicalSnapshot.pathFor(path), numericColumnsPath(path), bindingPath(path), `${path}-wal`, `${path}-shm`];
}

/** Reads the binding of an existing attached catalog (for `--refresh`). */
export function existingBinding(db: string): StoreBinding {
  if (!existsSync(db)) throw new TiepointError("catalog/missing", "no such catalog (attach URL --db PATH makes one)", { file: db });
  const cat = Catalog.open(db, { readonly: true });
  try {
    const b = readBinding(db, cat.version());
    if (!b) throw new TiepointError("catalog/binding", "this catalog is not attached to a store (it was loaded; use load to change it)", { file: db });
    return b;
  } finally {
    cat.close();
  }
}

/** Makes (or, with `refresh`, remakes) the catalog at `db` bound to the store at `endpoint`. */
export async function attachStore(endpoint: string, db: string, options: AttachOptions = {}): Promise<AttachReport> {
  const t0 = performance.now();
  const say = options.onProgress ?? (() => {});
  if (existsSync(db) && !options.refresh) throw new TiepointError("cli/usage", `${db} already exists (attach --db ${db} --refresh pulls the store again)`);
  const client = new SparqlClient(endpoint, {
    ...(options.timeoutMs !== undefined ? { timeoutMs: options.timeoutMs } : {}),
    ...(options.credentials !== undefined ? { credentials: options.credentials } : {}),
    ...(options.pageSize !== undefined ? { pageSize: options.pageSize } : {}),
  });
  const graph = options.graph ?? null;
  const G = (body: string) => inGraph(graph, body);
  const work = mkdtempSync(join(dirname(db) === "" ? "." : dirname(db), `.${basename(db)}.attach-`));
  const temp = join(work, "catalog.db");
  const jsonl = join(work, "nodes.jsonl");
  let published = false;
  try {
    // 1. predicates
    const predicateCount = await client.count(`SELECT (COUNT(DISTINCT ?p) AS ?n) WHERE { ${G("?s ?p ?o")} }`);
    const predicates: { id: string; all: number; literals: number }[] = [];
    await client.paged(
      `SELECT ?p (COUNT(*) AS ?n) (SUM(IF(isLiteral(?o), 1, 0)) AS ?lit) (isIRI(?p) AS ?pi) WHERE { ${G("?s ?p ?o")} } GROUP BY ?p`,
      (q) => client.csvRows(q, ["p", "n", "lit", "pi"]),
      (row) => row.join("\u0000"),
      predicateCount,
      "?p",
      (rows) => {
        for (const [p, n, lit, pi] of rows) if (csvTrue(pi!)) predicates.push({ id: p!, all: Number(n), literals: Number(lit) });
      },
      () => (predicates.length = 0),
    );
    predicates.sort((a, b) => (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));
    const relations = predicates.filter((p) => !SPECIAL.has(p.id) && p.all > p.literals);
    say(`attach: ${predicateCount} predicates in the store, ${relations.length} of them relations`);

    // 2. literal, type, subtype and unit triples, streamed into one N-Triples file per
    // predicate (read by the importer in predicate order, so the catalog does not depend on
    // which answer came first); the predicates are pulled at the same time
    let pulledRows = 0;
    let lastSay = performance.now();
    const ntFiles: string[] = [];
    const perPredicate = await Promise.all(
      predicates.map(async (p, k) => {
        const special = SPECIAL.has(p.id);
        const want = special ? p.all : p.literals;
        if (want === 0) return 0;
        const pred = iriRef(p.id);
        const file = join(work, `p${String(k).padStart(4, "0")}.nt`);
        ntFiles[k] = file;
        const out = openSync(file, "w");
        let pos = 0;
        let mine = 0;
        try {
          await client.paged(
            `CONSTRUCT { ?s ${pred} ?o } WHERE { ${G(`?s ${pred} ?o`)} ${special ? "" : "FILTER(isLiteral(?o))"} }`,
            (q) => client.constructLines(q),
            (line) => line,
            want,
            "?s ?o",
            (lines) => {
              pos += writeSync(out, lines.join(""), pos);
              mine += lines.length;
              pulledRows += lines.length;
              const now = performance.now();
              if (now - lastSay > 1000) {
                lastSay = now;
                say(`attach: ${pulledRows.toLocaleString("en-US")} name, type and attribute triples pulled (${((now - t0) / 1000).toFixed(1)} s)`);
              }
            },
            () => {
              // a sorted retry of this predicate: drop what its unsorted pages wrote
              ftruncateSync(out, 0);
              pulledRows -= mine;
              pos = 0;
              mine = 0;
            },
          );
        } finally {
          closeSync(out);
        }
        return mine;
      }),
    );
    let literalTriples = 0;
    let typeTriples = 0;
    let labels = 0;
    predicates.forEach((p, k) => {
      const mine = perPredicate[k]!;
      if (SPECIAL.has(p.id)) typeTriples += mine;
      else literalTriples += mine;
      if (LABELS.has(p.id)) labels += mine;
    });
    say(`attach: ${(literalTriples + typeTriples).toLocaleString("en-US")} name, type and attribute triples pulled (${labels.toLocaleString("en-US")} labels)`);

    // 3. per relation, edges per entity at each end, every relation and end at the same time
    const counted = await Promise.all(
      relations.flatMap((p) =>
        (["?s", "?o"] as const).map(async (v): Promise<EndCounts> => {
          const where = `${G(`?s ${iriRef(p.id)} ?o`)} FILTER(!isLiteral(?o))`;
          const distinct = await client.count(`SELECT (COUNT(DISTINCT ${v}) AS ?n) WHERE { ${where} }`);
          const target: EndCounts = { ids: [], counts: [] };
          await client.paged(
            `SELECT ${v} (COUNT(*) AS ?n) (isBlank(${v}) AS ?b) WHERE { ${where} } GROUP BY ${v}`,
            (q) => client.csvRows(q, [v.slice(1), "n", "b"]),
            (row) => row.join("\u0000"),
            distinct,
            v,
            (rows) => {
              for (const [x, n, b] of rows) {
                target.ids.push(nodeId(csvNode(x!, csvTrue(b!))));
                target.counts.push(Number(n));
              }
            },
            () => {
              target.ids.length = 0;
              target.counts.length = 0;
            },
          );
          return target;
        }),
      ),
    );
    // degrees summed in relation order (the entity records, and so the catalog's nums, do not depend on which answer came first)
    const ends = new Map<string, { out: EndCounts; in: EndCounts }>();
    const degree = new Map<string, number>();
    let edges = 0;
    relations.forEach((p, k) => {
      const both = { out: counted[2 * k]!, in: counted[2 * k + 1]! };
      for (const list of [both.out, both.in]) for (let i = 0; i < list.ids.length; i++) degree.set(list.ids[i]!, (degree.get(list.ids[i]!) ?? 0) + list.counts[i]!);
      const outEdges = both.out.counts.reduce((a, b) => a + b, 0);
      edges += outEdges;
      ends.set(p.id, both);
      say(`attach: relation ${p.id}: ${outEdges.toLocaleString("en-US")} edges`);
    });

    // the relations and every edge end as JSON Lines records (the project's own layout)
    const jl = openSync(jsonl, "w");
    try {
      for (const p of relations) writeSync(jl, JSON.stringify({ kind: "relation", id: p.id }) + "\n");
      let buf: string[] = [];
      for (const id of degree.keys()) {
        buf.push(JSON.stringify({ id }));
        if (buf.length >= 10_000) {
          writeSync(jl, buf.join("\n") + "\n");
          buf = [];
        }
      }
      if (buf.length) writeSync(jl, buf.join("\n") + "\n");
    } finally {
      closeSync(jl);
    }

    // 4. the local catalog, through the importer `load` uses
    say("attach: writing the catalog and its name index");
    for (const f of catalogFiles(temp)) removeQuietly(f);
    const cat = Catalog.open(temp, { create: true });
    let binding: StoreBinding;
    try {
      // asked by the load's preparation and again for the binding, of the same finished entity table: read once
      let degreesKept: Int32Array | undefined;
      const degreesByNum = (c: Catalog, nodeCount: number): Int32Array => {
        if (degreesKept?.length === nodeCount) return degreesKept;
        const d = new Int32Array(nodeCount);
        for (const [num, id] of c.db.prepare("SELECT num, id FROM entity").raw(true).iterate() as IterableIterator<[number, string]>) {
          if (num < nodeCount) d[num] = degree.get(id) ?? 0;
        }
        return (degreesKept = d);
      };
      loadFiles(cat, [...ntFiles.filter((f) => f !== undefined), jsonl], { sink: new LoadPreparation(undefined, { degrees: degreesByNum }) });
      binding = storeBinding(cat, client.endpoint, graph, client.pageSize, edges, ends, degreesByNum(cat, cat.maxEntityNum() + 1));
    } finally {
      cat.close();
    }
    writeBinding(bindingPath(temp), binding);
    const entities = binding.degree.length;

    // 5. into place, the catalog last
    for (const f of [`${db}-wal`, `${db}-shm`]) removeQuietly(f);
    renameSync(snapshotPath(temp), snapshotPath(db));
    renameSync(LexicalSnapshot.pathFor(temp), LexicalSnapshot.pathFor(db));
    renameSync(numericColumnsPath(temp), numericColumnsPath(db));
    renameSync(bindingPath(temp), bindingPath(db));
    renameSync(temp, db);
    published = true;
    return {
      entities,
      labels,
      literalTriples,
      typeTriples,
      relations: relations.length,
      edges,
      requests: client.requests,
      rows: client.rows,
      seconds: (performance.now() - t0) / 1000,
      pageSize: client.pageSize,
    };
  } finally {
    if (!published) for (const f of catalogFiles(temp)) removeQuietly(f);
    rmSync(work, { recursive: true, force: true });
  }
}

/** The binding of a freshly attached catalog: the store's counts in the catalog's nums. */
function storeBinding(
  cat: Catalog,
  endpoint: string,
  graph: string | null,
  pageSize: number,
  edges: number,
  ends: ReadonlyMap<string, { out: EndCounts; in: EndCounts }>,
  degree: Int32Array,
): StoreBinding {
  const predNum = new Map<string, number>();
  for (const [num, id] of cat.db.prepare("SELECT num, id FROM predicate").raw(true).iterate() as IterableIterator<[number, string]>) predNum.set(id, num);
  const entNum = new Map<string, number>();
  for (const [num, id] of cat.db.prepare("SELECT num, id FROM entity").raw(true).iterate() as IterableIterator<[number, string]>) entNum.set(id, num);
  const typesOf = new Map<number, number[]>();
  for (const [e, t] of cat.db.prepare("SELECT entity, type FROM entity_type").raw(true).iterate() as IterableIterator<[number, number]>) {
    let l = typesOf.get(e);
    if (!l) typesOf.set(e, (l = []));
    l.push(t);
  }
  const R = Math.max(cat.maxPredicateNum() + 1, 1);
  const relationEdges = new Uint32Array(R);
  const totals = new Float64Array(R * 2);
  // one numeric key per (relation end, type) cell: key · T + type (a string key per edge end and type was a tenth of the attach's CPU)
  const T = cat.maxEntityNum() + 1;
  const cells = new Map<number, number>();
  for (const [id, both] of ends) {
    const r = predNum.get(id);
    if (r === undefined) continue;
    for (const [end, list] of [
      [0, both.out],
      [1, both.in],
    ] as const) {
      const key = r * 2 + end;
      for (let i = 0; i < list.ids.length; i++) {
        const n = list.counts[i]!;
        totals[key]! += n;
        if (end === 0) relationEdges[r]! += n;
        const u = entNum.get(list.ids[i]!);
        for (const t of (u !== undefined ? typesOf.get(u) : undefined) ?? []) {
          const cell = key * T + t;
          cells.set(cell, (cells.get(cell) ?? 0) + n);
        }
      }
    }
  }
  // rows sorted by key, then count descending, then type (RelationIndex.endTable's order)
  const rows = [...cells].map(([cell, count]) => [Math.floor(cell / T), cell % T, count] as const);
  rows.sort((a, b) => a[0] - b[0] || b[2] - a[2] || a[1] - b[1]);
  const stamp = cat.version();
  return {
    endpoint,
    graph,
    uid: stamp.uid,
    generation: stamp.generation,
    attachedAt: new Date().toISOString(),
    pageSize,
    edges,
    degree,
    relationEdges,
    ends: { totals, keys: Int32Array.from(rows, (r) => r[0]), types: Int32Array.from(rows, (r) => r[1]), counts: Float64Array.from(rows, (r) => r[2]) },
  };
}
