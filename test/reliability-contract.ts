/**
 * A strict validator of the `ask --json` document (../shared/contract.md, "JSON of ask
 * --json") for the reliability tests (issue 10). It checks the parsed JSON, i.e. what a
 * consumer of `--json` really gets (a NaN would arrive as null and fail here):
 * required fields and their types; mention offsets are UTF-16, end-exclusive and slice back
 * to the mention text; ids name catalog entities and relations; paths chain from the clue to
 * the answer, each step a stored triple in the stated direction; answers best first (in the
 * ranking's order when it is given, else by score); the
 * verdict status from the contract's enum, `tiedWith` among the answers or the catalog.
 * Returns the list of violations (empty when the document is valid).
 */
import type { Catalog } from "../src/catalog/index.js";

type Json = null | boolean | number | string | Json[] | { [k: string]: Json };

const STATUSES = new Set(["unique", "tied", "weak", "none"]);

const isObj = (x: Json | undefined): x is { [k: string]: Json } => typeof x === "object" && x !== null && !Array.isArray(x);
const isInt = (x: Json | undefined): x is number => typeof x === "number" && Number.isInteger(x);
const isNum = (x: Json | undefined): x is number => typeof x === "number" && Number.isFinite(x);
const isStr = (x: Json | undefined): x is string => typeof x === "string";

/** Validates one parsed `ask --json` document for `question` against the catalog; `top` bounds the answers. */
export function validateAskJson(doc: Json, question: string, cat: Catalog, top: number, rankingOrder?: readonly string[]): string[] {
  const bad: string[] = [];
  const entityKnown = new Map<string, boolean>();
  const known = (id: string) => {
    let k = entityKnown.get(id);
    if (k === undefined) entityKnown.set(id, (k = cat.numOf(id) !== undefined));
    return k;
  };
  const ref = (x: Json | undefined, where: string) => {
    if (!isObj(x) || !isStr(x.id) || !isStr(x.label)) return void bad.push(`${where}: expected {id, label} strings`);
    if (!known(x.id)) bad.push(`${where}: id "${x.id}" is not a catalog entity`);
  };
  if (!isObj(doc)) return ["document is not an object"];
  if (doc.question !== question) bad.push("question differs from the input");
  if (!Array.isArray(doc.mentions)) bad.push("mentions: not an array");
  else
    doc.mentions.forEach((m, i) => {
      const w = `mentions[${i}]`;
      if (!isObj(m)) return void bad.push(`${w}: not an object`);
      if (!isStr(m.text) || !isInt(m.start) || !isInt(m.end)) return void bad.push(`${w}: text/start/end types`);
      if (!(m.start >= 0 && m.start < m.end && m.end <= question.length)) bad.push(`${w}: offsets ${m.start}..${m.end} outside 0..${question.length}`);
      else if (question.slice(m.start, m.end) !== m.text) bad.push(`${w}: question.slice(${m.start}, ${m.end}) is not the mention text`);
      ref(m.entity, `${w}.entity`);
      if (!isNum(m.confidence) || m.confidence < 0 || m.confidence > 1) bad.push(`${w}: confidence ${String(m.confidence)} not in 0..1`);
      if (!Array.isArray(m.alternatives)) bad.push(`${w}: alternatives not an array`);
      else
        m.alternatives.forEach((a, j) => {
          ref(a, `${w}.alternatives[${j}]`);
          if (!isObj(a) || !isNum(a.confidence) || a.confidence < 0 || a.confidence > 1) bad.push(`${w}.alternatives[${j}]: confidence not in 0..1`);
        });
    });
  if (!Array.isArray(doc.answerTypes)) bad.push("answerTypes: not an array");
  else doc.answerTypes.forEach((t, i) => ref(t, `answerTypes[${i}]`));
  const answerIds = new Set<string>();
  if (!Array.isArray(doc.answers)) bad.push("answers: not an array");
  else {
    if (doc.answers.length > top) bad.push(`answers: ${doc.answers.length} > top ${top}`);
    // best first: in the ranking's order when it is given (the ranking sorts by clues covered,
    // then score, and conditions may reorder: the score alone need not fall); else by score
    let prev = Infinity;
    let lastPlace = -1;
    const place = new Map((rankingOrder ?? []).map((id, i) => [id, i]));
    doc.answers.forEach((a, i) => {
      const w = `answers[${i}]`;
      ref(a, w);
      if (!isObj(a)) return;
      if (isStr(a.id)) {
        if (answerIds.has(a.id)) bad.push(`${w}: duplicate answer id ${a.id}`);
        answerIds.add(a.id);
      }
      if (!isNum(a.score)) bad.push(`${w}: score not a finite number`);
      else {
        if (rankingOrder) {
          const at = isStr(a.id) ? place.get(a.id) : undefined;
          if (at === undefined) bad.push(`${w}: "${String(a.id)}" is not among the ranked candidates`);
          else if (at < lastPlace) bad.push(`${w}: out of the ranking's order (answers must be best first)`);
          else lastPlace = at;
        } else if (a.score > prev) bad.push(`${w}: score ${a.score} above the previous answer's ${prev} (answers must be best first)`);
        prev = a.score;
      }
      if (!Array.isArray(a.types) || !a.types.every((t) => isStr(t) && known(t))) bad.push(`${w}: types must be catalog entity ids`);
      if (!Array.isArray(a.paths)) return void bad.push(`${w}: paths not an array`);
      a.paths.forEach((p, k) => {
        const pw = `${w}.paths[${k}]`;
        if (!isObj(p) || !isStr(p.from) || !Array.isArray(p.steps)) return void bad.push(`${pw}: expected {from, steps[]}`);
        if (!known(p.from)) bad.push(`${pw}: from "${p.from}" is not a catalog entity`);
        if (p.steps.length === 0) return void bad.push(`${pw}: no steps`);
        let at = p.from;
        p.steps.forEach((s, n) => {
          const sw = `${pw}.steps[${n}]`;
          if (!isObj(s) || !isStr(s.from) || !isStr(s.relation) || !isStr(s.to) || typeof s.inverse !== "boolean") return void bad.push(`${sw}: expected {from, relation, to, inverse}`);
          if (s.from !== at) bad.push(`${sw}: from "${s.from}" is not the previous step's to "${at}"`);
          const stored = s.inverse ? cat.hasEdge(s.to, s.relation, s.from) : cat.hasEdge(s.from, s.relation, s.to);
          if (!stored) bad.push(`${sw}: no stored triple for ${s.from} ${s.relation} ${s.to} (inverse ${s.inverse})`);
          at = s.to;
        });
        if (at !== a.id) bad.push(`${pw}: the last step ends at "${at}", not the answer "${String(a.id)}"`);
      });
    });
  }
  const v = doc.verdict;
  if (!isObj(v)) bad.push("verdict: not an object");
  else {
    if (!isStr(v.status) || !STATUSES.has(v.status)) bad.push(`verdict.status "${String(v.status)}" not in the contract's enum`);
    if (!isNum(v.margin)) bad.push("verdict.margin not a finite number");
    if (!Array.isArray(v.tiedWith)) bad.push("verdict.tiedWith not an array");
    else for (const t of v.tiedWith) if (!isStr(t) || !(answerIds.has(t) || known(t))) bad.push(`verdict.tiedWith "${String(t)}" is neither an answer nor a catalog entity`);
  }
  return bad;
}
