/**
 * Layering rule of ../shared/style.md: a stage imports only earlier stages, and only through
 * their index.ts. Scans the import statements of every source file.
 */
import { readdirSync, readFileSync, statSync } from "node:fs";
import { join, relative, dirname, resolve, sep } from "node:path";
import { describe, expect, it } from "vitest";

const SRC = resolve(__dirname, "../src");
/** Pipeline order; tools (gen, bench, eval) come last and may use any stage. */
const ORDER = ["model", "catalog", "linking", "analysis", "ranking", "explain", "pipeline", "present", "cli", "gen", "bench", "eval"];

function files(dir: string): string[] {
  return readdirSync(dir).flatMap((n) => {
    const p = join(dir, n);
    return statSync(p).isDirectory() ? files(p) : /\.(ts|tsx)$/.test(n) ? [p] : [];
  });
}

function stageOf(file: string): string {
  return relative(SRC, file).split(sep)[0]!;
}

describe("stage layering", () => {
  it("every stage folder is known", () => {
    for (const f of files(SRC)) expect(ORDER, relative(SRC, f)).toContain(stageOf(f));
  });

  it("no backward or deep import between stages", () => {
    const problems: string[] = [];
    for (const f of files(SRC)) {
      if (/\.test\.tsx?$/.test(f)) continue;
      const from = stageOf(f);
      const text = readFileSync(f, "utf8");
      for (const m of text.matchAll(/(?:import|export)[^'"]*?from\s+["']([^"']+)["']|import\(\s*["']([^"']+)["']\s*\)/g)) {
        const spec = m[1] ?? m[2]!;
        if (!spec.startsWith(".")) continue;
        const target = resolve(dirname(f), spec);
        const to = stageOf(target);
        if (to === from) continue;
        const ti = ORDER.indexOf(to);
        const fi = ORDER.indexOf(from);
        if (ti > fi && fi < ORDER.indexOf("gen")) problems.push(`${relative(SRC, f)} imports later stage ${to} (${spec})`);
        const rest = relative(join(SRC, to), target).split(sep);
        const isIndex = rest.length === 1 && /^index(\.js|\.ts|\.tsx)?$/.test(rest[0]!);
        const isSubIndex = to === "present" && rest.length === 2 && /^index(\.js)?$/.test(rest[1]!);
        if (!isIndex && !isSubIndex) problems.push(`${relative(SRC, f)} deep-imports ${spec} (use ${to}/index.js)`);
      }
    }
    expect(problems).toEqual([]);
  });
});
