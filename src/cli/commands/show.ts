/**
 * `tiepoint show ENTITY [--db PATH] [--json]`: one entity — label, aliases, types,
 * description, attributes, relations in and out. ENTITY is an id or an exact label; when no
 * label matches exactly, the normalised form is tried. An ambiguous label lists the
 * candidates (ids and types) and exits 1.
 */
import type { Command } from "commander";
import { Catalog, demoCatalogPath, normalize } from "../../catalog/index.js";
import type { EntityInfo, NeighbourInfo } from "../../catalog/index.js";
import { TiepointError } from "../../model/index.js";
import { guarded } from "../run.js";

/** Limits of `show`. */
export const DEFAULTS = {
  /** Relations listed per direction. */
  maxRelations: 200,
  /** Candidates listed for an ambiguous name. */
  maxCandidates: 20,
};

/** The catalog path: `--db`, else the demo catalog (built on first use). */
export function catalogPath(db: string | undefined): string {
  return db ?? demoCatalogPath();
}

/** Finds the entity nums a name refers to: by id, by exact label, then by normalised label or alias. */
export function resolveEntity(cat: Catalog, name: string): number[] {
  const exact = cat.byLabelOrId(name);
  if (exact.length > 0) return exact;
  const norm = normalize(name);
  if (norm === "") return [];
  const hits = cat.byNorm(norm);
  const labels = [...new Set(hits.filter((h) => h.kind === 0).map((h) => h.entity))];
  if (labels.length > 0) return labels.sort((a, b) => a - b);
  return [...new Set(hits.map((h) => h.entity))].sort((a, b) => a - b);
}

function describe(cat: Catalog, num: number): string {
  const r = cat.ref(num);
  const types = cat.typesOf(num).map((t) => cat.ref(t).label);
  return `${r.id}  ${r.label}${types.length ? `  (${types.join(", ")})` : ""}`;
}

/** Renders an entity as text lines. */
export function renderEntity(e: EntityInfo, rels: readonly NeighbourInfo[]): string {
  const out: string[] = [];
  out.push(`${e.label}  [${e.id}]`);
  if (e.types.length) out.push(`  types:       ${e.types.map((t) => `${t.label} [${t.id}]`).join(", ")}`);
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
    .action((name: string, opts: { db?: string; json?: boolean }) =>
      guarded(() => {
        const cat = Catalog.open(catalogPath(opts.db), { readonly: true });
        try {
          const nums = resolveEntity(cat, name);
          if (nums.length === 0) throw new TiepointError("catalog/unknown-entity", `no entity with id or label ${JSON.stringify(name)}`);
          if (nums.length > 1) {
            const list = nums.slice(0, DEFAULTS.maxCandidates).map((n) => `  ${describe(cat, n)}`);
            if (nums.length > DEFAULTS.maxCandidates) list.push(`  … and ${nums.length - DEFAULTS.maxCandidates} more`);
            process.stderr.write(`${JSON.stringify(name)} names ${nums.length} entities; give one of these ids:\n${list.join("\n")}\n`);
            process.exitCode = 1;
            return;
          }
          const info = cat.entity(nums[0]!);
          const rels = cat.neighbours(nums[0]!, DEFAULTS.maxRelations);
          if (opts.json) process.stdout.write(JSON.stringify({ ...info, relations: rels }, null, 2) + "\n");
          else process.stdout.write(renderEntity(info, rels) + "\n");
        } finally {
          cat.close();
        }
      }),
    );
}
