/**
 * Three-hop readings whose answer lies where the walk from the clue hardly reaches (issue
 * 16, phenomena 1, 2 and 6): the ends of a clue's pattern join the candidates when the walk
 * left them all out (a chain through a hub) or a condition on a middle node selected them
 * (the largest package, a hub, whose maintainer the walk's hub penalty starves)
 * (src/ranking/rank.ts, the conjunctive query's matches first, Mendelzon & Wood 1995). The
 * readings themselves come from src/analysis/relation-range.ts ("who *maintains*" against a
 * label "maintained by": the maintainer; "in which *section* are the packages …": the archive
 * section), attach-conditions.ts, and cue-chains.ts (a clue coordinated with a described noun
 * phrase: "depends on both core *and the package that libbar is needed by*", where "needed"
 * names the same relation as "depends" through its alias "needs", relation-cues.ts).
 *
 * Catalog: an invented package archive (a hub package "core" that 300 packages depend on,
 * a tool and two libraries), written as N-Triples, loaded through the real loader and asked
 * through the real Session. Gold: SPARQL over the same N-Triples in oxigraph (npm
 * `oxigraph`, src/eval/question-set.ts `goldStore`).
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { AskResult } from "../src/model/index.js";
import { openNtSession, type NtSession } from "./helpers/nt-session.js";

const E = "http://archive.example/";
const LABEL = "<http://www.w3.org/2000/01/rdf-schema#label>";
const TYPE = "<http://www.w3.org/1999/02/22-rdf-syntax-ns#type>";

function triples(): string {
  const out = [
    `<${E}Package> ${LABEL} "package" .`,
    `<${E}Maintainer> ${LABEL} "maintainer" .`,
    `<${E}Section> ${LABEL} "archive section" .`,
    `<${E}depends> ${LABEL} "depends on" .`,
    `<${E}depends> <http://www.w3.org/2004/02/skos/core#altLabel> "needs" .`,
    `<${E}maintainer> ${LABEL} "maintained by" .`,
    `<${E}section> ${LABEL} "in section" .`,
    `<${E}size> ${LABEL} "installed size" .`,
  ];
  const entity = (id: string, type: string, label: string) => out.push(`<${E}${id}> ${TYPE} <${E}${type}> .`, `<${E}${id}> ${LABEL} "${label}" .`);
  const pkg = (id: string, size: number, maintainer: string, section: string, deps: string[]) => {
    entity(`p/${id}`, "Package", id);
    out.push(`<${E}p/${id}> <${E}size> "${size}"^^<http://www.w3.org/2001/XMLSchema#integer> .`);
    out.push(`<${E}p/${id}> <${E}maintainer> <${E}m/${maintainer}> .`, `<${E}p/${id}> <${E}section> <${E}s/${section}> .`);
    for (const d of deps) out.push(`<${E}p/${id}> <${E}depends> <${E}p/${d}> .`);
  };
  for (const [id, label] of [["core-team", "Core Team"], ["foo-folk", "Foo Folk"], ["bar-band", "Bar Band"], ["tia-runn", "Tia Runn"], ["mass-crew", "Mass Crew"]]) entity(`m/${id}`, "Maintainer", label!);
  for (const s of ["base", "libs", "utils", "misc", "devel"]) entity(`s/${s}`, "Section", s);
  pkg("core", 5000, "core-team", "base", []);
  pkg("libfoo", 300, "foo-folk", "libs", ["core"]);
  pkg("libbar", 100, "bar-band", "libs", []);
  pkg("tool", 50, "tia-runn", "utils", ["core", "libfoo", "libbar"]);
  pkg("suite", 70, "foo-folk", "devel", ["core", "tool"]);
  for (let i = 0; i < 300; i++) pkg(`filler${i}`, 10 + i, "mass-crew", "misc", ["core"]);
  return out.join("\n") + "\n";
}

let cat: NtSession;
let gold: (sparql: string) => string[];

beforeAll(() => {
  cat = openNtSession("archive", triples(), `{"kind":"attribute","id":"${E}size","label":"installed size","unit":"kibibytes"}\n`, E);
  gold = cat.gold;
});
afterAll(() => cat?.close());

const ask = (q: string): AskResult => cat.session.ask(q).result;
const group = (r: AskResult) => [r.answers[0]!.id, ...r.verdict.tiedWith].sort();

describe("three hops: the pattern's ends are candidates, whatever the walk reached", () => {
  it("'Who maintains …' with a label 'maintained by': the answer is the maintainer, three hops from the clue", () => {
    const r = ask("Who maintains the packages that depend on the package maintained by Bar Band?");
    expect(r.answerTypes.map((t) => t.label)).toEqual(["maintainer"]);
    expect(r.reading!.text).toBe("?answer (maintainer) ← maintained by — ?v2 (package) — depends on → ?v1 (package) — maintained by → Bar Band");
    expect(group(r)).toEqual(gold(`SELECT DISTINCT ?m WHERE { ?l :maintainer <${E}m/bar-band> . ?p :depends ?l ; :maintainer ?m }`));
  });

  it("a superlative on the middle node selects the hub, whose maintainer the walk starves: it is still the answer", () => {
    const r = ask("Who maintains the biggest of the packages that tool depends on?");
    expect(r.reading!.text).toBe("?answer (maintainer) ← maintained by — ?v1 (package; largest by installed size) ← depends on — tool");
    const want = gold(`SELECT ?m WHERE { :p\\/tool :depends ?d . ?d :size ?s ; :maintainer ?m FILTER NOT EXISTS { :p\\/tool :depends ?e . ?e :size ?t FILTER(?t > ?s) } }`);
    expect(want).toEqual([`${E}m/core-team`]);
    expect(group(r)).toEqual(want);
    expect(r.verdict.status).toBe("unique");
  });

  it("a named clue coordinated with a described one: the described clue's chain runs through the relative clause, then takes the named clue's hops", () => {
    const r = ask("What is the section of the package that depends on both core and the package that libbar is needed by?");
    expect(r.reading!.text).toBe(
      "?answer (archive section) ← in section — ?v1 (package) — depends on → core; ?answer (archive section) ← in section — ?v3 (package) — depends on → ?v2 (package) — depends on → libbar",
    );
    expect(r.reading!.ignored).toEqual([]);
    const want = gold(`SELECT DISTINCT ?s WHERE { ?p :depends :p\\/core , ?q . ?q :depends :p\\/libbar . ?p :section ?s }`);
    expect(want).toEqual([`${E}s/devel`]);
    expect(group(r)).toEqual(want);
    expect(r.verdict.status).toBe("unique");
  });

  it("'In which section …': the head noun is a word of 'archive section', the object end of 'in section'", () => {
    const r = ask("In which section are the packages that the package maintained by Tia Runn depends on?");
    expect(r.answerTypes.map((t) => t.label)).toEqual(["archive section"]);
    expect(r.reading!.text).toBe("?answer (archive section) ← in section — ?v2 (package) ← depends on — ?v1 — maintained by → Tia Runn");
    expect(r.reading!.matched).toBe(2);
    expect(group(r)).toEqual(gold(`SELECT DISTINCT ?s WHERE { ?p :maintainer <${E}m/tia-runn> ; :depends ?d . ?d :section ?s }`));
  });
});
