/**
 * `tiepoint stats [--db PATH] [--json]`: counts, degree distribution summary, largest hubs
 * and the number of connected components of a catalog.
 */
import type { Command } from "commander";
import { Catalog, catalogStats } from "../../catalog/index.js";
import type { CatalogStats } from "../../catalog/index.js";
import { guarded } from "../run.js";
import { catalogPath } from "./show.js";

const fmt = (n: number) => n.toLocaleString("en-US");

/** Renders the statistics as text lines. */
export function renderStats(path: string, s: CatalogStats): string {
  const c = s.counts;
  const lines = [
    `catalog ${path}`,
    `  entities    ${fmt(c.entities)}`,
    `  types       ${fmt(c.types)}`,
    `  relations   ${fmt(c.relations)} used in edges`,
    `  predicates  ${fmt(c.predicates)} (relations and attribute names)`,
    `  edges       ${fmt(c.edges)}`,
    `  attributes  ${fmt(c.attributes)}`,
    `  labels and aliases ${fmt(c.aliases)}`,
    `  degree (edges in + out per entity): min ${s.degree.min}, median ${s.degree.median}, p99 ${s.degree.p99}, max ${s.degree.max}, mean ${s.degree.mean.toFixed(2)}`,
    `  connected components ${fmt(s.components)} (largest ${fmt(s.largestComponent)} entities; ${fmt(s.isolated)} entities without edges)`,
  ];
  if (s.hubs.length) {
    lines.push("  largest hubs:");
    for (const h of s.hubs) lines.push(`    ${String(h.degree).padStart(8)}  ${h.label} [${h.id}]`);
  }
  return lines.join("\n");
}

/** Registers `stats`. */
export function registerStats(program: Command): void {
  program
    .command("stats")
    .description("catalog counts, degree distribution, largest hubs and connected components")
    .option("--db <path>", "the catalog file (default: the demo catalog)")
    .option("--json", "print JSON on stdout")
    .action((opts: { db?: string; json?: boolean }) =>
      guarded(() => {
        const path = catalogPath(opts.db);
        const cat = Catalog.open(path, { readonly: true });
        try {
          const s = catalogStats(cat);
          process.stdout.write((opts.json ? JSON.stringify(s, null, 2) : renderStats(path, s)) + "\n");
        } finally {
          cat.close();
        }
      }),
    );
}
