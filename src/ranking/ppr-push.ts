/**
 * Personalized PageRank by forward push (local approximation)
 * ===========================================================
 *
 * Keeps a reserve p (settled mass) and a residual r (mass still to spread), starting from
 * p = 0, r = s. Pushing node u moves α·r(u) into p(u) and spreads (1 − α)·r(u) over u's
 * walk transitions (transition.ts; a dangling u sends it to the seeds), then sets r(u) = 0.
 * Nodes are pushed in FIFO order while r(u) > ε·μ(u), where μ(u) = deg(u)^(−β)·W(u) is the
 * walk's reversible measure at unit relation weights (μ(u) = deg(u) for the plain walk, as
 * in the paper; a dangling node counts μ = 1). Only touched nodes are stored; work does not depend on the graph's size.
 *
 * Invariant (exact at every step): π = p + Σ_u r(u)·π_u, where π_u is the walk's
 * personalized PageRank restarting at u (dangling mass to the original seeds). Hence
 * - L1 bound, always:  0 ≤ π(v) − p(v)  and  Σ_v (π(v) − p(v)) = Σ_u r(u)  (`residualSum`);
 * - per-node bound, for unit relation weights and no dangling node reached (the walk is then
 *   reversible with measure μ):  π(v) − p(v) ≤ ε·μ(v)  once no node exceeds its threshold
 *   (ACL's bound π(v) − p(v) ≤ ε·deg(v) at β = 0).
 * A work budget (`maxWork`, adjacency entries touched) bounds the cost at hubs; when it is
 * reached the result says so (`complete: false`) and only the L1 identity holds.
 *
 * [Reference]: Andersen, Chung & Lang, "Local graph partitioning using PageRank vectors",
 * FOCS 2006 (the push operation and its ε·deg bound). Difference: non-lazy push
 * (Berkhin 2006's variant, common practice), the hub-damped relation-weighted walk, and
 * dangling mass back to the seeds.
 */
import type { RelationIndex } from "./relation-index.js";
import type { Csr } from "./relation-index.js";
import { Walk } from "./transition.js";
import { grown } from "./stamped.js";
import { checkAlpha, checkPositive, normaliseSeeds, PPR_DEFAULTS, type PprOptions, type Seed, type SparseScores } from "./ppr-options.js";

/** Defaults of {@link pprPush}. */
export const DEFAULTS = Object.freeze({
  alpha: PPR_DEFAULTS.alpha,
  /** ε: push while r(u) > ε·μ(u). */
  tolerance: 1e-6,
  /** Budget of adjacency entries touched by pushes (bounded work per query). */
  maxWork: 50_000_000,
});

/** Options of {@link pprPush}; all optional. */
export interface PushOptions extends PprOptions {
  /** Budget of adjacency entries touched. @default 50,000,000 */
  readonly maxWork?: number;
}

/** What {@link pprPush} returns. */
export interface PushResult {
  /** Reserve p: a lower bound of π, sparse, nodes ascending. */
  readonly reserve: SparseScores;
  /** Residual r (mass not yet spread), sparse, nodes ascending. */
  readonly residual: SparseScores;
  /** Σ r(u) = ‖π − p‖₁ exactly. */
  readonly residualSum: number;
  /** Pushes performed. */
  readonly pushes: number;
  /** Adjacency entries touched. */
  readonly work: number;
  /** False when the work budget stopped the push before every residual was below its threshold. */
  readonly complete: boolean;
}

/**
 * Dense scratch arrays reused across queries on one index (single-threaded). `q` holds the
 * residual in units of the node's measure, q(v) = r(v)/μ(v), so the push threshold is q > ε.
 * @internal
 */
export class Workspace {
  readonly p: Float64Array;
  readonly q: Float64Array;
  readonly mark: Uint8Array;
  readonly queue: Int32Array;
  /** Nodes whose p or q may be non-zero (may hold duplicates). */
  touched: Int32Array;
  touchedCount = 0;
  /** Nodes whose p is non-zero, each once, in the order p became non-zero (pushes and walk ends). */
  settled: Int32Array;
  settledCount = 0;
  constructor(n: number) {
    this.p = new Float64Array(n);
    this.q = new Float64Array(n);
    this.mark = new Uint8Array(n);
    this.queue = new Int32Array(Math.max(1, n));
    this.touched = new Int32Array(1024);
    this.settled = new Int32Array(1024);
  }
  /** Records that p(v) became non-zero. */
  settle(v: number): void {
    if (this.settledCount === this.settled.length) this.settled = grown(this.settled);
    this.settled[this.settledCount++] = v;
  }
  /** The nodes with a non-zero p, ascending (sorting the settled list, not the touched set). */
  settledNodes(): Int32Array {
    return this.settled.slice(0, this.settledCount).sort();
  }
  touch(v: number): void {
    if (this.touchedCount === this.touched.length) this.touched = grown(this.touched);
    this.touched[this.touchedCount++] = v;
  }
  /** Clears every touched entry (cost proportional to the touched set). */
  reset(): void {
    for (let i = 0; i < this.touchedCount; i++) {
      const v = this.touched[i]!;
      this.p[v] = 0;
      this.q[v] = 0;
    }
    this.touchedCount = 0;
    this.settledCount = 0;
  }
  /** The distinct touched nodes, ascending. */
  distinctTouched(): Int32Array {
    const n = this.p.length;
    if (this.touchedCount * 8 > n) {
      let k = 0;
      for (let i = 0; i < this.touchedCount; i++) this.mark[this.touched[i]!] = 1;
      for (let v = 0; v < n; v++) if (this.mark[v] === 1) k++;
      const out = new Int32Array(k);
      k = 0;
      for (let v = 0; v < n; v++)
        if (this.mark[v] === 1) {
          out[k++] = v;
          this.mark[v] = 0;
        }
      return out;
    }
    const list = this.touched.slice(0, this.touchedCount).sort();
    let k = 0;
    for (let i = 0; i < list.length; i++) if (i === 0 || list[i] !== list[i - 1]) list[k++] = list[i]!;
    return list.subarray(0, k);
  }
}

const workspaces = new WeakMap<Csr, Workspace>();

/** The index's reusable workspace, reset. @internal */
export function workspaceFor(c: Csr): Workspace {
  let ws = workspaces.get(c);
  if (!ws) {
    ws = new Workspace(c.nodeCount);
    workspaces.set(c, ws);
  }
  ws.reset();
  return ws;
}

/**
 * Runs forward push into `ws` (which must be reset). Returns pushes, work and completeness.
 * A node is in the FIFO queue exactly while q(v) > ε (it is queued when q crosses ε).
 * @internal shared by pprPush and pprFast
 */
export function pushInto(
  walk: Walk,
  seedNodes: Int32Array,
  seedWeights: Float64Array,
  alpha: number,
  epsilon: number,
  maxWork: number,
  ws: Workspace,
): { pushes: number; work: number; complete: boolean } {
  const c = walk.csr;
  const { p, q, queue } = ws;
  const mu = walk.measure;
  const n = c.nodeCount;
  const follow = 1 - alpha;
  let head = 0;
  let tail = 0;
  let size = 0;
  // (no closures over head/tail/size: V8 would move them into a heap context in the hot loop)
  for (let i = 0; i < seedNodes.length; i++) {
    const v = seedNodes[i]!;
    const old = q[v]!;
    if (old === 0) ws.touch(v);
    const nv = old + seedWeights[i]! / mu[v]!;
    q[v] = nv;
    if (old <= epsilon && nv > epsilon) {
      queue[tail] = v;
      tail = tail + 1 === n ? 0 : tail + 1;
      size++;
    }
  }
  let pushes = 0;
  let work = 0;
  let complete = true;
  const offsets = c.offsets;
  const targets = c.targets;
  const links = c.links;
  const scaled = walk.scaledEntries();
  const rho = walk.rho;
  while (size > 0) {
    const u = queue[head]!;
    const start = offsets[u]!;
    const end = offsets[u + 1]!;
    if (work + (end - start) > maxWork && pushes > 0) {
      complete = false;
      break;
    }
    head = head + 1 === n ? 0 : head + 1;
    size--;
    const ru = q[u]! * mu[u]!;
    pushes++;
    work += end - start;
    if (p[u] === 0) ws.settle(u);
    p[u]! += alpha * ru;
    q[u] = 0;
    const total = start === end ? 0 : walk.rowTotal(u);
    if (!(total > 0)) {
      // dangling: the followed mass goes back to the seeds
      for (let i = 0; i < seedNodes.length; i++) {
        const v = seedNodes[i]!;
        const old = q[v]!;
        if (old === 0) ws.touch(v);
        const nv = old + (follow * ru * seedWeights[i]!) / mu[v]!;
        q[v] = nv;
        if (old <= epsilon && nv > epsilon) {
          queue[tail] = v;
          tail = tail + 1 === n ? 0 : tail + 1;
          size++;
        }
      }
      continue;
    }
    const f = (follow * ru) / total;
    if (rho === null) {
      for (let e = start; e < end; e++) {
        const v = targets[e]!;
        const old = q[v]!;
        const nv = old + f * scaled[e]!;
        q[v] = nv;
        if (old <= epsilon) {
          if (old === 0) ws.touch(v);
          if (nv > epsilon) {
            queue[tail] = v;
            tail = tail + 1 === n ? 0 : tail + 1;
            size++;
          }
        }
      }
    } else {
      for (let e = start; e < end; e++) {
        const add = f * rho[links[e]! >>> 1]! * scaled[e]!;
        if (add === 0) continue;
        const v = targets[e]!;
        const old = q[v]!;
        const nv = old + add;
        q[v] = nv;
        if (old <= epsilon) {
          if (old === 0) ws.touch(v);
          if (nv > epsilon) {
            queue[tail] = v;
            tail = tail + 1 === n ? 0 : tail + 1;
            size++;
          }
        }
      }
    }
  }
  if (size > 0) complete = false;
  return { pushes, work, complete };
}

/** Collects `values[v]·scale(v)` at the distinct touched nodes into sorted sparse form. @internal */
export function collect(nodes: Int32Array, values: Float64Array, scale?: Float64Array): SparseScores {
  let k = 0;
  for (let i = 0; i < nodes.length; i++) if (values[nodes[i]!]! !== 0) k++;
  const out = new Int32Array(k);
  const scores = new Float64Array(k);
  k = 0;
  for (let i = 0; i < nodes.length; i++) {
    const v = nodes[i]!;
    const x = values[v]!;
    if (x !== 0) {
      out[k] = v;
      scores[k++] = scale ? x * scale[v]! : x;
    }
  }
  return { nodes: out, scores };
}

const WHERE = "ranking/ppr-push";

/**
 * Forward push from `seeds`: a lower bound p of personalized PageRank with the exact L1
 * error (`residualSum`) and the residual itself. RangeError on bad arguments.
 */
export function pprPush(index: RelationIndex, seeds: readonly Seed[], options: PushOptions = {}): PushResult {
  const alpha = checkAlpha(WHERE, options.alpha ?? DEFAULTS.alpha);
  const epsilon = checkPositive(WHERE, "tolerance", options.tolerance ?? DEFAULTS.tolerance);
  const maxWork = checkPositive(WHERE, "maxWork", options.maxWork ?? DEFAULTS.maxWork);
  const s = normaliseSeeds(WHERE, index, seeds);
  const walk = new Walk(index, options);
  const ws = workspaceFor(walk.csr);
  try {
    const stats = pushInto(walk, s.nodes, s.weights, alpha, epsilon, maxWork, ws);
    const nodes = ws.distinctTouched();
    const residual = collect(nodes, ws.q, walk.measure);
    let residualSum = 0;
    for (let i = 0; i < residual.scores.length; i++) residualSum += residual.scores[i]!;
    return { reserve: collect(nodes, ws.p), residual, residualSum, ...stats };
  } finally {
    ws.reset();
  }
}
