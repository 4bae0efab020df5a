/**
 * A relation path as display segments: `A —relation→ B ←relation— C`, where `—r→` walks a
 * stored triple forwards and `←r—` walks it backwards (the contract's `inverse: true`).
 */
import type { AnswerPath } from "../../model/index.js";

/** One segment of a shown path. */
export type PathSegment =
  | { readonly kind: "entity"; readonly id: string; readonly text: string }
  | { readonly kind: "edge"; readonly text: string };

/** The path as segments, labels looked up in `labels` (ids shown when a label is missing). */
export function pathSegments(path: AnswerPath, labels: Readonly<Record<string, string>>): PathSegment[] {
  const name = (id: string) => labels[id] ?? id;
  const out: PathSegment[] = [{ kind: "entity", id: path.from, text: name(path.from) }];
  for (const st of path.steps) {
    const rel = name(st.relation);
    out.push({ kind: "edge", text: st.inverse ? ` ←${rel}— ` : ` —${rel}→ ` });
    out.push({ kind: "entity", id: st.to, text: name(st.to) });
  }
  return out;
}
