/**
 * Yen's k shortest loopless paths
 * ================================
 *
 * The k cheapest simple (loopless) paths between two nodes of a directed, non-negatively
 * weighted graphology graph, cheapest first. Each round takes the last accepted path, and for
 * every node on it (the spur node) searches a cheapest spur path to the target while the
 * root path's nodes and the edges already used by accepted paths sharing that root are
 * blocked; the cheapest candidate becomes the next path.
 *
 * [Reference]
 * Jin Y. Yen, "Finding the K Shortest Loopless Paths in a Network", Management Science
 * 17(11):712–716, 1971.
 *
 * Spur searches use graphology-shortest-path's bidirectional Dijkstra. Instead of deleting
 * nodes and edges (and restoring them), blocked edges get an infinite weight through the
 * weight getter; a spur path whose cost comes out infinite is discarded. Ties between
 * candidates of equal cost are broken by the node sequence (lexicographic), so the output is
 * deterministic.
 *
 * `yenOnArcs` is the same algorithm on a compact CSR graph (the evidence subgraph of one
 * question), with the spur searches done by dijkstra.ts; the query path uses it.
 */
import { createRequire } from "node:module";
import type { DirectedGraph } from "graphology";
import type dijkstraModule from "graphology-shortest-path/dijkstra.js";
import { DijkstraScratch, type ArcGraph } from "./dijkstra.js";

/** Options of {@link yenKShortestPaths}; all optional. */
export interface YenOptions {
  /** How many paths to return at most. @default 3 */
  readonly k?: number;
  /** The edge attribute holding the (non-negative) weight. @default "cost" */
  readonly weight?: string;
}

/** The defaults of {@link YenOptions}. */
export const DEFAULTS = { k: 3, weight: "cost" } as const;

/** A node path with its total weight. */
export interface WeightedPath {
  /** Node keys from source to target. */
  readonly nodes: readonly string[];
  /** Sum of the edge weights. */
  readonly cost: number;
}

function pathCost(graph: DirectedGraph, nodes: readonly string[], weight: string, blocked?: ReadonlySet<string>): number {
  let c = 0;
  for (let i = 0; i + 1 < nodes.length; i++) {
    const e = graph.edge(nodes[i]!, nodes[i + 1]!);
    if (e === undefined || blocked?.has(e)) return Infinity;
    c += Number(graph.getEdgeAttribute(e, weight));
  }
  return c;
}

function compareCandidates(a: WeightedPath, b: WeightedPath): number {
  if (a.cost !== b.cost) return a.cost - b.cost;
  const n = Math.min(a.nodes.length, b.nodes.length);
  for (let i = 0; i < n; i++) {
    if (a.nodes[i] !== b.nodes[i]) return a.nodes[i]! < b.nodes[i]! ? -1 : 1;
  }
  return a.nodes.length - b.nodes.length;
}

/**
 * graphology-shortest-path's Dijkstra, loaded on first use: only this reference version over
 * a graphology graph needs it, not the questions' path search ({@link yenOnArcs}), so a
 * process that answers questions does not load it.
 */
function graphologyDijkstra(): typeof dijkstraModule {
  return createRequire(import.meta.url)("graphology-shortest-path/dijkstra.js") as typeof dijkstraModule;
}

/**
 * Up to `k` cheapest loopless paths from `source` to `target`, cheapest first.
 * Returns `[]` when the target is unreachable; `[[source]]` (cost 0) when source = target.
 * @throws RangeError when a node is missing, `k` is not a positive integer, or a weight is negative.
 */
export function yenKShortestPaths(graph: DirectedGraph, source: string, target: string, options: YenOptions = {}): WeightedPath[] {
  const k = options.k ?? DEFAULTS.k;
  const weight = options.weight ?? DEFAULTS.weight;
  if (!Number.isInteger(k) || k < 1) throw new RangeError(`explain/yen: k must be a positive integer, got ${k}`);
  if (!graph.hasNode(source)) throw new RangeError(`explain/yen: source node "${source}" is not in the graph`);
  if (!graph.hasNode(target)) throw new RangeError(`explain/yen: target node "${target}" is not in the graph`);
  if (source === target) return [{ nodes: [source], cost: 0 }];

  const blockedEdges = new Set<string>();
  const blockedNodes = new Set<string>();
  const getter = (edge: string, attrs: Record<string, unknown>): number => {
    const w = Number(attrs[weight]);
    if (!(w >= 0)) throw new RangeError(`explain/yen: edge ${edge} has weight ${String(attrs[weight])}; weights must be non-negative numbers`);
    if (blockedEdges.has(edge)) return Infinity;
    if (blockedNodes.size > 0 && (blockedNodes.has(graph.source(edge)) || blockedNodes.has(graph.target(edge)))) return Infinity;
    return w;
  };
  const dijkstra = graphologyDijkstra();
  const search = (from: string): string[] | null => dijkstra.bidirectional(graph, from, target, getter as never) as string[] | null;

  const first = search(source);
  if (!first) return [];
  const firstCost = pathCost(graph, first, weight);
  if (!Number.isFinite(firstCost)) return [];
  const accepted: WeightedPath[] = [{ nodes: first, cost: firstCost }];
  const candidates: WeightedPath[] = [];
  const seen = new Set<string>([first.join("\u0000")]);

  while (accepted.length < k) {
    const prev = accepted[accepted.length - 1]!.nodes;
    for (let i = 0; i + 1 < prev.length; i++) {
      const spur = prev[i]!;
      const root = prev.slice(0, i + 1);
      blockedEdges.clear();
      blockedNodes.clear();
      for (const p of accepted) {
        if (p.nodes.length > i + 1 && root.every((n, j) => p.nodes[j] === n)) {
          const e = graph.edge(p.nodes[i]!, p.nodes[i + 1]!);
          if (e !== undefined) blockedEdges.add(e);
        }
      }
      for (let j = 0; j < i; j++) blockedNodes.add(root[j]!);
      const spurPath = search(spur);
      if (!spurPath) continue;
      const spurCost = pathCost(graph, spurPath, weight, blockedEdges);
      if (!Number.isFinite(spurCost) || spurPath.some((n) => blockedNodes.has(n))) continue;
      const nodes = [...root.slice(0, -1), ...spurPath];
      const key = nodes.join("\u0000");
      if (seen.has(key)) continue;
      seen.add(key);
      candidates.push({ nodes, cost: pathCost(graph, root, weight) + spurCost });
    }
    blockedEdges.clear();
    blockedNodes.clear();
    if (candidates.length === 0) break;
    candidates.sort(compareCandidates);
    accepted.push(candidates.shift()!);
  }
  return accepted;
}

/** A path of an {@link ArcGraph}: its nodes, its arcs and their total cost. */
export interface ArcPath {
  readonly nodes: readonly number[];
  readonly arcs: readonly number[];
  readonly cost: number;
}

/**
 * Yen's algorithm (as above) on a compact CSR graph with this file's own Dijkstra
 * (dijkstra.ts) for the spur searches; blocked nodes and arcs are skipped by the search.
 * Candidates of equal cost are ordered by `keyOf` of their nodes (lexicographic), then by
 * length. Returns up to `k` loopless paths `source → target`, cheapest first.
 */
export function yenOnArcs(g: ArcGraph, source: number, target: number, k: number, keyOf: (u: number) => string, scratch?: DijkstraScratch): ArcPath[] {
  if (!Number.isInteger(k) || k < 1) throw new RangeError(`explain/yen: k must be a positive integer, got ${k}`);
  if (source === target) return [{ nodes: [source], arcs: [], cost: 0 }];
  const s = scratch !== undefined && scratch.g === g ? scratch : new DijkstraScratch(g);
  const toPath = (from: number, arcs: readonly number[]): ArcPath => {
    const nodes = [from];
    let cost = 0;
    for (const e of arcs) {
      nodes.push(g.heads[e]!);
      cost += g.costs[e]!;
    }
    return { nodes, arcs, cost };
  };
  s.search(source, target);
  const firstArcs = s.arcsTo(source, target);
  if (firstArcs === null) return [];
  const accepted: ArcPath[] = [toPath(source, firstArcs)];
  const candidates: ArcPath[] = [];
  const seen = new Set<string>([accepted[0]!.nodes.join(",")]);
  const compare = (a: ArcPath, b: ArcPath): number => {
    if (a.cost !== b.cost) return a.cost - b.cost;
    const n = Math.min(a.nodes.length, b.nodes.length);
    for (let i = 0; i < n; i++) {
      if (a.nodes[i] !== b.nodes[i]) return keyOf(a.nodes[i]!) < keyOf(b.nodes[i]!) ? -1 : 1;
    }
    return a.nodes.length - b.nodes.length;
  };
  while (accepted.length < k) {
    const prev = accepted[accepted.length - 1]!;
    for (let i = 0; i + 1 < prev.nodes.length; i++) {
      const spur = prev.nodes[i]!;
      // blocked for this spur search: the arcs leaving the spur node on accepted paths with
      // the same root, and the root's nodes before the spur node
      s.block();
      for (const p of accepted) {
        let sameRoot = p.nodes.length > i + 1;
        for (let j = 0; j <= i && sameRoot; j++) sameRoot = p.nodes[j] === prev.nodes[j];
        if (sameRoot) s.blockArc(p.arcs[i]!);
      }
      for (let j = 0; j < i; j++) s.blockNode(prev.nodes[j]!);
      s.search(spur, target, true);
      const spurArcs = s.arcsTo(spur, target);
      if (spurArcs === null) continue;
      const rootArcs = prev.arcs.slice(0, i);
      let rootCost = 0;
      for (const e of rootArcs) rootCost += g.costs[e]!;
      const spurPath = toPath(spur, spurArcs);
      const nodes = [...prev.nodes.slice(0, i), ...spurPath.nodes];
      const key = nodes.join(",");
      if (seen.has(key)) continue;
      seen.add(key);
      candidates.push({ nodes, arcs: [...rootArcs, ...spurArcs], cost: rootCost + spurPath.cost });
    }
    if (candidates.length === 0) break;
    candidates.sort(compare);
    accepted.push(candidates.shift()!);
  }
  return accepted;
}
