/**
 * Layering rule of ../shared/style.md: a stage imports only earlier stages, and only through
 * their index.ts. Scans the import statements of every source file.
 */
import { existsSync, readdirSync, readFileSync, statSync } from "node:fs";
import { join, relative, dirname, resolve, sep } from "node:path";
import { describe, expect, it } from "vitest";

const SRC = resolve(__dirname, "../src");
/** Pipeline order; tools (gen, bench, eval) come last and may use any stage. */
const ORDER = ["model", "catalog", "linking", "analysis", "ranking", "explain", "pipeline", "compose", "present", "cli", "gen", "bench", "eval"];

function files(dir: string): string[] {
  return readdirSync(dir).flatMap((n) => {
    const p = join(dir, n);
    return statSync(p).isDirectory() ? files(p) : /\.(ts|tsx)$/.test(n) ? [p] : [];
  });
}

/** The module specifiers a file imports or re-exports (static, dynamic and type-only). */
function importsOf(file: string): string[] {
  const text = readFileSync(file, "utf8");
  return [...text.matchAll(/(?:import|export)[^'"]*?from\s+["']([^"']+)["']|import\(\s*["']([^"']+)["']\s*\)/g)].map((m) => m[1] ?? m[2]!);
}

function stageOf(file: string): string {
  return relative(SRC, file).split(sep)[0]!;
}

describe("stage layering", () => {
  it("every stage folder is known", () => {
    for (const f of files(SRC)) expect(ORDER, relative(SRC, f)).toContain(stageOf(f));
  });

  it("no import cycle inside a stage (type-only imports count too)", () => {
    // the import graph between one stage's own files; a cycle is found by depth-first search
    // (Tarjan 1972: a back edge closes a cycle), reported as its file chain
    const edges = new Map<string, string[]>();
    for (const f of files(SRC)) {
      if (/\.test\.tsx?$/.test(f)) continue;
      const out: string[] = [];
      for (const spec of importsOf(f)) {
        if (!spec.startsWith(".")) continue;
        const target = resolve(dirname(f), spec).replace(/\.js$/, "");
        const file = [".ts", ".tsx"].map((x) => target + x).find((x) => existsSync(x));
        if (file && stageOf(file) === stageOf(f)) out.push(file);
      }
      edges.set(f, out);
    }
    const cycles: string[] = [];
    const state = new Map<string, 1 | 2>(); // 1: on the current path, 2: done
    const path: string[] = [];
    const visit = (f: string): void => {
      state.set(f, 1);
      path.push(f);
      for (const g of edges.get(f) ?? []) {
        if (state.get(g) === 1) cycles.push([...path.slice(path.indexOf(g)), g].map((x) => relative(SRC, x)).join(" → "));
        else if (state.get(g) === undefined) visit(g);
      }
      path.pop();
      state.set(f, 2);
    };
    for (const f of [...edges.keys()].sort()) if (state.get(f) === undefined) visit(f);
    expect(cycles).toEqual([]);
  });

  it("no backward or deep import between stages", () => {
    const problems: string[] = [];
    for (const f of files(SRC)) {
      if (/\.test\.tsx?$/.test(f)) continue;
      const from = stageOf(f);
      for (const spec of importsOf(f)) {
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
