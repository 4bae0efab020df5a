/**
 * CSV (RFC 4180, via csv-parse) and TSV (IANA text/tab-separated-values: tab-delimited, no
 * quoting) importer in the project's own layouts, chosen by the header row:
 * `subject, relation, object` → one edge per row; a column `id` → one entity (or type,
 * relation, attribute, by an optional `kind` column) per row, with optional columns
 * `label`, `aliases`, `types`, `subClassOf` (`|`-separated), `description`; every other
 * column is an attribute named by its header. Documented in README.md, "Import formats".
 */
import { createRequire } from "node:module";
import type { Parser as CsvParser } from "csv-parse";
import type { LoadContext } from "./context.js";
import { readBlocks } from "./lines.js";

/** Layout options; all optional. */
export const DEFAULTS = {
  /** Separator of list cells (aliases, types, subClassOf). */
  listSeparator: "|",
};

const RESERVED = new Set(["id", "kind", "label", "aliases", "types", "description", "subclassof"]);
/** Columns a relation or attribute row reads (plus `unit` on attribute rows of a file with a `kind` column). */
const PREDICATE_COLUMNS = new Set(["id", "kind", "label", "aliases", "description"]);
const EDGE_COLUMNS = ["subject", "relation", "object"];
const KINDS = new Set(["entity", "type", "relation", "attribute"]);

interface Layout {
  readonly edges: boolean;
  readonly names: readonly string[];
  /** lower-cased header → column index */
  readonly col: ReadonlyMap<string, number>;
  /** A `unit` column in a file with a `kind` column: the unit of attribute rows, not an attribute. */
  readonly unit: boolean;
}

interface CsvInfo {
  readonly lines: number;
}

/** The internal synchronous parse entry of csv-parse's stream Parser (`parser.api.parse`). */
interface SyncApi {
  parse(buf: Buffer | undefined, end: boolean, push: (r: { record: string[]; info: CsvInfo }) => void, close: () => void): Error | undefined;
}

function list(cell: string | undefined): string[] {
  if (cell === undefined) return [];
  return cell
    .split(DEFAULTS.listSeparator)
    .map((s) => s.trim())
    .filter((s) => s !== "");
}

/** Imports one CSV or TSV file into the load's transaction. */
export function importCsv(ctx: LoadContext, file: string, format: "csv" | "tsv"): void {
  // csv-parse is loaded here, on the first CSV or TSV file, not with every command (its CommonJS build: the same parser)
  const { Parser } = createRequire(import.meta.url)("csv-parse") as { Parser: typeof CsvParser };
  const parser = new Parser({
    delimiter: format === "tsv" ? "\t" : ",",
    quote: format === "tsv" ? false : '"',
    relax_column_count: true,
    skip_empty_lines: true,
    bom: true,
    info: true,
  });
  const api = (parser as unknown as { api: SyncApi }).api;
  let layout: Layout | undefined;
  let failed = false;
  let bytes = 0;
  let lastLine = 0; // the line the last record ended on
  const w = ctx.writer;

  const header = (cells: string[], line: number): Layout | undefined => {
    const names = cells.map((c) => c.trim());
    const col = new Map<string, number>();
    names.forEach((n, i) => {
      const k = n.toLowerCase();
      if (n === "") ctx.error(file, line, `column ${i + 1} of the header is empty (every column needs a name)`);
      else if (col.has(k)) ctx.error(file, line, `column "${n}" appears twice in the header`);
      else col.set(k, i);
    });
    const hasEdge = EDGE_COLUMNS.filter((c) => col.has(c));
    if (col.has("id")) {
      if (hasEdge.length === 3) ctx.error(file, line, `the header has both "id" and subject, relation, object columns (use one layout per file)`);
      return { edges: false, names, col, unit: col.has("unit") && col.has("kind") };
    }
    if (hasEdge.length > 0) {
      const missing = EDGE_COLUMNS.filter((c) => !col.has(c));
      if (missing.length > 0) {
        ctx.error(file, line, `missing required column${missing.length > 1 ? "s" : ""} ${missing.join(", ")} (an edge file has columns subject, relation, object)`);
        return undefined;
      }
      const extra = names.filter((n) => !EDGE_COLUMNS.includes(n.toLowerCase()));
      if (extra.length > 0) ctx.error(file, line, `unexpected column "${extra[0]}" in an edge file (expected only subject, relation, object)`);
      return { edges: true, names, col, unit: false };
    }
    ctx.error(file, line, `missing required columns: expected a column "id" (entities) or columns subject, relation, object (edges)`);
    return undefined;
  };

  const row = (cells: string[], line: number): void => {
    const L = layout!;
    // every row has the header's field count (RFC 4180 §2.4): a short row is a truncated or
    // mis-exported one, never silently loaded (issue 10); a short edge row is reported below,
    // by the values it lacks
    if (cells.length > L.names.length || (cells.length < L.names.length && !L.edges)) {
      ctx.error(file, line, `row has ${cells.length} field${cells.length === 1 ? "" : "s"}, the header has ${L.names.length}`);
      return;
    }
    const get = (name: string): string | undefined => {
      const i = L.col.get(name);
      return i === undefined ? undefined : cells[i];
    };
    if (L.edges) {
      const missing = EDGE_COLUMNS.filter((c) => (get(c) ?? "").trim() === "");
      if (missing.length > 0) {
        ctx.error(file, line, `missing value${missing.length > 1 ? "s" : ""} for ${missing.join(", ")} (an edge row needs subject, relation and object)`);
        return;
      }
      const s = get("subject")!.trim();
      const r = get("relation")!.trim();
      const o = get("object")!.trim();
      ctx.requireEntities(file, line, [s, o]);
      w.edge(s, r, o);
      return;
    }
    const id = (get("id") ?? "").trim();
    if (id === "") {
      ctx.error(file, line, `missing value for id (every row of an entity file needs an id)`);
      return;
    }
    const kind = ((get("kind") ?? "").trim() || "entity").toLowerCase();
    if (!KINDS.has(kind)) {
      ctx.error(file, line, `unknown kind ${JSON.stringify(kind)} (expected entity, type, relation or attribute)`);
      return;
    }
    const labelCell = get("label");
    if (labelCell !== undefined && L.col.has("label") && labelCell.trim() === "" && cells.length > L.col.get("label")!) {
      ctx.error(file, line, `empty label (give the entity a label, or drop the label column)`);
      return;
    }
    const label = labelCell?.trim();
    const aliases = list(get("aliases"));
    if (kind === "relation" || kind === "attribute") {
      w.predicate(id);
      ctx.declaredPredicates.add(id);
      if (label) w.predicateLabel(id, label);
      for (const a of aliases) w.predicateAlias(id, a);
      const unit = L.unit ? get("unit")?.trim() : undefined;
      if (kind === "attribute" && unit) w.predicateUnit(id, unit);
      // what a relation or attribute row cannot hold is said, not dropped silently
      L.names.forEach((name, i) => {
        const k = name.toLowerCase();
        if (PREDICATE_COLUMNS.has(k) || (k === "unit" && kind === "attribute" && L.unit) || (cells[i] ?? "").trim() === "") return;
        ctx.warn("ignored column", `column "${name}" is ignored on a ${kind} row (a ${kind} row takes id, kind, label, aliases, description${kind === "attribute" && L.unit ? ", unit" : ""})`);
      });
      return;
    }
    w.entity(id);
    ctx.declare(id);
    if (label) w.label(id, label);
    for (const a of aliases) w.alias(id, a);
    const desc = get("description")?.trim();
    if (desc) w.description(id, desc);
    for (const t of list(get("types"))) w.type(id, t);
    for (const s of list(get("subclassof"))) w.subclass(id, s);
    L.names.forEach((name, i) => {
      if (RESERVED.has(name.toLowerCase())) return;
      const v = (cells[i] ?? "").trim();
      if (L.unit && name.toLowerCase() === "unit") {
        if (v !== "") ctx.warn("ignored column", `column "${name}" is ignored on ${kind === "entity" ? "an" : "a"} ${kind} row (it gives the unit of attribute rows)`);
        return;
      }
      if (v !== "") w.attribute(id, name, v, null, null);
    });
  };

  const push = ({ record, info }: { record: string[]; info: CsvInfo }): void => {
    // info.lines is the line the record ends on; a quoted cell may span lines
    let inner = 0;
    for (const c of record) for (let i = c.indexOf("\n"); i >= 0; i = c.indexOf("\n", i + 1)) inner++;
    const line = info.lines - inner;
    lastLine = info.lines;
    if (layout === undefined) {
      layout = header(record, line);
      if (layout === undefined) failed = true;
      return;
    }
    ctx.line = line;
    row(record, line);
    ctx.tick(bytes);
  };

  const feed = (buf: Buffer | undefined, end: boolean): void => {
    if (failed) return;
    const err = api.parse(buf, end, push, () => undefined);
    if (err) {
      const e = err as Error & { lines?: number; code?: string };
      // a quoted field may run over many lines before the parser notices: point at the
      // line the broken record starts on
      const line = Math.min(lastLine + 1, e.lines ?? lastLine + 1);
      ctx.error(file, line, `${format.toUpperCase()} syntax error in the record starting here: ${e.message.replace(/^Invalid [A-Za-z ]+: /, "")}`);
      failed = true;
    }
  };

  readBlocks(
    file,
    (block) => {
      bytes = block.bytesRead;
      feed(Buffer.from(block.text, "utf8"), false);
    },
    (line, kind, detail) => ctx.error(file, line, kind === "utf8" ? `not valid UTF-8: ${detail}` : detail, "catalog/encoding"),
  );
  feed(undefined, true);
  // an empty file (no header) loads nothing; load warns about every file without statements
}
