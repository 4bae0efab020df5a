/**
 * DOT → SVG with Graphviz compiled to WebAssembly (@viz-js/viz, the `dot` layered layout engine).
 *
 * [Reference] Gansner, Koutsofios, North, Vo, "A Technique for Drawing Directed Graphs",
 * IEEE TSE 19(3), 1993 (the `dot` engine); https://github.com/mdaines/viz-js (the wasm build).
 *
 * tiepoint writes the graph (src/present/dot.ts); Graphviz lays it out. The SVG is stripped of
 * its XML prolog and doctype so it can be inlined in an HTML page. The wasm module (1.2 MB of
 * JavaScript) is imported on the first drawing, not with the program, and reused for every
 * drawing after it.
 */
import type { Viz } from "@viz-js/viz";
import { TiepointError } from "../model/index.js";

/** Options of {@link dotToSvg}; all optional. */
export interface SvgOptions {
  /** Graphviz layout engine. @default "dot" */
  readonly engine?: string;
}

/** Defaults of {@link SvgOptions}. */
export const SVG_DEFAULTS = { engine: "dot" } as const;

/** A node or edge of a parsed DOT graph with its attributes (as Graphviz read them). */
export interface ParsedDotNode {
  readonly name: string;
  readonly attributes: Readonly<Record<string, string>>;
}

/** An edge of a parsed DOT graph: tail and head node names, and attributes. */
export interface ParsedDotEdge {
  readonly tail: string;
  readonly head: string;
  readonly attributes: Readonly<Record<string, string>>;
}

/** A DOT graph as Graphviz parsed it. */
export interface ParsedDot {
  readonly name: string;
  readonly directed: boolean;
  readonly nodes: readonly ParsedDotNode[];
  readonly edges: readonly ParsedDotEdge[];
}

let vizPromise: Promise<Viz> | undefined;

/** The shared Graphviz instance (loaded on first use). */
function viz(): Promise<Viz> {
  vizPromise ??= import("@viz-js/viz").then((m) => m.instance());
  return vizPromise;
}

function render(v: Viz, dot: string, format: string, engine: string): string {
  const r = v.render(dot, { format, engine });
  if (r.status !== "success") {
    const why = r.errors.filter((e) => e.level !== "warning").map((e) => e.message).join("; ") || "unknown error";
    throw new TiepointError("present/graphviz", `graph drawing failed: ${why}`);
  }
  return r.output;
}

/** Renders DOT to an SVG fragment ready to inline in HTML (no prolog, no doctype, no comments). */
export async function dotToSvg(dot: string, options: SvgOptions = {}): Promise<string> {
  const svg = render(await viz(), dot, "svg", options.engine ?? SVG_DEFAULTS.engine);
  return svg
    .replace(/<\?xml[^>]*\?>\s*/g, "")
    .replace(/<!DOCTYPE[^>]*>\s*/gi, "")
    .replace(/<!--[\s\S]*?-->\s*/g, "")
    .trim();
}

/** Renders many DOT graphs with one Graphviz instance (in order). */
export async function dotsToSvg(dots: readonly string[], options: SvgOptions = {}): Promise<string[]> {
  const out: string[] = [];
  for (const d of dots) out.push(await dotToSvg(d, options));
  return out;
}

/**
 * Parses DOT with Graphviz itself (its JSON output format) and returns nodes and edges with
 * their attributes. Throws a `present/graphviz` TiepointError when Graphviz rejects the text.
 */
export async function parseDot(dot: string): Promise<ParsedDot> {
  const text = render(await viz(), dot, "json0", "dot");
  const doc = JSON.parse(text) as {
    name: string;
    directed: boolean;
    objects?: ({ _gvid: number; name: string } & Record<string, unknown>)[];
    edges?: ({ tail: number; head: number } & Record<string, unknown>)[];
  };
  const attrs = (o: Record<string, unknown>): Record<string, string> => {
    const a: Record<string, string> = {};
    for (const [k, v] of Object.entries(o)) if (!k.startsWith("_") && typeof v === "string") a[k] = v;
    return a;
  };
  const objects = doc.objects ?? [];
  const byGvid = new Map(objects.map((o) => [o._gvid, o.name]));
  return {
    name: doc.name,
    directed: doc.directed,
    nodes: objects.map((o) => ({ name: o.name, attributes: attrs(o) })),
    edges: (doc.edges ?? []).map((e) => ({ tail: byGvid.get(e.tail)!, head: byGvid.get(e.head)!, attributes: attrs(e) })),
  };
}
