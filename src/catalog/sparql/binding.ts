/**
 * The binding of an attached catalog: the file `PATH.store` beside a catalog made by
 * `tiepoint attach`, saying which SPARQL endpoint (and graph) holds its relation edges, and
 * carrying the store's own counts that the question stages need without pulling edges: each
 * entity's degree (edges in + out, as the relation index counts them), each relation's edge
 * count, and the direct types at each end of each relation (counted over the store's edges).
 *
 * The file is JSON (integer arrays as base64 little-endian Int32/Float64), stamped with the
 * catalog's uid and generation like the other derived files: a binding whose stamp differs
 * from its catalog's is refused. It never holds credentials.
 */
import { readFileSync, writeFileSync, existsSync } from "node:fs";
import { TiepointError } from "../../model/index.js";

/** Format version of `PATH.store`. */
export const BINDING_FORMAT = 1;

/** Direct types at the relation ends, flat (the relation index's `RelationEndTable` layout). */
export interface EndTableRows {
  readonly totals: Float64Array;
  readonly keys: Int32Array;
  readonly types: Int32Array;
  readonly counts: Float64Array;
}

/** What an attached catalog knows about its store. */
export interface StoreBinding {
  readonly endpoint: string;
  /** The named graph, or null for the store's default graph. */
  readonly graph: string | null;
  readonly uid: string;
  readonly generation: number;
  /** ISO time of the pull. */
  readonly attachedAt: string;
  /** Rows per request the store returned without cutting (learnt during the attach). */
  readonly pageSize: number;
  /** The store's relation edges (distinct triples with an IRI or blank-node object, minus type and subtype links). */
  readonly edges: number;
  /** Degree per entity num (edges in + out). */
  readonly degree: Int32Array;
  /** Edges per relation (predicate num). */
  readonly relationEdges: Uint32Array;
  readonly ends: EndTableRows;
}

/** The binding file of a catalog path. */
export function bindingPath(catalogPath: string): string {
  return `${catalogPath}.store`;
}

const b64 = (a: ArrayBufferView) => Buffer.from(a.buffer, a.byteOffset, a.byteLength).toString("base64");
function unb64<T>(s: string, make: (buf: ArrayBuffer) => T): T {
  const b = Buffer.from(s, "base64");
  const copy = new ArrayBuffer(b.byteLength);
  new Uint8Array(copy).set(b);
  return make(copy);
}

/** Writes a binding file. */
export function writeBinding(file: string, b: StoreBinding): void {
  const doc = {
    format: BINDING_FORMAT,
    endpoint: b.endpoint,
    graph: b.graph,
    uid: b.uid,
    generation: b.generation,
    attachedAt: b.attachedAt,
    pageSize: b.pageSize,
    edges: b.edges,
    degree: b64(b.degree),
    relationEdges: b64(b.relationEdges),
    ends: { totals: b64(b.ends.totals), keys: b64(b.ends.keys), types: b64(b.ends.types), counts: b64(b.ends.counts) },
  };
  writeFileSync(file, JSON.stringify(doc));
}

/**
 * The binding of the catalog at `catalogPath` with stamp `stamp`, or undefined when the
 * catalog has none (a loaded catalog). A binding that does not belong to the catalog is an error.
 */
export function readBinding(catalogPath: string, stamp: { readonly uid: string; readonly generation: number }): StoreBinding | undefined {
  const file = bindingPath(catalogPath);
  if (!existsSync(file)) return undefined;
  let d: Record<string, unknown>;
  try {
    d = JSON.parse(readFileSync(file, "utf8")) as Record<string, unknown>;
  } catch (e) {
    throw new TiepointError("catalog/binding", `the store binding is unreadable (${(e as Error).message.slice(0, 80)}); run attach --refresh`, { file });
  }
  if (d.format !== BINDING_FORMAT) throw new TiepointError("catalog/binding", `store binding format ${String(d.format)}, this build reads ${BINDING_FORMAT}; run attach --refresh`, { file });
  if (d.uid !== stamp.uid || d.generation !== stamp.generation) throw new TiepointError("catalog/binding", "the store binding belongs to another state of the catalog; run attach --refresh", { file });
  const ends = d.ends as Record<string, string>;
  return {
    endpoint: String(d.endpoint),
    graph: typeof d.graph === "string" ? d.graph : null,
    uid: String(d.uid),
    generation: Number(d.generation),
    attachedAt: String(d.attachedAt),
    pageSize: Number(d.pageSize),
    edges: Number(d.edges),
    degree: unb64(String(d.degree), (b) => new Int32Array(b)),
    relationEdges: unb64(String(d.relationEdges), (b) => new Uint32Array(b)),
    ends: {
      totals: unb64(ends.totals!, (b) => new Float64Array(b)),
      keys: unb64(ends.keys!, (b) => new Int32Array(b)),
      types: unb64(ends.types!, (b) => new Int32Array(b)),
      counts: unb64(ends.counts!, (b) => new Float64Array(b)),
    },
  };
}
