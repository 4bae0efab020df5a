/**
 * `tiepoint show ENTITY [--db PATH] [--json]`: one entity — label, aliases, types,
 * description, attributes, relations in and out; for a type also its parents, subtypes and
 * member count. ENTITY is an id or an exact label; when no label matches exactly, the
 * normalised form is tried. An ambiguous label lists the candidates (ids and types) and
 * exits 1; an unknown one names the nearest entities ("did you mean").
 *
 * Start-up: this module imports only the catalog stage; the linker (for "did you mean") and
 * the pipeline (for a catalog attached to a SPARQL store) are imported when they are needed,
 * so showing a known entity loads about a third of the program's modules.
 */
import type { Command } from "commander";
import { distance } from "fastest-levenshtein";
import { Catalog, demoCatalogPath, readBinding, typeMembers } from "../../catalog/index.js";
import type { EntityInfo, NeighbourInfo } from "../../catalog/index.js";
import { TiepointError } from "../../model/index.js";
import type { EntityRef } from "../../model/index.js";
import { guarded } from "../run.js";
import { STORE_TIMEOUT_HELP, storeSessionOptions } from "./attach.js";

/** Limits of `show`. */
export const DEFAULTS = {
  /** Relations listed per direction. */
  maxRelations: 200,
  /** Candidates listed for an ambiguous name. */
  maxCandidates: 20,
  /** Names offered for an unknown one ("did you mean"). */
  suggestions: 5,
  /** Catalogs up to this many entities are also searched by edit distance (ids first for an id-like name; otherwise when the linker finds nothing). */
  editScanLimit: 200_000,
};

/** What `show` adds for a type: its place in the hierarchy and how many entities it has. */
export interface TypeSummary {
  readonly parents: readonly EntityRef[];
  readonly children: readonly EntityRef[];
  /** Entities with it as a direct type. */
  readonly members: number;
  /** Entities with it or one of its subtypes. */
  readonly withSubtypes: number;
}

/** The type summary of entity `num`, or undefined when it is no type (no members, no place in the hierarchy). */
export function typeSummary(cat: Catalog, num: number): TypeSummary | undefined {
  const parents = cat.db.prepare("SELECT sup FROM subclass WHERE sub = ? ORDER BY sup").pluck().all(num) as number[];
  const children = cat.db.prepare("SELECT sub FROM subclass WHERE sup = ? ORDER BY sub").pluck().all(num) as number[];
  const m = typeMembers(cat, num);
  if (parents.length === 0 && children.length === 0 && m.members === 0) return undefined;
  return { parents: parents.map((n) => cat.ref(n)), children: children.map((n) => cat.ref(n)), ...m };
}

/**
 * Names near an unknown one, for "did you mean": what the linker makes of it read as a
 * question (its fuzzy candidates and suggestions: trigram-corrected words, Jaro–Winkler,
 * see README "How mentions are linked"); when that finds nothing, the labels and ids nearest
 * by Levenshtein distance (at most a third of the name's length) in a catalog small enough to scan.
 */
export async function nearNames(cat: Catalog, name: string, max = DEFAULTS.suggestions): Promise<EntityRef[]> {
  const found = new Map<string, EntityRef>();
  const add = (r: EntityRef | null | undefined): void => {
    if (r && !found.has(r.id) && found.size < max) found.set(r.id, { id: r.id, label: r.label });
  };
  // a name written like an id (`f:p:19`, an IRI) is compared with the ids first
  const idLike = /^\S+$/.test(name) && /[:/#]/.test(name);
  if (idLike) for (const r of nearestByEdits(cat, name, max)) add(r);
  try {
    const { Linker, linkQuestion } = await import("../../linking/index.js");
    const res = linkQuestion(name, Linker.fromCatalog(cat));
    for (const m of res.mentions) {
      add(m.entity);
      for (const a of m.alternatives) add(a);
    }
    for (const u of res.unlinked) for (const x of u.suggestions) add(x);
    for (const nf of res.notFound) add(nf.nearest);
  } catch {
    // no snapshot could be built (e.g. an empty catalog): the scan below still runs
  }
  if (found.size === 0 && !idLike) for (const r of nearestByEdits(cat, name, max)) add(r);
  return [...found.values()];
}

/** Entities whose id or label is within a third of the name's length in Levenshtein distance (small catalogs only). */
function nearestByEdits(cat: Catalog, name: string, max: number): EntityRef[] {
  const labelled = cat.db.prepare("SELECT count(*) FROM entity").pluck().get() as number;
  if (labelled > DEFAULTS.editScanLimit) return [];
  const want = name.toLowerCase();
  const limit = Math.max(1, Math.floor(want.length / 3));
  const scored: { r: EntityRef; d: number }[] = [];
  for (const row of cat.db.prepare("SELECT id, label FROM entity").iterate() as IterableIterator<{ id: string; label: string | null }>) {
    const d = Math.min(distance(want, row.id.toLowerCase()), row.label === null ? Infinity : distance(want, row.label.toLowerCase()));
    if (d <= limit) scored.push({ r: { id: row.id, label: row.label ?? row.id }, d });
  }
  scored.sort((a, b) => a.d - b.d || (a.r.id < b.r.id ? -1 : a.r.id > b.r.id ? 1 : 0));
  return scored.slice(0, max).map((x) => x.r);
}

/** The catalog path: `--db`, else the demo catalog (built on first use). */
export function catalogPath(db: string | undefined): string {
  return db ?? demoCatalogPath();
}

/** Finds the entity nums a name refers to: by id, by exact label, then by normalised label or alias (the compose stage's lookup). */
export const resolveEntity = (cat: Catalog, name: string): number[] => cat.resolveName(name);

function describe(cat: Catalog, num: number): string {
  const r = cat.ref(num);
  const types = cat.typesOf(num).map((t) => cat.ref(t).label);
  return `${r.id}  ${r.label}${types.length ? `  (${types.join(", ")})` : ""}`;
}

/** Renders an entity as text lines (with its type summary when it is a type). */
export function renderEntity(e: EntityInfo, rels: readonly NeighbourInfo[], type?: TypeSummary): string {
  const out: string[] = [];
  const refs = (list: readonly EntityRef[]) => list.map((t) => `${t.label} [${t.id}]`).join(", ");
  out.push(`${e.label}  [${e.id}]`);
  if (e.types.length) out.push(`  types:       ${refs(e.types)}`);
  if (type) {
    out.push(`  a type with ${type.withSubtypes} member${type.withSubtypes === 1 ? "" : "s"} (${type.members} direct${type.withSubtypes > type.members ? `, ${type.withSubtypes - type.members} through subtypes` : ""})`);
    out.push(`  parents:     ${type.parents.length ? refs(type.parents) : "(none)"}`);
    out.push(`  subtypes:    ${type.children.length ? refs(type.children) : "(none)"}`);
  }
  if (e.aliases.length) out.push(`  aliases:     ${e.aliases.join("; ")}`);
  if (e.description) out.push(`  description: ${e.description.replace(/\s*\n\s*/g, " ")}`);
  if (e.attributes.length) {
    out.push("  attributes:");
    for (const a of e.attributes) out.push(`    ${a.label} [${a.predicate}]: ${a.value}${a.lang ? `@${a.lang}` : ""}`);
  }
  const outs = rels.filter((r) => r.direction === "out");
  const ins = rels.filter((r) => r.direction === "in");
  if (outs.length) {
    out.push("  relations out:");
    for (const r of outs) out.push(`    —${r.relationLabel}→ ${r.label} [${r.id}]`);
  }
  if (ins.length) {
    out.push("  relations in:");
    for (const r of ins) out.push(`    ←${r.relationLabel}— ${r.label} [${r.id}]`);
  }
  if (!outs.length && !ins.length) out.push("  (no relations)");
  return out.join("\n");
}

/** Registers `show`. */
export function registerShow(program: Command): void {
  program
    .command("show")
    .description("print one entity: labels, aliases, types, description, attributes, relations in and out")
    .argument("<entity>", "an entity id or label")
    .option("--db <path>", "the catalog file (default: the demo catalog)")
    .option("--json", "print JSON on stdout")
    .option("--timeout <ms>", STORE_TIMEOUT_HELP)
    .action((name: string, opts: { db?: string; json?: boolean; timeout?: string }) =>
      guarded(async () => {
        const path = catalogPath(opts.db);
        const cat = Catalog.open(path, { readonly: true });
        try {
          // an attached catalog: the entity's edges come from its store (before any edge statement is prepared)
          const binding = readBinding(path, cat.version());
          const store = binding ? new (await import("../../pipeline/index.js")).StoreEdges(cat, binding, storeSessionOptions(opts.timeout).store) : undefined;
          const nums = resolveEntity(cat, name);
          if (nums.length === 0) {
            const near = await nearNames(cat, name);
            throw new TiepointError("catalog/unknown-entity", `no entity with id or label ${JSON.stringify(name)}${near.length ? `; did you mean ${near.map((r) => `${r.label} [${r.id}]`).join(", ")}?` : ""}`);
          }
          if (nums.length > 1) {
            const list = nums.slice(0, DEFAULTS.maxCandidates).map((n) => `  ${describe(cat, n)}`);
            if (nums.length > DEFAULTS.maxCandidates) list.push(`  … and ${nums.length - DEFAULTS.maxCandidates} more`);
            process.stderr.write(`${JSON.stringify(name)} names ${nums.length} entities; give one of these ids:\n${list.join("\n")}\n`);
            process.exitCode = 1;
            return;
          }
          await store?.pull(nums);
          const info = cat.entity(nums[0]!);
          const rels = cat.neighbours(nums[0]!, DEFAULTS.maxRelations);
          const type = typeSummary(cat, nums[0]!);
          if (opts.json) process.stdout.write(JSON.stringify({ ...info, relations: rels, ...(type ? { type } : {}) }, null, 2) + "\n");
          else process.stdout.write(renderEntity(info, rels, type) + "\n");
        } finally {
          cat.close();
        }
      }),
    );
}
