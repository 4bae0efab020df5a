/**
 * Evidence graph as Graphviz DOT: the clue entities of one question, its best answer, the
 * rival answers and every entity on their explaining paths, with each walked relation drawn
 * once in its stored direction and labelled.
 *
 * [Reference] The DOT language, https://graphviz.org/doc/info/lang.html (quoted strings:
 * only `\"` is an escape for the parser) and escString, https://graphviz.org/docs/attr-types/escString/
 * (in labels and tooltips a backslash starts `\n`, `\N`, `\l` …, so a literal one is `\\`).
 *
 * Layout is left to Graphviz (the `dot` engine, left to right); tiepoint only writes the graph.
 * Node names are synthetic (`n0`, `n1`, …, deterministic order); the entity id sits in the
 * node's `entity` attribute and the relation id in the edge's `relation` attribute, written
 * with `"` and `\` backslash-escaped (read them back with {@link dotUnescape}).
 * The edge set is exactly the set of stored triples walked by the drawn answers' paths.
 */
import type { AskResult, EntityRef } from "../model/index.js";
import { labelFromId } from "../catalog/index.js";

/** Options of {@link evidenceDot}; all optional. */
export interface EvidenceDotOptions {
  /** How many answers (best first) to draw with their paths; the rest are left out. @default Infinity */
  readonly answers?: number;
  /** Label lookups for ids the answer document does not label (path entities, relations). */
  readonly labels?: LabelBook;
  /** Graph name and id prefix for node/edge ids in SVG (several drawings share one HTML page). @default "evidence" */
  readonly name?: string;
  /** Wrap node labels longer than this many characters. @default 22 */
  readonly wrap?: number;
}

/** Id → label lookups; each returns undefined when it does not know the id. */
export interface LabelBook {
  /** The label of an entity id. */
  entity(id: string): string | undefined;
  /** The label of a relation id. */
  relation(id: string): string | undefined;
}

/** Defaults of {@link EvidenceDotOptions}. */
export const DOT_DEFAULTS = {
  answers: Number.POSITIVE_INFINITY,
  name: "evidence",
  wrap: 22,
} as const;

/** The role of a node in the evidence graph, which decides its drawing. */
export type EvidenceRole = "clue" | "answer" | "rival" | "path";

/** One node of the evidence graph. */
export interface EvidenceNode {
  /** Synthetic DOT node name (`n0`, …). */
  readonly name: string;
  readonly id: string;
  readonly label: string;
  readonly role: EvidenceRole;
}

/** One stored triple walked by a drawn path. */
export interface EvidenceEdge {
  /** Subject id of the stored triple. */
  readonly subject: string;
  /** Relation id. */
  readonly relation: string;
  /** Object id of the stored triple. */
  readonly object: string;
  readonly label: string;
}

/** The evidence graph of one answer document, before it is written as DOT. */
export interface EvidenceGraph {
  readonly nodes: readonly EvidenceNode[];
  readonly edges: readonly EvidenceEdge[];
}

const ROLE_ORDER: Record<EvidenceRole, number> = { clue: 0, answer: 1, rival: 2, path: 3 };

/** Drawing attributes per role: a palette of our own (warm clues, deep green answer, pale rivals). */
const ROLE_STYLE: Record<EvidenceRole, string> = {
  clue: 'shape=box, style="rounded,filled", fillcolor="#fde7b0", color="#a06a00"',
  answer: 'shape=box, style="rounded,filled,bold", fillcolor="#1f6f5c", fontcolor="#ffffff", color="#12463a", penwidth=2',
  rival: 'shape=box, style="rounded,filled,dashed", fillcolor="#e4ecf7", color="#4f6d95"',
  path: 'shape=ellipse, style="filled", fillcolor="#f3f3f1", color="#8a8a84"',
};

/** A {@link LabelBook} that knows nothing (labels then come from the document or the id). */
export const NO_LABELS: LabelBook = { entity: () => undefined, relation: () => undefined };

/**
 * Builds the evidence graph of an answer document: nodes for the linked clue entities, the
 * drawn answers and every path entity; one edge per distinct stored triple on the drawn paths.
 */
export function evidenceGraph(result: AskResult, options: EvidenceDotOptions = {}): EvidenceGraph {
  const maxAnswers = options.answers ?? DOT_DEFAULTS.answers;
  const book = options.labels ?? NO_LABELS;
  const known = new Map<string, string>();
  const learn = (r: EntityRef) => {
    if (!known.has(r.id)) known.set(r.id, r.label);
  };
  for (const a of result.answers) learn(a);
  for (const m of result.mentions) {
    learn(m.entity);
    for (const alt of m.alternatives) learn(alt);
  }
  const labelOf = (id: string) => known.get(id) ?? book.entity(id) ?? labelFromId(id);

  const roles = new Map<string, EvidenceRole>();
  const setRole = (id: string, role: EvidenceRole) => {
    const old = roles.get(id);
    if (old === undefined || ROLE_ORDER[role] < ROLE_ORDER[old]) roles.set(id, role);
  };
  for (const m of result.mentions) setRole(m.entity.id, "clue");
  const drawn = result.answers.slice(0, Math.max(0, maxAnswers));
  drawn.forEach((a, i) => setRole(a.id, i === 0 ? "answer" : "rival"));

  const edges = new Map<string, EvidenceEdge>();
  for (const a of drawn) {
    for (const p of a.paths) {
      setRole(p.from, "clue");
      for (const s of p.steps) {
        setRole(s.from, "path");
        setRole(s.to, "path");
        const subject = s.inverse ? s.to : s.from;
        const object = s.inverse ? s.from : s.to;
        const key = JSON.stringify([subject, s.relation, object]);
        if (!edges.has(key)) edges.set(key, { subject, relation: s.relation, object, label: book.relation(s.relation) ?? labelFromId(s.relation) });
      }
    }
  }
  // a clue that is also an answer (not expected, but possible) is drawn as the answer
  const ordered = [...roles.entries()].sort((x, y) => ROLE_ORDER[x[1]] - ROLE_ORDER[y[1]] || cmp(x[0], y[0]));
  const nodes = ordered.map(([id, role], i): EvidenceNode => ({ name: `n${i}`, id, label: labelOf(id), role }));
  const edgeList = [...edges.values()].sort((x, y) => cmp(x.subject, y.subject) || cmp(x.relation, y.relation) || cmp(x.object, y.object));
  return { nodes, edges: edgeList };
}

/** Writes an answer document's evidence graph as a DOT digraph (see the file header). */
export function evidenceDot(result: AskResult, options: EvidenceDotOptions = {}): string {
  return graphToDot(evidenceGraph(result, options), options);
}

/** Writes an {@link EvidenceGraph} as DOT. */
export function graphToDot(graph: EvidenceGraph, options: EvidenceDotOptions = {}): string {
  const name = options.name ?? DOT_DEFAULTS.name;
  const wrap = options.wrap ?? DOT_DEFAULTS.wrap;
  const idPrefix = name.replace(/[^A-Za-z0-9_-]/g, "_");
  const nameOf = new Map(graph.nodes.map((n) => [n.id, n.name]));
  const out: string[] = [];
  out.push(`digraph ${quote(name)} {`);
  out.push(`  graph [id=${quote(idPrefix)}, rankdir=LR, nodesep=0.35, ranksep=0.6, bgcolor="transparent", fontname="Helvetica", fontsize=11];`);
  out.push(`  node [fontname="Helvetica", fontsize=11, margin="0.12,0.06"];`);
  out.push(`  edge [fontname="Helvetica", fontsize=9, color="#5b5b57", fontcolor="#3b3b38", arrowsize=0.7];`);
  for (const n of graph.nodes) {
    const label = wrapText(oneLine(n.label), wrap).map(escString).join("\\n");
    out.push(
      `  ${n.name} [id=${quote(`${idPrefix}-${n.name}`)}, label="${label}", tooltip="${escString(oneLine(`${n.label} (${n.id})`))}", entity=${quote(n.id)}, role=${n.role}, ${ROLE_STYLE[n.role]}];`,
    );
  }
  graph.edges.forEach((e, i) => {
    const s = nameOf.get(e.subject)!;
    const o = nameOf.get(e.object)!;
    out.push(`  ${s} -> ${o} [id=${quote(`${idPrefix}-e${i}`)}, label="${escString(oneLine(e.label))}", tooltip="${escString(oneLine(e.relation))}", relation=${quote(e.relation)}];`);
  });
  out.push("}");
  return out.join("\n") + "\n";
}

/** Reads back a quoted DOT attribute value written by this module (turns `\\` into `\`). */
export function dotUnescape(value: string): string {
  return value.replace(/\\\\/g, "\\");
}

/** A DOT quoted string whose parsed value, after {@link dotUnescape}, is `s`. */
function quote(s: string): string {
  return `"${s.replace(/\\/g, "\\\\").replace(/"/g, '\\"').replace(/[\r\n]/g, " ")}"`;
}

/** The inside of a quoted escString that Graphviz displays as `s` (one line). */
function escString(s: string): string {
  return s.replace(/\\/g, "\\\\").replace(/"/g, '\\"');
}

/** Control characters and line breaks become spaces. */
function oneLine(s: string): string {
  return s.replace(/[\u0000-\u001f\u007f\u2028\u2029]+/g, " ").trim();
}

/** Greedy word wrap at `width` characters (a word longer than the width stays whole). */
function wrapText(s: string, width: number): string[] {
  const lines: string[] = [];
  let cur = "";
  for (const w of s.split(/\s+/)) {
    if (cur === "") cur = w;
    else if (cur.length + 1 + w.length <= width) cur += " " + w;
    else {
      lines.push(cur);
      cur = w;
    }
  }
  if (cur !== "" || lines.length === 0) lines.push(cur);
  return lines;
}

function cmp(a: string, b: string): number {
  return a < b ? -1 : a > b ? 1 : 0;
}

/** What {@link catalogLabels} reads from a catalog (a `Catalog` from src/catalog fits). */
export interface LabelSource {
  numOf(id: string): number | undefined;
  ref(num: number): { readonly id: string; readonly label: string };
  predicates(): readonly { readonly id: string; readonly label: string }[];
}

/** A {@link LabelBook} backed by a catalog: relation labels read once, entity labels on demand (cached). */
export function catalogLabels(cat: LabelSource): LabelBook {
  const relations = new Map(cat.predicates().map((p) => [p.id, p.label]));
  const entities = new Map<string, string | undefined>();
  return {
    relation: (id) => relations.get(id),
    entity: (id) => {
      if (!entities.has(id)) {
        const n = cat.numOf(id);
        entities.set(id, n === undefined ? undefined : cat.ref(n).label);
      }
      return entities.get(id);
    },
  };
}
