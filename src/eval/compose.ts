/**
 * `npm run eval:compose -- [--targets N] [--seed S] [--sets demo,world,debian] [--json]`:
 * issue 22's measurement of `compose` (compose-figures.ts says what is measured): the demo
 * catalog, the world-countries npm package and the committed Debian package slice, N seeded
 * targets each, the salience-aware cost search beside the most-discriminating-first baseline.
 * Progress on stderr; the Markdown table (or JSON) on stdout.
 */
import { Catalog, demoCatalogPath } from "../catalog/index.js";
import { TiepointError } from "../model/index.js";
import { DEFAULTS, evaluateCompose, renderFigures, type ComposeFigures } from "./compose-figures.js";
import { builtCatalog, runTool, setByName } from "./eval-sets.js";

function dbOf(set: string): string {
  if (set === "demo") return demoCatalogPath();
  return builtCatalog(setByName(set)).db;
}

async function main(argv: readonly string[]): Promise<void> {
  const opt = (name: string): string | undefined => {
    const i = argv.indexOf(name);
    return i >= 0 ? argv[i + 1] : undefined;
  };
  for (const a of argv) if (a.startsWith("--") && !["--targets", "--seed", "--sets", "--json"].includes(a)) throw new TiepointError("cli/usage", `unknown option ${a}`);
  const n = Number(opt("--targets") ?? DEFAULTS.targets);
  const seed = Number(opt("--seed") ?? DEFAULTS.seed);
  if (!Number.isInteger(n) || n < 1) throw new TiepointError("cli/usage", `--targets must be a positive whole number, got "${opt("--targets")}"`);
  if (!Number.isInteger(seed)) throw new TiepointError("cli/usage", `--seed must be a whole number, got "${opt("--seed")}"`);
  const sets = (opt("--sets") ?? DEFAULTS.sets.join(",")).split(",").map((s) => s.trim());
  for (const s of sets) if (!DEFAULTS.sets.includes(s)) throw new TiepointError("cli/usage", `unknown set "${s}" (sets: ${DEFAULTS.sets.join(", ")})`);
  const rows: ComposeFigures[] = [];
  for (const set of sets) {
    const db = dbOf(set);
    const cat = Catalog.open(db, { readonly: true });
    const entities = cat.db.prepare("SELECT count(*) FROM entity").pluck().get() as number;
    cat.close();
    process.stderr.write(`${set}: ${entities} entities (${db})\n`);
    rows.push(...await evaluateCompose(set, db, n, seed, (s) => process.stderr.write(`  ${s}\n`)));
  }
  process.stdout.write(argv.includes("--json") ? JSON.stringify({ seed, targets: n, rows }, null, 2) + "\n" : renderFigures(rows));
}

runTool(() => main(process.argv.slice(2)));
