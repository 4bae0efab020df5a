/**
 * The world evaluation catalog: the `world-countries` npm package 5.1.0 (mledoze/countries,
 * ODbL) written as RDF 1.1 N-Triples (W3C Recommendation 2014), so that tiepoint and an
 * independent SPARQL engine (oxigraph) read the very same triples.
 *
 * Every record of the dataset is a `w:Country` (the dataset calls them all countries;
 * `w:independent` and `w:unMember` say which are sovereign states). Entities and their IRIs:
 *
 * | IRI | what | from the record |
 * | --- | --- | --- |
 * | `http://world.example/country/CCA3` | a country, label `name.common`, alias `name.official` | every record |
 * | `http://world.example/city/CCA3` (`-2`, `-3` …) | a capital city, label as written | `capital[]` |
 * | `http://world.example/region/NAME` | a region (Africa, Americas …) | `region` |
 * | `http://world.example/subregion/NAME` | a subregion, `w:partOf` its region | `subregion` |
 * | `http://world.example/language/CODE` | a language, label its English name | `languages` (ISO 639-3 keys) |
 * | `http://world.example/currency/CODE` | a currency, label its name, `w:symbol` | `currencies` (ISO 4217 keys) |
 *
 * Relations (IRI → label, aliases): `w:capital` (country → city), `w:borders` (land borders,
 * both directions as the dataset lists them), `w:region`, `w:subregion`, `w:partOf`,
 * `w:language` ("official language"), `w:currency`. Attributes: `w:area` (km²; the dataset's
 * −1 for "unknown" is left out), `w:landlocked`, `w:independent`, `w:unMember` (xsd:boolean),
 * `w:cca2`, `w:cca3` (ISO 3166-1 codes), `w:tld`, `w:callingCode` (`idd.root` + the suffix when
 * there is exactly one, else the root), `w:demonym` (`demonyms.eng.m`), `w:symbol` (currencies),
 * `w:languageCode` (languages), `w:latitude` and `w:longitude` (`latlng`, decimal degrees). Units are not expressible in RDF's mapping to the catalog, so
 * they are declared in a JSON Lines schema file loaded beside the triples (wording only: no fact
 * lives there, the gold engine does not need it).
 */
import { createRequire } from "node:module";

/** The fields of one world-countries 5.1.0 record read here. */
interface WcRecord {
  readonly cca2: string;
  readonly cca3: string;
  readonly name: { readonly common: string; readonly official: string };
  readonly tld?: readonly string[];
  readonly independent: boolean | null;
  readonly unMember: boolean;
  readonly currencies?: Readonly<{ [code: string]: { readonly name: string; readonly symbol?: string } }>;
  readonly idd?: { readonly root?: string; readonly suffixes?: readonly string[] };
  readonly capital?: readonly string[];
  readonly region: string;
  readonly subregion: string;
  readonly languages?: Readonly<{ [code: string]: string }>;
  readonly landlocked: boolean;
  readonly borders: readonly string[];
  readonly area: number;
  readonly latlng?: readonly number[];
  readonly demonyms?: { readonly eng?: { readonly m?: string } };
}

const require = createRequire(import.meta.url);

/** The namespace of the catalog's IRIs; the SPARQL prefixes of the question file are built on it. */
export const WORLD_NS = "http://world.example/";

/** SPARQL prefixes declared before every query of the world question set. */
export const WORLD_PREFIXES: Readonly<Record<string, string>> = {
  w: WORLD_NS,
  c: `${WORLD_NS}country/`,
  city: `${WORLD_NS}city/`,
  reg: `${WORLD_NS}region/`,
  sub: `${WORLD_NS}subregion/`,
  lang: `${WORLD_NS}language/`,
  cur: `${WORLD_NS}currency/`,
  xsd: "http://www.w3.org/2001/XMLSchema#",
  rdfs: "http://www.w3.org/2000/01/rdf-schema#",
};

/** The dataset version read (from the installed package). */
export function worldCountriesVersion(): string {
  return (require("world-countries/package.json") as { version: string }).version;
}

const RDF_TYPE = "http://www.w3.org/1999/02/22-rdf-syntax-ns#type";
const LABEL = "http://www.w3.org/2000/01/rdf-schema#label";
const ALT = "http://www.w3.org/2004/02/skos/core#altLabel";
const XSD = "http://www.w3.org/2001/XMLSchema#";

/** An N-Triples string literal body (RDF 1.1 N-Triples, section 2.4: ECHAR escapes). */
export function ntString(s: string): string {
  return `"${s.replace(/\\/g, "\\\\").replace(/"/g, '\\"').replace(/\n/g, "\\n").replace(/\r/g, "\\r")}"`;
}

/** Local name of a region or subregion IRI: spaces to underscores, other characters kept as IRI-safe. */
export function slug(name: string): string {
  return encodeURIComponent(name.replace(/ /g, "_"));
}

/** Wording of the vocabulary: [IRI suffix, label, aliases]. */
const TYPES: readonly [string, string, readonly string[]][] = [
  ["Country", "country", ["nation", "state"]],
  ["City", "city", ["capital city"]],
  ["Region", "region", ["continent"]],
  ["Subregion", "subregion", []],
  ["Language", "language", []],
  ["Currency", "currency", ["money"]],
];
const RELATIONS: readonly [string, string, readonly string[]][] = [
  ["capital", "capital", ["capital city", "seat of government"]],
  ["borders", "borders", ["shares a land border with", "neighbour of", "neighbouring country"]],
  ["region", "region", ["continent", "located in"]],
  ["subregion", "subregion", ["part of the world"]],
  ["partOf", "part of", ["lies in"]],
  ["language", "official language", ["language", "spoken language"]],
  ["currency", "currency", ["uses currency", "legal tender"]],
];
/** [IRI suffix, label, aliases, unit]. */
const ATTRIBUTES: readonly [string, string, readonly string[], string | null][] = [
  ["area", "area", ["surface area", "size"], "km²"],
  ["latitude", "latitude", [], "degrees"],
  ["longitude", "longitude", [], "degrees"],
  ["landlocked", "landlocked", ["no coastline"], null],
  ["independent", "independent", ["sovereign"], null],
  ["unMember", "UN member", ["member of the United Nations"], null],
  ["cca2", "two-letter code", ["ISO 3166-1 alpha-2 code"], null],
  ["cca3", "three-letter code", ["ISO 3166-1 alpha-3 code"], null],
  ["tld", "top-level domain", ["internet domain"], null],
  ["callingCode", "calling code", ["dialling code", "phone prefix"], null],
  ["demonym", "demonym", ["name of inhabitants"], null],
  ["symbol", "symbol", ["currency sign"], null],
  ["languageCode", "language code", ["ISO 639-3 code"], null],
];

/** The catalog: N-Triples text (the facts and the vocabulary's labels) and a JSONL schema (units). */
export interface EvalCatalogSource {
  readonly triples: string;
  readonly schema: string;
}

/** Builds the world catalog from the installed `world-countries` package. */
export function buildWorldCatalog(): EvalCatalogSource {
  const records = (require("world-countries") as WcRecord[]).slice().sort((a, b) => (a.cca3 < b.cca3 ? -1 : 1));
  const out: string[] = [];
  const iri = (s: string) => `<${WORLD_NS}${s}>`;
  const lit = (s: string) => ntString(s);
  const typed = (v: string, t: string) => `${ntString(v)}^^<${XSD}${t}>`;
  const add = (s: string, p: string, o: string) => out.push(`${s} ${p} ${o} .`);
  for (const [id, label, aliases] of [...TYPES, ...RELATIONS, ...ATTRIBUTES.map(([a, b, c]) => [a, b, c] as const)]) {
    add(iri(id), `<${LABEL}>`, lit(label));
    for (const a of aliases) add(iri(id), `<${ALT}>`, lit(a));
  }
  const languages = new Map<string, string>();
  const currencies = new Map<string, { name: string; symbol?: string }>();
  const subregions = new Map<string, string>();
  for (const r of records) {
    for (const [code, name] of Object.entries(r.languages ?? {})) languages.set(code, name);
    for (const [code, cur] of Object.entries(r.currencies ?? {})) currencies.set(code, cur);
    if (r.subregion) subregions.set(r.subregion, r.region);
  }
  for (const region of [...new Set(records.map((r) => r.region))].sort()) {
    add(iri(`region/${slug(region)}`), `<${RDF_TYPE}>`, iri("Region"));
    add(iri(`region/${slug(region)}`), `<${LABEL}>`, lit(region));
  }
  for (const [sub, region] of [...subregions].sort()) {
    const s = iri(`subregion/${slug(sub)}`);
    add(s, `<${RDF_TYPE}>`, iri("Subregion"));
    add(s, `<${LABEL}>`, lit(sub));
    add(s, iri("partOf"), iri(`region/${slug(region)}`));
  }
  for (const [code, name] of [...languages].sort()) {
    const s = iri(`language/${code}`);
    add(s, `<${RDF_TYPE}>`, iri("Language"));
    add(s, `<${LABEL}>`, lit(name));
    add(s, iri("languageCode"), lit(code));
  }
  for (const [code, cur] of [...currencies].sort()) {
    const s = iri(`currency/${code}`);
    add(s, `<${RDF_TYPE}>`, iri("Currency"));
    add(s, `<${LABEL}>`, lit(cur.name));
    add(s, `<${ALT}>`, lit(code));
    if (cur.symbol) add(s, iri("symbol"), lit(cur.symbol));
  }
  for (const r of records) {
    const s = iri(`country/${r.cca3}`);
    add(s, `<${RDF_TYPE}>`, iri("Country"));
    add(s, `<${LABEL}>`, lit(r.name.common));
    if (r.name.official !== r.name.common) add(s, `<${ALT}>`, lit(r.name.official));
    add(s, iri("cca2"), lit(r.cca2));
    add(s, iri("cca3"), lit(r.cca3));
    if (r.area >= 0) add(s, iri("area"), typed(String(r.area), "decimal"));
    if (r.latlng?.length === 2) {
      add(s, iri("latitude"), typed(String(r.latlng[0]), "decimal"));
      add(s, iri("longitude"), typed(String(r.latlng[1]), "decimal"));
    }
    add(s, iri("landlocked"), typed(String(r.landlocked), "boolean"));
    add(s, iri("independent"), typed(String(r.independent === true), "boolean"));
    add(s, iri("unMember"), typed(String(r.unMember), "boolean"));
    for (const t of r.tld ?? []) add(s, iri("tld"), lit(t));
    const root = r.idd?.root;
    if (root) add(s, iri("callingCode"), lit(r.idd?.suffixes?.length === 1 ? root + r.idd.suffixes[0]! : root));
    const demonym = r.demonyms?.eng?.m;
    if (demonym) add(s, iri("demonym"), lit(demonym));
    add(s, iri("region"), iri(`region/${slug(r.region)}`));
    if (r.subregion) add(s, iri("subregion"), iri(`subregion/${slug(r.subregion)}`));
    for (const code of Object.keys(r.languages ?? {}).sort()) add(s, iri("language"), iri(`language/${code}`));
    for (const code of Object.keys(r.currencies ?? {}).sort()) add(s, iri("currency"), iri(`currency/${code}`));
    for (const b of r.borders) add(s, iri("borders"), iri(`country/${b}`));
    (r.capital ?? [])
      .filter((x) => x.trim() !== "")
      .forEach((name, i) => {
        const city = iri(`city/${r.cca3}${i === 0 ? "" : `-${String(i + 1)}`}`);
        add(city, `<${RDF_TYPE}>`, iri("City"));
        add(city, `<${LABEL}>`, lit(name));
        add(s, iri("capital"), city);
      });
  }
  const schema = ATTRIBUTES.filter(([, , , unit]) => unit !== null).map(([id, label, aliases, unit]) =>
    JSON.stringify({ kind: "attribute", id: `${WORLD_NS}${id}`, label, aliases, unit }),
  );
  return { triples: out.join("\n") + "\n", schema: schema.join("\n") + "\n" };
}
