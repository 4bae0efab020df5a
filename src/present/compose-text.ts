/**
 * Rendering of `compose`: the text report (each proposal's question, facts, proof and round
 * trip), the JSON document (../shared/contract.md "JSON of compose --json", with the additive
 * fields of README "JSON (additive to ../shared/contract.md)") and the batch TSV
 * (`question<TAB>expected<TAB>verdict`, the layout `check` reads).
 */
import type { ComposedClue, Composition, Proposal } from "../compose/index.js";
import { DISCLAIMER } from "../model/index.js";

/** "82nd percentile" (English ordinal suffixes: common practice). */
function percentile(s: number | undefined): string {
  if (s === undefined) return "";
  const n = Math.round(s * 100);
  const suffix = n % 100 >= 11 && n % 100 <= 13 ? "th" : (["th", "st", "nd", "rd"][n % 10] ?? "th");
  return ` (${n}${suffix} percentile of salience)`;
}

function factLine(c: ComposedClue): string {
  if (c.kind === "type") return `type ${c.entity!.label} [${c.entity!.id}]`;
  if (c.kind === "attribute") return `${c.attribute!.label} [${c.attribute!.id}] = ${c.attribute!.value}`;
  return `${c.path ?? c.entity!.label}${percentile(c.salience)}`;
}

/** One proposal as text lines. */
export function renderProposalText(p: Proposal, n: number): string[] {
  const out: string[] = [];
  out.push(`${n}. ${p.question}`);
  out.push(`   ${p.verified ? "verified" : "NOT verified"}: ${p.verified ? `asked back, the answer comes first and the verdict is unique` : p.reason ?? p.verdict.status}`);
  out.push("   facts:");
  for (const c of p.clues) out.push(`     - ${factLine(c)}`);
  out.push(`   proof: ${p.clues.map((c) => `${c.text} → ${c.candidates}`).join("; ")}`);
  return out;
}

/** The text report of one composition. */
export function renderCompositionText(c: Composition): string {
  const out: string[] = [];
  out.push(`Questions whose answer is ${c.target.label} [${c.target.id}]${c.type ? `, a ${c.type.label}` : ""}:`);
  if (c.proposals.length === 0) out.push("  (none found)");
  c.proposals.forEach((p, i) => out.push(...renderProposalText(p, i + 1)));
  for (const n of c.notes) out.push(`note: ${n}`);
  const verified = c.proposals.filter((p) => p.verified).length;
  out.push(`${verified} of ${c.proposals.length} shown verified; ${c.facts} candidate facts, ${c.sets} distinguishing sets, ${c.tried} asked back; ${Math.round(c.timings.total)} ms`);
  out.push(DISCLAIMER);
  return out.join("\n") + "\n";
}

/** The JSON document of `compose --json` (contract fields first; the rest additive). */
export function compositionDoc(c: Composition) {
  return {
    target: { id: c.target.id, label: c.target.label },
    ...(c.type ? { type: { id: c.type.id, label: c.type.label } } : {}),
    proposals: c.proposals.map((p) => ({
      question: p.question,
      verified: p.verified,
      candidates: p.candidates,
      clues: p.clues.map((k) => ({
        text: k.text,
        steps: k.steps,
        kind: k.kind,
        ...(k.entity ? { entity: { id: k.entity.id, label: k.entity.label } } : {}),
        ...(k.salience !== undefined ? { salience: Math.round(k.salience * 1000) / 1000 } : {}),
        ...(k.path ? { path: k.path } : {}),
        ...(k.middleType ? { middleType: { id: k.middleType.id, label: k.middleType.label } } : {}),
        ...(k.attribute ? { attribute: k.attribute } : {}),
        candidates: k.candidates,
      })),
      verdict: p.verdict,
      ...(p.first ? { first: p.first } : {}),
      ...(p.reason ? { reason: p.reason } : {}),
      cost: Math.round(p.cost * 1000) / 1000,
    })),
    notes: c.notes,
    facts: c.facts,
    sets: c.sets,
    tried: c.tried,
    timings: Object.fromEntries(Object.entries(c.timings).map(([k, v]) => [k, Math.round(v * 10) / 10])),
    disclaimer: DISCLAIMER,
  };
}

/** `compose --json`: one document, newline-terminated. */
export function compositionJson(c: Composition): string {
  return JSON.stringify(compositionDoc(c), null, 2) + "\n";
}

/**
 * The batch TSV: one row per verified proposal (`question<TAB>expected id<TAB>unique`), the
 * layout `check` reads; a target without a verified proposal gets a `#` comment line with the
 * reason (check skips it).
 */
export function renderComposeTsv(rows: readonly { readonly line: number; readonly name: string; readonly composition: Composition }[]): string {
  const out: string[] = ["# composed by tiepoint compose --batch: question, expected answer id, expected verdict (check reads this layout)"];
  const clean = (s: string) => s.replace(/[\t\r\n]+/g, " ");
  for (const r of rows) {
    const ok = r.composition.proposals.filter((p) => p.verified);
    if (ok.length === 0) {
      const why = r.composition.proposals[0]?.reason ?? r.composition.notes[0] ?? "no proposal";
      out.push(`# line ${r.line}: ${clean(r.name)} [${r.composition.target.id}]: no verified question (${clean(why)})`);
      continue;
    }
    for (const p of ok) out.push(`${clean(p.question)}\t${r.composition.target.id}\tunique`);
  }
  return out.join("\n") + "\n";
}
