/**
 * The outside reference of the PageRank benchmark: python3-igraph's exact personalized
 * PageRank (PRPACK solver) on the same graph, transition weights and seeds.
 *
 * Same transition matrix: the bench writes every adjacency entry of the relation index as a
 * directed arc u → v (both directions of each stored edge), with weight w = ρ[r]·deg(v)^(−β)
 * exactly as transition.ts defines it (ρ = 1 here); igraph normalises the weights per row,
 * as our walk does. igraph's damping = 1 − α. Nodes without arcs are never reached from the
 * seeds, so dangling handling cannot differ.
 *
 * Install: `apt-get install python3-igraph` (Debian/Ubuntu) or `pip install igraph`.
 */
import { spawnSync } from "node:child_process";

/** The Python program (kept here so dist/ is self-contained). */
export const IGRAPH_SCRIPT = String.raw`
import sys, json, time, array
import igraph as ig
edges_path, weights_path, queries_path, out_path = sys.argv[1:5]
spec = json.load(open(queries_path))
n = spec["nodeCount"]; damping = 1.0 - spec["alpha"]; top = spec["top"]
t0 = time.perf_counter()
g = ig.Graph.Read_Edgelist(edges_path, directed=True)
if g.vcount() < n:
    g.add_vertices(n - g.vcount())
w = array.array("d")
with open(weights_path, "rb") as f:
    w.frombytes(f.read())
g.es["w"] = w.tolist()
load_seconds = time.perf_counter() - t0
results = []
for q in spec["queries"]:
    reset = [0.0] * g.vcount()
    for node, weight in q:
        reset[node] += weight
    t = time.perf_counter()
    pr = g.personalized_pagerank(vertices=None, directed=True, damping=damping, reset=reset, weights="w", implementation="prpack")
    dt = time.perf_counter() - t
    seeds = set(node for node, _ in q)
    order = sorted((v for v in range(len(pr)) if v not in seeds and pr[v] > 0), key=lambda v: (-pr[v], v))[:top]
    results.append({"seconds": dt, "top": [[v, pr[v]] for v in order]})
json.dump({"version": ig.__version__, "loadSeconds": load_seconds, "results": results}, open(out_path, "w"))
`;

/** A Python interpreter that imports igraph, with the igraph version; null when there is none. */
export function findIgraph(): { python: string; version: string } | null {
  // $TIEPOINT_PYTHON first; then python3 on PATH; then the system one that Debian's package serves
  const candidates = [process.env.TIEPOINT_PYTHON, "python3", "/usr/bin/python3"].filter((x): x is string => typeof x === "string" && x !== "");
  for (const python of candidates) {
    const r = spawnSync(python, ["-c", "import igraph; print(igraph.__version__)"], { encoding: "utf8", timeout: 60_000 });
    if (r.status === 0 && r.stdout.trim() !== "") return { python, version: r.stdout.trim() };
  }
  return null;
}
