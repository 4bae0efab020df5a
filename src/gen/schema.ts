/**
 * The fixed vocabulary of generated catalogs: a type hierarchy four levels deep whose leaves
 * hold the entities, relation kinds with a domain, a range, a share of the edges, a label,
 * alias phrasings and a verb phrase for question templates, and attribute predicates.
 */

/** A type node; `leaves` lists the leaf classes (indices into LEAVES) it covers. */
export interface GenType {
  readonly key: string;
  readonly label: string;
  readonly aliases: readonly string[];
  readonly parent: string | null;
}

/** All type nodes, parents before children. */
export const TYPES: readonly GenType[] = [
  { key: "Thing", label: "thing", aliases: ["item"], parent: null },
  { key: "Agent", label: "agent", aliases: ["party"], parent: "Thing" },
  { key: "Person", label: "person", aliases: ["people", "individual"], parent: "Agent" },
  { key: "Researcher", label: "researcher", aliases: ["scientist"], parent: "Person" },
  { key: "Engineer", label: "engineer", aliases: ["technician"], parent: "Person" },
  { key: "Organisation", label: "organisation", aliases: ["organization", "institution"], parent: "Agent" },
  { key: "Lab", label: "laboratory", aliases: ["lab"], parent: "Organisation" },
  { key: "Company", label: "company", aliases: ["firm", "manufacturer"], parent: "Organisation" },
  { key: "Artifact", label: "artifact", aliases: ["artefact"], parent: "Thing" },
  { key: "Equipment", label: "equipment", aliases: ["apparatus", "asset"], parent: "Artifact" },
  { key: "Instrument", label: "instrument", aliases: ["sensor", "device"], parent: "Equipment" },
  { key: "Vessel", label: "vessel", aliases: ["ship", "boat"], parent: "Equipment" },
  { key: "Document", label: "document", aliases: ["publication"], parent: "Artifact" },
  { key: "Report", label: "report", aliases: ["technical report"], parent: "Document" },
  { key: "Article", label: "article", aliases: ["paper"], parent: "Document" },
  { key: "Place", label: "place", aliases: ["location"], parent: "Thing" },
  { key: "Site", label: "site", aliases: ["field site"], parent: "Place" },
  { key: "Town", label: "town", aliases: ["city", "village"], parent: "Place" },
  { key: "Activity", label: "activity", aliases: [], parent: "Thing" },
  { key: "Project", label: "project", aliases: ["programme of work"], parent: "Activity" },
  { key: "Event", label: "event", aliases: ["meeting"], parent: "Activity" },
];

/** A leaf class and its share of the entities (shares sum to 100). */
export interface GenLeaf {
  readonly key: string;
  readonly share: number;
}

/** Leaf classes in id order; every group used by a relation is a contiguous run of these. */
export const LEAVES: readonly GenLeaf[] = [
  { key: "Researcher", share: 25 },
  { key: "Engineer", share: 10 },
  { key: "Lab", share: 4 },
  { key: "Company", share: 3 },
  { key: "Instrument", share: 10 },
  { key: "Vessel", share: 3 },
  { key: "Report", share: 12 },
  { key: "Article", share: 13 },
  { key: "Site", share: 5 },
  { key: "Town", share: 3 },
  { key: "Project", share: 7 },
  { key: "Event", share: 5 },
];

/** A relation kind: subject in `domain`, object in `range` (type keys). */
export interface GenRelation {
  readonly key: string;
  readonly domain: string;
  readonly range: string;
  /** Relative share of the edges. */
  readonly weight: number;
  readonly label: string;
  readonly aliases: readonly string[];
  /** Third-person verb phrase, subject first: "X {verb} Y". */
  readonly verb: string;
}

/** The relation kinds. */
export const RELATIONS: readonly GenRelation[] = [
  { key: "memberOf", domain: "Person", range: "Organisation", weight: 8, label: "member of", aliases: ["works at", "belongs to", "affiliated with"], verb: "is a member of" },
  { key: "leads", domain: "Person", range: "Project", weight: 3, label: "leads", aliases: ["heads", "directs", "in charge of"], verb: "leads" },
  { key: "worksOn", domain: "Person", range: "Project", weight: 10, label: "works on", aliases: ["contributes to", "participates in"], verb: "works on" },
  { key: "authorOf", domain: "Person", range: "Document", weight: 12, label: "author of", aliases: ["wrote", "authored"], verb: "wrote" },
  { key: "operates", domain: "Person", range: "Equipment", weight: 5, label: "operates", aliases: ["runs", "handles"], verb: "operates" },
  { key: "attended", domain: "Person", range: "Event", weight: 6, label: "attended", aliases: ["went to", "took part in"], verb: "attended" },
  { key: "livesIn", domain: "Person", range: "Town", weight: 4, label: "lives in", aliases: ["resides in", "is based in"], verb: "lives in" },
  { key: "supervises", domain: "Person", range: "Person", weight: 3, label: "supervises", aliases: ["mentors", "advises"], verb: "supervises" },
  { key: "collaboratesWith", domain: "Person", range: "Person", weight: 4, label: "collaborates with", aliases: ["works with", "partners with"], verb: "collaborates with" },
  { key: "fundedBy", domain: "Project", range: "Organisation", weight: 3, label: "funded by", aliases: ["financed by", "sponsored by"], verb: "is funded by" },
  { key: "usesEquipment", domain: "Project", range: "Equipment", weight: 5, label: "uses", aliases: ["employs", "relies on"], verb: "uses" },
  { key: "studies", domain: "Project", range: "Site", weight: 4, label: "studies", aliases: ["surveys", "investigates"], verb: "studies" },
  { key: "hostedBy", domain: "Project", range: "Organisation", weight: 3, label: "hosted by", aliases: ["run by", "based at"], verb: "is hosted by" },
  { key: "builtBy", domain: "Equipment", range: "Organisation", weight: 4, label: "built by", aliases: ["made by", "manufactured by"], verb: "was built by" },
  { key: "carriedOn", domain: "Instrument", range: "Vessel", weight: 3, label: "carried on", aliases: ["mounted on", "carried aboard"], verb: "is carried on" },
  { key: "deployedAt", domain: "Equipment", range: "Site", weight: 4, label: "deployed at", aliases: ["installed at", "stationed at"], verb: "is deployed at" },
  { key: "homePort", domain: "Vessel", range: "Town", weight: 1, label: "home port", aliases: ["docks at", "sails from"], verb: "sails from" },
  { key: "locatedIn", domain: "Organisation", range: "Town", weight: 2, label: "located in", aliases: ["situated in", "sits in"], verb: "is located in" },
  { key: "near", domain: "Site", range: "Town", weight: 2, label: "near", aliases: ["close to", "next to"], verb: "is near" },
  { key: "cites", domain: "Document", range: "Document", weight: 8, label: "cites", aliases: ["references", "refers to"], verb: "cites" },
  { key: "about", domain: "Document", range: "Project", weight: 5, label: "about", aliases: ["describes", "reports on"], verb: "is about" },
  { key: "presentedAt", domain: "Document", range: "Event", weight: 3, label: "presented at", aliases: ["published at", "shown at"], verb: "was presented at" },
  { key: "organisedBy", domain: "Event", range: "Organisation", weight: 2, label: "organised by", aliases: ["organized by", "convened by"], verb: "was organised by" },
  { key: "heldIn", domain: "Event", range: "Town", weight: 1, label: "held in", aliases: ["took place in", "hosted in"], verb: "was held in" },
  { key: "partnerOf", domain: "Organisation", range: "Organisation", weight: 2, label: "partner of", aliases: ["allied with", "teams up with"], verb: "is a partner of" },
  { key: "produced", domain: "Project", range: "Document", weight: 4, label: "produced", aliases: ["delivered", "put out"], verb: "produced" },
];

/** An attribute predicate and the leaf classes that carry it. */
export interface GenAttribute {
  readonly key: string;
  readonly label: string;
  readonly aliases: readonly string[];
  readonly leaves: readonly string[];
  /** Inclusive value range. */
  readonly min: number;
  readonly max: number;
}

/** Literal attributes. */
export const ATTRIBUTES: readonly GenAttribute[] = [
  { key: "born", label: "birth year", aliases: ["born"], leaves: ["Researcher", "Engineer"], min: 1940, max: 2001 },
  { key: "founded", label: "founding year", aliases: ["founded", "established"], leaves: ["Lab", "Company"], min: 1890, max: 2020 },
  { key: "built", label: "build year", aliases: ["built", "commissioned"], leaves: ["Instrument", "Vessel"], min: 1955, max: 2024 },
  { key: "tonnage", label: "tonnage", aliases: ["gross tonnage"], leaves: ["Vessel"], min: 40, max: 9000 },
  { key: "year", label: "year", aliases: ["published"], leaves: ["Report", "Article", "Event"], min: 1970, max: 2025 },
  { key: "population", label: "population", aliases: ["inhabitants"], leaves: ["Town"], min: 300, max: 400000 },
  { key: "elevation", label: "elevation", aliases: ["altitude", "height"], leaves: ["Site"], min: -40, max: 4200 },
  { key: "start", label: "start year", aliases: ["started", "began"], leaves: ["Project"], min: 1985, max: 2025 },
];

/** The leaf indices covered by a type key, as an inclusive [lo, hi] run. */
export function leafRun(key: string): [number, number] {
  const covered: number[] = [];
  const isUnder = (k: string): boolean => {
    for (let t: string | null = k; t !== null; t = TYPES.find((x) => x.key === t)?.parent ?? null) if (t === key) return true;
    return false;
  };
  LEAVES.forEach((l, i) => {
    if (isUnder(l.key)) covered.push(i);
  });
  if (covered.length === 0) throw new RangeError(`gen/schema: type ${key} covers no leaf class`);
  const lo = covered[0]!;
  const hi = covered[covered.length - 1]!;
  if (hi - lo + 1 !== covered.length) throw new RangeError(`gen/schema: type ${key} is not a contiguous run of leaves`);
  return [lo, hi];
}

/** The type whose leaf run is exactly [lo, hi], if any. */
export function typeOfRun(lo: number, hi: number): GenType | undefined {
  return TYPES.find((t) => {
    const [a, b] = leafRun(t.key);
    return a === lo && b === hi;
  });
}
