/**
 * End-of-load check of the names a load introduced. A type or relation that is new in this
 * load, has no label, is never declared and is used by only a few rows is most likely a
 * misspelt id (`t:Surveyr` for `t:Surveyor`, `workAt` for `worksAt`): it is reported as a
 * warning at the line of its first use, with the nearest other id of its kind by Levenshtein
 * distance (V. I. Levenshtein 1966, "Binary codes capable of correcting deletions, insertions
 * and reversals", Soviet Physics Doklady 10(8); computed by fastest-levenshtein) as "did you
 * mean". A new relation without a label that is used more widely is reported as unlabelled:
 * questions can name it only by its id's last segment.
 */
import { distance } from "fastest-levenshtein";
import { labelFromId } from "../store.js";
import type { LoadContext, PendingWarning } from "./context.js";
import { readBlocks } from "./lines.js";

/** Thresholds of the check; all optional. */
export const DEFAULTS = {
  /** A new, undeclared, unlabelled type or relation used by at most this many rows is reported as a possible typo. */
  fewUses: 2,
  /** Largest edit distance of a "did you mean" suggestion (also at most a quarter of the id's last segment, at least 1). */
  maxEdits: 2,
};

const plural = (n: number, word: string): string => `${n.toLocaleString("en-US")} ${word}${n === 1 ? "" : "s"}`;

/** The last segment of an id (after its last `/`, `#` or `:`), whose length bounds the edits allowed. */
function lastSegment(id: string): string {
  const m = /([^/#:]*)[/#]?$/.exec(id);
  return m && m[1] ? m[1] : id;
}

/** The candidate nearest to `id` within the edit limit (ties: the smaller id), or undefined. */
export function nearestId(id: string, candidates: Iterable<string>, maxEdits = DEFAULTS.maxEdits): string | undefined {
  const limit = Math.min(maxEdits, Math.max(1, Math.floor(lastSegment(id).length / 4)));
  let best: string | undefined;
  let bestD = limit + 1;
  for (const c of candidates) {
    if (c === id || Math.abs(c.length - id.length) > limit) continue;
    const d = distance(id, c);
    if (d < bestD || (d === bestD && best !== undefined && c < best)) {
      best = c;
      bestD = d;
    }
  }
  return best;
}

/** Adds the warnings about the types and relations this load introduced (after `finishLoad`). */
export function checkNames(ctx: LoadContext): void {
  const w = ctx.writer;
  w.flush();
  const db = w.catalog.db;
  const fewUses = DEFAULTS.fewUses;
  const predRow = db.prepare("SELECT id, label FROM predicate WHERE num = ?");
  const entRow = db.prepare("SELECT id, label FROM entity WHERE num = ?");

  const rareRelations: { id: string; uses: number }[] = [];
  for (const [num, uses] of w.relationUses()) {
    if (!w.isNewPredicate(num)) continue;
    const r = predRow.get(num) as { id: string; label: string | null } | undefined;
    if (r === undefined || r.label !== null) continue;
    if (uses <= fewUses && !ctx.declaredPredicates.has(r.id)) rareRelations.push({ id: r.id, uses });
    else warnAt(ctx, "relation", r.id, "unlabelled relation", `relation ${JSON.stringify(r.id)} has no label (used by ${plural(uses, "edge")}); questions can name it only as "${labelFromId(r.id)}"`);
  }
  if (rareRelations.length > 0) {
    const rare = new Set(rareRelations.map((r) => r.id));
    const others = (db.prepare("SELECT id FROM predicate").pluck().all() as string[]).filter((id) => !rare.has(id));
    for (const r of rareRelations) {
      const near = nearestId(r.id, others);
      warnAt(ctx, "relation", r.id, "undeclared relation", `relation ${JSON.stringify(r.id)} is not declared and has no label (used by ${plural(r.uses, "edge")})${near ? `; did you mean ${JSON.stringify(near)}?` : ""}`);
    }
  }

  const rareTypes: { id: string; uses: number }[] = [];
  for (const [num, uses] of w.typeUses()) {
    if (uses > fewUses || !w.isNewEntity(num)) continue;
    const r = entRow.get(num) as { id: string; label: string | null } | undefined;
    if (r === undefined || r.label !== null || ctx.isDeclared(r.id)) continue;
    rareTypes.push({ id: r.id, uses });
  }
  if (rareTypes.length > 0) {
    const rare = new Set(rareTypes.map((r) => r.id));
    const others = (
      db.prepare("SELECT id FROM entity WHERE num IN (SELECT type FROM entity_type UNION SELECT sub FROM subclass UNION SELECT sup FROM subclass)").pluck().all() as string[]
    ).filter((id) => !rare.has(id));
    for (const t of rareTypes) {
      const near = nearestId(t.id, others);
      warnAt(ctx, "type", t.id, "undeclared type", `type ${JSON.stringify(t.id)} is not declared and has no label (used by ${plural(t.uses, "row")})${near ? `; did you mean ${JSON.stringify(near)}?` : ""}`);
    }
  }
}

function warnAt(ctx: LoadContext, kind: "type" | "relation", id: string, warning: PendingWarning["kind"], message: string): void {
  const at = ctx.firstUse.get(`${kind}\0${id}`) ?? { file: ctx.progressBase.file, line: 0 };
  ctx.warn(warning, message, id, at);
}

/**
 * Finds the lines of warnings whose reader did not track lines (the quick N-Triples pass):
 * the first line of the file that holds the id as N-Triples writes it (`<IRI>`, `_:label`);
 * line 1 when it is not found. One pass over each file concerned.
 */
export function locateWarnings(warnings: PendingWarning[]): void {
  const byFile = new Map<string, PendingWarning[]>();
  for (const x of warnings) {
    if (x.line > 0) continue;
    if (x.id === undefined || x.file === "") {
      x.line = 1;
      continue;
    }
    const list = byFile.get(x.file) ?? [];
    list.push(x);
    byFile.set(x.file, list);
  }
  for (const [file, list] of byFile) {
    const needles = new Map<string, number>();
    for (const x of list) needles.set(x.id!.startsWith("_:") ? x.id! : `<${x.id!}>`, 0);
    let open = needles.size;
    try {
      readBlocks(
        file,
        (block) => {
          if (open === 0) return;
          for (const [needle, line] of needles) {
            if (line > 0) continue;
            const at = block.text.indexOf(needle);
            if (at < 0) continue;
            let n = block.firstLine;
            for (let i = block.text.indexOf("\n"); i >= 0 && i < at; i = block.text.indexOf("\n", i + 1)) n++;
            needles.set(needle, n);
            open--;
          }
        },
        () => undefined,
      );
    } catch {
      // the file went away since it was read: line 1 below
    }
    for (const x of list) x.line = needles.get(x.id!.startsWith("_:") ? x.id! : `<${x.id!}>`) || 1;
  }
}
