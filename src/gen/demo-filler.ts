/**
 * Background filler of the demo catalog: a deterministic, seeded set of further people, labs,
 * towns, vessels, instruments, projects, events and publications of the invented Velmarra
 * Basin setting, written to data/filler.jsonl. The hand-written core (data/core.jsonl) holds
 * every fact the demo questions rely on; the filler only links to the core through
 * `r:partnerOf` (its labs → the consortium) and `r:collaboratesWith` (its people → core
 * people), relations the demo questions never ask about, so it adds no alternative answers.
 *
 * Endpoints are drawn with Rng.zipf so a few filler projects, papers and people gather many
 * links (a heavy tail, as in the synthetic generator). All names are invented here.
 */
import { Rng } from "./random.js";

/** Defaults of {@link demoFiller}. */
export const DEFAULTS = {
  seed: 2026,
  towns: 24,
  sites: 24,
  labs: 16,
  companies: 10,
  funders: 4,
  programmes: 8,
  vessels: 18,
  /** Of the vessels, how many are named exactly like a filler town. */
  vesselsNamedAfterTowns: 8,
  instruments: 50,
  projects: 30,
  /** Of the projects, how many share their label with an instrument. */
  projectsSharingInstrumentLabel: 5,
  cruises: 20,
  workshops: 12,
  publications: 110,
  datasets: 30,
  researchers: 130,
  engineers: 50,
  mariners: 50,
  /** Pairs of filler people with the same full name. */
  namesakePairs: 6,
} as const;

/** Options of {@link demoFiller}; all optional. */
export type DemoFillerOptions = Partial<Record<keyof typeof DEFAULTS, number>>;

/** One JSONL record of the demo layout (entity with inline relations). */
export interface FillerRecord {
  readonly id: string;
  readonly label: string;
  readonly types: readonly string[];
  readonly aliases?: readonly string[];
  readonly description: string;
  readonly attributes?: Readonly<Record<string, number | string>>;
  readonly relations?: Readonly<Record<string, readonly string[]>>;
}

const GIVEN = [
  "Arvel", "Brisa", "Calde", "Dessa", "Elvin", "Fenna", "Gorm", "Halla", "Ivo", "Jorun", "Kesta", "Lorne",
  "Maelis", "Nilo", "Orla", "Pim", "Quen", "Rasmo", "Sindre", "Tove", "Ulla", "Vesna", "Wend", "Ysolde",
  "Ansel", "Bettan", "Cira", "Dagny", "Eskil", "Frida", "Gisli", "Henna", "Idris", "Jalo", "Kaia", "Lenne",
  "Morten", "Nessa", "Odo", "Pella", "Rikke", "Saul", "Tilde", "Uwen", "Vidar", "Wilma", "Yrsa", "Zeno",
];
const SURNAMES = [
  "Aldrake", "Borrin", "Castell", "Dunmoor", "Eskeby", "Faroth", "Gellan", "Hask", "Isberg", "Jorvath",
  "Kettle", "Lammas", "Morrow", "Nettleby", "Oskar", "Pellin", "Quarry", "Rathe", "Selk", "Tarrow",
  "Ulvane", "Vorrel", "Wyke", "Yarrow", "Ambry", "Bracken", "Corran", "Dask", "Ellery", "Fenmark",
  "Garth", "Hollard", "Ingle", "Jessop", "Kell", "Lisle", "Marrick", "Nairn", "Orrell", "Pask",
  "Raddle", "Stennet", "Thorley", "Umber", "Vantry", "Wraith", "Yelland", "Zorn", "Bellamy", "Crane",
  "Dorley", "Elstow", "Farrant", "Grisdale", "Hume", "Inchley", "Jolliffe", "Kirrin", "Lowick", "Mossop",
];
const ROOTS = [
  "Ulver", "Morn", "Keld", "Frae", "Orrin", "Brack", "Sulm", "Thessa", "Varn", "Quenn", "Lodd", "Skarr",
  "Wenn", "Ebb", "Gannet", "Holm", "Isdra", "Jarl", "Kerrath", "Lunn", "Mael", "Norr", "Ostra", "Pell",
  "Rask", "Sael", "Torr", "Umbra", "Veir", "Wrack", "Ysk", "Zand", "Cray", "Dun", "Eskel", "Fell",
];
const TOWN_SUFFIX = ["by", "mere", "wick", "holt", "haven", "ness", "ford", "stow"];
const SITE_FEATURE = ["Deep", "Bank", "Knoll", "Trough", "Ledge", "Spit", "Skerry", "Hollow"];
const LAB_KIND = ["Marine Station", "Coastal Lab", "Ocean Institute", "Geoscience Centre"];
const COMPANY_KIND = ["Works", "Marine", "Optics", "Systems", "Hydraulics"];
const INSTRUMENT_KIND: readonly { word: string; type: string }[] = [
  { word: "sonar", type: "t:Sonar" },
  { word: "echo sounder", type: "t:Sonar" },
  { word: "spectrometer", type: "t:Spectrometer" },
  { word: "fluorometer", type: "t:Spectrometer" },
  { word: "corer", type: "t:Sampler" },
  { word: "grab sampler", type: "t:Sampler" },
];
const TOPICS = [
  "Storm Layers", "Tidal Mixing", "Benthic Fauna", "Pore-Water Chemistry", "Seafloor Roughness", "Kelp Decline",
  "Fjord Circulation", "Nutrient Fluxes", "Sediment Transport", "Acoustic Scattering", "Shoreline Retreat", "Carbon Burial",
];
const ROLES_R = ["geologist", "oceanographer", "ecologist", "geochemist", "biologist", "modeller"];
const ROLES_E = ["instrument engineer", "systems engineer", "electronics technician", "mechanical engineer"];
const ROLES_M = ["deck officer", "bosun", "chief engineer", "able seafarer", "navigator"];

/**
 * The filler records, deterministic for the options. Ids are prefixed `f:` so they never
 * clash with the hand-written core.
 */
export function demoFiller(options: DemoFillerOptions = {}): FillerRecord[] {
  const o = { ...DEFAULTS, ...options };
  const rng = new Rng(o.seed);
  const recs: {
    id: string;
    label: string;
    types: string[];
    aliases?: string[];
    description: string;
    attributes?: Record<string, number | string>;
    relations: Record<string, string[]>;
  }[] = [];
  const byId = new Map<string, (typeof recs)[number]>();
  const add = (id: string, label: string, type: string, description: string, attributes?: Record<string, number | string>, aliases?: string[]) => {
    const r = { id, label, types: [type], description, attributes, aliases, relations: {} as Record<string, string[]> };
    recs.push(r);
    byId.set(id, r);
    return r;
  };
  const rel = (s: string, r: string, t: string) => {
    const rec = byId.get(s)!;
    const list = (rec.relations[r] ??= []);
    if (!list.includes(t) && s !== t) list.push(t);
  };
  const between = (lo: number, hi: number) => lo + rng.int(hi - lo + 1);
  const zipfPick = <T>(xs: readonly T[], s = 0.9): T => xs[rng.zipf(xs.length, s)]!;
  const labelOf = (id: string) => byId.get(id)!.label;
  const taken = new Set<string>();
  /** A label not used before by an entity of the same family (a numeral is added if needed). */
  const fresh = (label: string): string => {
    let l = label;
    for (let k = 2; taken.has(l); k++) l = `${label} (${k})`;
    taken.add(l);
    return l;
  };

  // distinct place roots
  const roots = [...ROOTS];
  const takeRoot = () => roots.splice(rng.int(roots.length), 1)[0]!;

  // towns and sites
  const towns: string[] = [];
  for (let i = 0; i < o.towns; i++) {
    const name = ROOTS[i % ROOTS.length]! + TOWN_SUFFIX[Math.floor(i / ROOTS.length + i) % TOWN_SUFFIX.length]!;
    const id = `f:town:${i + 1}`;
    const kind = i % 3 === 0 ? "fishing village" : i % 3 === 1 ? "market town" : "harbour town";
    add(id, name, "t:Town", `A ${kind} of the outer Velmarra coast.`, { population: between(300, 30000) });
    towns.push(id);
  }
  const sites: string[] = [];
  for (let i = 0; i < o.sites; i++) {
    const root = takeRoot();
    const id = `f:site:${i + 1}`;
    const feature = SITE_FEATURE[i % SITE_FEATURE.length]!;
    const town = towns[rng.int(towns.length)]!;
    add(id, `${root} ${feature}`, "t:FieldSite", `A ${feature.toLowerCase()} studied by consortium crews, off ${labelOf(town)}.`, { depth: between(3, 1800) });
    rel(id, "r:near", town);
    sites.push(id);
  }
  // organisations
  const labs: string[] = [];
  for (let i = 0; i < o.labs; i++) {
    const root = ROOTS[(i * 7 + 3) % ROOTS.length]!;
    const kind = LAB_KIND[i % LAB_KIND.length]!;
    const id = `f:lab:${i + 1}`;
    const town = towns[rng.int(towns.length)]!;
    add(id, `${root} ${kind}`, "t:Lab", `A ${kind.toLowerCase()} of the consortium in ${labelOf(town)}.`, { founded: between(1900, 2015), staff: between(6, 120) });
    rel(id, "r:locatedIn", town);
    rel(id, "r:partnerOf", "org:vbc");
    labs.push(id);
  }
  for (let i = 0; i < 10 && labs.length > 1; i++) rel(labs[rng.int(labs.length)]!, "r:partnerOf", labs[rng.int(labs.length)]!);
  const companies: string[] = [];
  for (let i = 0; i < o.companies; i++) {
    const id = `f:co:${i + 1}`;
    const kind = COMPANY_KIND[i % COMPANY_KIND.length]!;
    const town = towns[rng.int(towns.length)]!;
    add(id, `${SURNAMES[(i * 11 + 5) % SURNAMES.length]} ${kind}`, "t:Company", `A ${kind.toLowerCase()} company in ${labelOf(town)} supplying the fleet.`, { founded: between(1880, 2018) });
    rel(id, "r:locatedIn", town);
    companies.push(id);
  }
  const funders: string[] = [];
  for (let i = 0; i < o.funders; i++) {
    const id = `f:fund:${i + 1}`;
    const town = towns[rng.int(towns.length)]!;
    add(id, `${labelOf(town)} Research Foundation`, "t:Funder", `A foundation in ${labelOf(town)} paying for coastal science.`, { founded: between(1950, 2010) });
    rel(id, "r:locatedIn", town);
    funders.push(id);
  }
  const programmes: string[] = [];
  for (let i = 0; i < o.programmes; i++) {
    const id = `f:prog:${i + 1}`;
    const topic = TOPICS[i % TOPICS.length]!;
    const funder = funders[i % funders.length]!;
    add(id, `${topic} Programme`, "t:Programme", `A funding programme for ${topic.toLowerCase()} research, run by the ${labelOf(funder)}.`, { started: between(2000, 2022), budget: between(1, 9) });
    rel(funder, "r:administers", id);
    programmes.push(id);
  }
  // people
  const person = (i: number) => {
    const g = GIVEN[(i * 5) % GIVEN.length]!;
    const s = SURNAMES[(i * 7 + Math.floor(i / GIVEN.length)) % SURNAMES.length]!;
    return `${g} ${s}`;
  };
  const people: { id: string; kind: "r" | "e" | "m" }[] = [];
  const total = o.researchers + o.engineers + o.mariners;
  const usedNames = new Set<string>();
  for (let i = 0; i < total; i++) {
    const kind = i < o.researchers ? "r" : i < o.researchers + o.engineers ? "e" : "m";
    let name = person(i);
    for (let k = 1; usedNames.has(name); k++) name = person(i + k * 997);
    usedNames.add(name);
    people.push({ id: `f:p:${i + 1}`, kind });
    add(`f:p:${i + 1}`, name, kind === "r" ? "t:Researcher" : kind === "e" ? "t:Engineer" : "t:Mariner", "", { born: between(1945, 2000) });
  }
  // namesakes: the second of each pair takes the first one's name
  for (let k = 0; k < o.namesakePairs; k++) {
    const a = people[k * 17]!;
    const b = people[k * 17 + 90 + k]!;
    byId.get(b.id)!.label = byId.get(a.id)!.label;
  }
  const staff = people.filter((p) => p.kind !== "m").map((p) => p.id);
  const researchers = people.filter((p) => p.kind === "r").map((p) => p.id);
  const engineers = people.filter((p) => p.kind === "e").map((p) => p.id);
  const mariners = people.filter((p) => p.kind === "m").map((p) => p.id);
  for (const p of people) {
    const rec = byId.get(p.id)!;
    const home = towns[rng.int(towns.length)]!;
    rel(p.id, "r:livesIn", home);
    rel(p.id, "r:bornIn", towns[rng.int(towns.length)]!);
    const initials = rec.label.split(" ");
    rec.aliases = [`${initials[0]!.charAt(0)}. ${initials.slice(1).join(" ")}`];
    if (p.kind === "m") {
      rec.description = `A ${ROLES_M[rng.int(ROLES_M.length)]} of the consortium fleet, living in ${labelOf(home)}.`;
    } else {
      const org = p.kind === "e" && rng.next() < 0.4 ? companies[rng.int(companies.length)]! : zipfPick(labs, 0.6);
      rel(p.id, "r:memberOf", org);
      const role = p.kind === "r" ? ROLES_R[rng.int(ROLES_R.length)] : ROLES_E[rng.int(ROLES_E.length)];
      rec.description = `A ${role} at ${labelOf(org)}, living in ${labelOf(home)}.`;
    }
  }
  labs.forEach((l) => rel(researchers[rng.int(researchers.length)]!, "r:directs", l));
  for (let i = 0; i < 60; i++) rel(zipfPick(researchers, 0.7), "r:supervises", researchers[rng.int(researchers.length)]!);
  for (let i = 0; i < 200; i++) rel(staff[rng.int(staff.length)]!, "r:collaboratesWith", zipfPick(staff));
  const corePeople = ["p:jessa-moll", "p:oren-salk", "p:kai-dunleth", "p:yannick-orsa", "p:mira-brenn", "p:linnea-farr", "p:teodor-vask"];
  for (let i = 0; i < 20; i++) rel(staff[rng.int(staff.length)]!, "r:collaboratesWith", corePeople[i % corePeople.length]!);
  // vessels
  const vessels: string[] = [];
  for (let i = 0; i < o.vessels; i++) {
    const id = `f:ves:${i + 1}`;
    const name = i < o.vesselsNamedAfterTowns ? labelOf(towns[(i * 3 + 1) % towns.length]!) : `${GIVEN[(i * 13 + 2) % GIVEN.length]} ${SURNAMES[(i * 3 + 40) % SURNAMES.length]}`;
    const port = towns[rng.int(towns.length)]!;
    const op = labs[rng.int(labs.length)]!;
    const named = i < o.vesselsNamedAfterTowns ? `, named after the town of ${name}` : "";
    add(id, name, "t:Vessel", `A research vessel of the ${labelOf(op)}${named}, sailing from ${labelOf(port)}.`, { built: between(1960, 2022), tonnage: between(90, 4000), length: between(18, 95) }, [`RV ${name}`]);
    rel(id, "r:homePort", port);
    rel(id, "r:operatedBy", op);
    if (rng.next() < 0.6) rel(id, "r:manufacturedBy", companies[rng.int(companies.length)]!);
    rel(mariners[i % mariners.length]!, "r:captains", id);
    vessels.push(id);
  }
  mariners.slice(o.vessels).forEach((m) => {
    rel(m, "r:crewOn", zipfPick(vessels, 0.5));
    if (rng.next() < 0.4) rel(m, "r:crewOn", vessels[rng.int(vessels.length)]!);
  });
  // instruments
  const instruments: string[] = [];
  const projectLabels: string[] = [];
  for (let i = 0; i < o.projects; i++) {
    const r = ROOTS[(i * 5 + 1) % ROOTS.length]!.toUpperCase();
    projectLabels.push(i % 2 === 0 ? `${r}${["MAP", "EX", "FLUX", "OBS", "TRAC"][i % 5]}` : `Project ${ROOTS[(i * 5 + 1) % ROOTS.length]} ${["Bay", "Sound", "Reach", "Firth"][i % 4]}`);
  }
  for (let i = 0; i < o.instruments; i++) {
    const id = `f:ins:${i + 1}`;
    const kind = INSTRUMENT_KIND[i % INSTRUMENT_KIND.length]!;
    const maker = companies[rng.int(companies.length)]!;
    const shareWith = i < o.projectsSharingInstrumentLabel ? projectLabels[i * 2] : undefined;
    const label = shareWith ?? `${ROOTS[(i * 11 + 7) % ROOTS.length]}-${between(2, 40)} ${kind.word}`;
    add(id, label, kind.type, `A ${kind.word} made by ${labelOf(maker)}${shareWith ? `; an instrument, not the project of the same name` : ""}.`, { built: between(1975, 2024), serial: `${label.slice(0, 2).toUpperCase()}-${between(100, 999)}` });
    rel(id, "r:manufacturedBy", maker);
    rel(id, "r:carriedAboard", zipfPick(vessels, 0.6));
    rel(zipfPick(engineers, 0.8), "r:designed", id);
    instruments.push(id);
  }
  // projects
  const projects: string[] = [];
  for (let i = 0; i < o.projects; i++) {
    const id = `f:proj:${i + 1}`;
    const topic = TOPICS[(i * 7) % TOPICS.length]!;
    const site = sites[rng.int(sites.length)]!;
    add(id, projectLabels[i]!, "t:Project", `A project on ${topic.toLowerCase()} at ${labelOf(site)}${i < o.projectsSharingInstrumentLabel * 2 && i % 2 === 0 ? "; not the instrument of the same name" : ""}.`, { started: between(2000, 2024) });
    rel(id, "r:studies", site);
    if (rng.next() < 0.5) rel(id, "r:studies", sites[rng.int(sites.length)]!);
    rel(id, "r:fundedBy", zipfPick(programmes, 0.7));
    if (rng.next() < 0.4) rel(id, "r:fundedBy", programmes[rng.int(programmes.length)]!);
    for (let k = between(1, 3); k > 0; k--) rel(id, "r:uses", instruments[rng.int(instruments.length)]!);
    rel(researchers[rng.int(researchers.length)]!, "r:leads", id);
    projects.push(id);
  }
  for (const p of staff) for (let k = between(1, 3); k > 0; k--) rel(p, "r:worksOn", zipfPick(projects, 0.9));
  // events
  const cruises: string[] = [];
  for (let i = 0; i < o.cruises; i++) {
    const id = `f:cr:${i + 1}`;
    const site = sites[rng.int(sites.length)]!;
    const year = between(2005, 2024);
    add(id, fresh(`${labelOf(site).split(" ")[0]} Cruise ${year}`), "t:Cruise", `A research cruise to ${labelOf(site)} in ${year}.`, { year });
    rel(id, "r:visited", site);
    if (rng.next() < 0.5) rel(id, "r:visited", sites[rng.int(sites.length)]!);
    rel(id, "r:sailedAboard", vessels[rng.int(vessels.length)]!);
    rel(id, "r:partOf", zipfPick(projects, 0.7));
    cruises.push(id);
  }
  const workshops: string[] = [];
  for (let i = 0; i < o.workshops; i++) {
    const id = `f:ws:${i + 1}`;
    const town = towns[rng.int(towns.length)]!;
    const year = between(2008, 2025);
    const topic = TOPICS[(i * 5 + 2) % TOPICS.length]!;
    add(id, `${labelOf(town)} ${topic} Meeting ${year}`, "t:Workshop", `A meeting on ${topic.toLowerCase()} held in ${labelOf(town)} in ${year}.`, { year });
    rel(id, "r:heldIn", town);
    rel(id, "r:hostedBy", labs[rng.int(labs.length)]!);
    workshops.push(id);
  }
  for (const e of [...cruises, ...workshops]) for (let k = between(3, 8); k > 0; k--) rel(people[rng.int(people.length)]!.id, "r:participatedIn", e);
  // publications
  const pubs: string[] = [];
  for (let i = 0; i < o.publications; i++) {
    const id = `f:pub:${i + 1}`;
    const proj = zipfPick(projects, 0.8);
    const topic = TOPICS[rng.int(TOPICS.length)]!;
    const site = byId.get(proj)!.relations["r:studies"]![0]!;
    const report = i % 3 === 0;
    const label = fresh(`${topic} at ${labelOf(site)}`);
    add(id, label, report ? "t:Report" : "t:Article", `A ${report ? "report" : "journal article"} on ${topic.toLowerCase()} from the ${labelOf(proj)} project.`, { year: between(2003, 2025) });
    rel(id, "r:reportsOn", proj);
    for (let k = between(1, 4); k > 0; k--) rel(zipfPick(staff, 0.7), "r:authored", id);
    if (pubs.length > 0) for (let k = between(0, 4); k > 0; k--) rel(id, "r:cites", zipfPick(pubs, 1.0));
    pubs.push(id);
  }
  // datasets
  for (let i = 0; i < o.datasets; i++) {
    const id = `f:ds:${i + 1}`;
    const proj = projects[i % projects.length]!;
    const ins = byId.get(proj)!.relations["r:uses"]![0]!;
    add(id, `${labelOf(proj).replace(/^Project /, "")} data series ${i + 1}`, "t:Dataset", `Measurements recorded with the ${labelOf(ins)} for ${labelOf(proj)}.`, { year: between(2005, 2025) });
    rel(proj, "r:produced", id);
    rel(id, "r:recordedWith", ins);
  }
  return recs.map((r) => {
    const out: FillerRecord = {
      id: r.id,
      label: r.label,
      types: r.types,
      ...(r.aliases ? { aliases: r.aliases } : {}),
      description: r.description,
      ...(r.attributes ? { attributes: r.attributes } : {}),
      ...(Object.keys(r.relations).length ? { relations: r.relations } : {}),
    };
    return out;
  });
}

/** The filler as JSONL text (one record per line, keys in a fixed order). */
export function demoFillerJsonl(options: DemoFillerOptions = {}): string {
  return demoFiller(options).map((r) => JSON.stringify(r)).join("\n") + "\n";
}
