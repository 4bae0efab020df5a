/**
 * `tiepoint stats [--db PATH] [--json]`: counts, degree distribution summary, largest hubs
 * and the number of connected components of a catalog.
 */
import type { Command } from "commander";
import { Catalog, catalogStats, readBinding, shownEndpoint } from "../../catalog/index.js";
import type { CatalogStats } from "../../catalog/index.js";
import { guarded } from "../run.js";
import { catalogPath } from "./show.js";

const fmt = (n: number) => n.toLocaleString("en-US");

/** Limits of the text output. */
export const DEFAULTS = {
  /** Lines listed per table (types, relations, types with no members); the rest are counted. */
  listed: 30,
};

/** Up to `DEFAULTS.listed` lines, then how many more. */
function capped(lines: string[]): string[] {
  if (lines.length <= DEFAULTS.listed) return lines;
  return [...lines.slice(0, DEFAULTS.listed), `    … and ${fmt(lines.length - DEFAULTS.listed)} more`];
}

/** Renders the statistics as text lines. */
export function renderStats(path: string, s: CatalogStats): string {
  const c = s.counts;
  const lines = [
    `catalog ${path}`,
    ...(s.store
      ? [`  attached to the SPARQL store ${s.store.endpoint}${s.store.graph ? `, graph <${s.store.graph}>` : " (default graph)"}: its edges stay there; the edge counts below are the store's, taken at the attach of ${s.store.attachedAt} (attach --db ${path} --refresh counts again)`]
      : []),
    `  entities    ${fmt(c.entities)}`,
    `  types       ${fmt(c.types)}`,
    `  relations   ${fmt(c.relations)} used in edges`,
    `  predicates  ${fmt(c.predicates)} (relations and attribute names)`,
    `  edges       ${fmt(c.edges)}`,
    `  attributes  ${fmt(c.attributes)}`,
    `  labels and aliases ${fmt(c.aliases)}`,
    `  degree (edges in + out per entity): min ${s.degree.min}, median ${s.degree.median}, p99 ${s.degree.p99}, max ${s.degree.max}, mean ${s.degree.mean.toFixed(2)}`,
    s.components === null
      ? `  connected components: not computed (the edges are in the store); ${fmt(s.isolated)} entities without edges`
      : `  connected components ${fmt(s.components)} (largest ${fmt(s.largestComponent ?? 0)} entities; ${fmt(s.isolated)} entities without edges; types without edges are not counted)`,
  ];
  if (s.hubs.length) {
    lines.push("  largest hubs:");
    for (const h of s.hubs) lines.push(`    ${String(h.degree).padStart(8)}  ${h.label} [${h.id}]`);
  }
  if (s.types.length) {
    lines.push("  types (members with subtypes, direct members):");
    lines.push(...capped(s.types.map((t) => `    ${fmt(t.withSubtypes).padStart(8)} ${fmt(t.members).padStart(8)}  ${t.label} [${t.id}]`)));
  }
  if (s.relations.length) {
    lines.push("  relations (edges):");
    lines.push(...capped(s.relations.map((r) => `    ${fmt(r.edges).padStart(8)}  ${r.label} [${r.id}]`)));
  }
  lines.push(
    s.sharedNames.count === 0
      ? "  shared names: none (every label and alias names one entity)"
      : `  shared names: ${fmt(s.sharedNames.count)} name${s.sharedNames.count === 1 ? "" : "s"} carried by several entities (a question using one needs other clues to tell them apart)${s.sharedNames.count > s.sharedNames.top.length ? `; the ${s.sharedNames.top.length} most shared` : ""}:`,
  );
  for (const n of s.sharedNames.top) lines.push(`    ${fmt(n.entities).padStart(8)}  ${n.name}`);
  if (s.emptyTypes.length) {
    lines.push(`  types with no members (${fmt(s.emptyTypes.length)}):`);
    lines.push(...capped(s.emptyTypes.map((t) => `              ${t.label} [${t.id}]`)));
  }
  return lines.join("\n");
}

/** Registers `stats`. */
export function registerStats(program: Command): void {
  program
    .command("stats")
    .description("catalog counts, degree distribution, largest hubs, connected components, members per type, edges per relation, shared names, types with no members")
    .option("--db <path>", "the catalog file (default: the demo catalog)")
    .option("--json", "print JSON on stdout")
    .action((opts: { db?: string; json?: boolean }) =>
      guarded(() => {
        const path = catalogPath(opts.db);
        const cat = Catalog.open(path, { readonly: true });
        try {
          // an attached catalog: the store's counts from its binding (no request)
          const b = readBinding(path, cat.version());
          const s = catalogStats(cat, b ? { store: { endpoint: shownEndpoint(b.endpoint), graph: b.graph, attachedAt: b.attachedAt, edges: b.edges, degree: b.degree, relationEdges: b.relationEdges } } : {});
          process.stdout.write((opts.json ? JSON.stringify(s, null, 2) : renderStats(path, s)) + "\n");
        } finally {
          cat.close();
        }
      }),
    );
}
