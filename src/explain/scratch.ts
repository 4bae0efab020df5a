/**
 * Per-graph scratch arrays for the path searches
 * ==============================================
 *
 * Node-indexed stamped arrays (ranking's `Stamped`: valid where the stamp is the current
 * epoch, so clearing is one increment) that the breadth-first searches reuse from question
 * to question instead of allocating hash maps. One set per graph (weakly held), grown on
 * demand; not shared between concurrent searches (the searches are synchronous).
 */
import { stampedFor, type Stamped } from "../ranking/index.js";
import type { WalkGraph } from "./types.js";

export type { Stamped };

/** The `slot`-th scratch array of `graph` (explain uses slots 0–2 for the evidence subgraph, 3–4 for the bidirectional search, 5–6 for pattern matching), reset. */
export function scratch(graph: WalkGraph, slot: number): Stamped {
  return stampedFor(graph, `explain/${slot}`, graph.nodeCount);
}
