/**
 * The bundled demo catalog (data/*.jsonl, README "The demo catalog") as RDF 1.1 N-Triples, for
 * the gold engine of the verdict set (oxigraph): an independent reading of the JSON Lines
 * sources, not tiepoint's importer. Ids are kept as IRIs as written (`ves:caddrow` is an
 * absolute IRI of scheme `ves`). Mapped: `label` → rdfs:label, `aliases` → skos:altLabel,
 * `types` → rdf:type, `subClassOf` → rdfs:subClassOf, `relations` and edge records → a triple
 * with the relation id as predicate, `attributes` → literals (xsd:integer / xsd:decimal for
 * numbers; the predicate is `attr:NAME`, NAME percent-encoded). Relation and attribute declarations carry no facts and are skipped.
 */
import { readFileSync } from "node:fs";
import { demoSourceFiles } from "../catalog/index.js";
import { ntString } from "./world-catalog.js";

const RDF_TYPE = "<http://www.w3.org/1999/02/22-rdf-syntax-ns#type>";
const LABEL = "<http://www.w3.org/2000/01/rdf-schema#label>";
const ALT = "<http://www.w3.org/2004/02/skos/core#altLabel>";
const SUB = "<http://www.w3.org/2000/01/rdf-schema#subClassOf>";
const XSD = "http://www.w3.org/2001/XMLSchema#";

type Json = string | number | boolean | null | Json[] | { [k: string]: Json };

/** SPARQL prefixes for the demo's id schemes (an id `town:caddrow` is written `town:caddrow`). */
export const DEMO_PREFIXES: Readonly<Record<string, string>> = {
  ...Object.fromEntries(["t", "r", "p", "town", "ves", "ins", "proj", "lab", "co", "site", "fund", "prog", "cr", "pub", "ds", "ws", "org", "f", "attr"].map((k) => [k, `${k}:`])),
  rdfs: "http://www.w3.org/2000/01/rdf-schema#",
};

/** The demo sources (or `files`) as N-Triples text. */
export function demoTriples(files: readonly string[] = demoSourceFiles()): string {
  const out: string[] = [];
  const iri = (id: string) => `<${id}>`;
  const lit = (v: Json) => (typeof v === "number" ? `${ntString(String(v))}^^<${XSD}${Number.isInteger(v) ? "integer" : "decimal"}>` : ntString(String(v)));
  const list = (v: Json | undefined): Json[] => (v === undefined || v === null ? [] : Array.isArray(v) ? v : [v]);
  for (const file of files) {
    for (const line of readFileSync(file, "utf8").split("\n")) {
      if (line.trim() === "") continue;
      const o = JSON.parse(line) as { [k: string]: Json };
      if (typeof o.subject === "string") {
        out.push(`${iri(o.subject)} ${iri(String(o.relation))} ${iri(String(o.object))} .`);
        continue;
      }
      if (o.kind === "relation" || o.kind === "attribute" || typeof o.id !== "string") continue;
      const s = iri(o.id);
      if (typeof o.label === "string") out.push(`${s} ${LABEL} ${ntString(o.label)} .`);
      for (const a of list(o.aliases)) out.push(`${s} ${ALT} ${ntString(String(a))} .`);
      for (const t of list(o.types)) out.push(`${s} ${RDF_TYPE} ${iri(String(t))} .`);
      for (const t of list(o.subClassOf)) out.push(`${s} ${SUB} ${iri(String(t))} .`);
      for (const [rel, targets] of Object.entries((o.relations ?? {}) as { [k: string]: Json })) for (const t of list(targets)) out.push(`${s} ${iri(rel)} ${iri(String(t))} .`);
      for (const [name, values] of Object.entries((o.attributes ?? {}) as { [k: string]: Json })) for (const v of list(values)) out.push(`${s} ${iri(`attr:${encodeURIComponent(name)}`)} ${lit(v)} .`);
    }
  }
  return out.join("\n") + "\n";
}
