/**
 * Debian binary package index → tiepoint catalog (a tool; an outside, real open catalog for
 * benchmarks and evaluations).
 *
 * Input: a `Packages` file of a Debian archive (on Debian 12 "bookworm":
 * `/var/lib/apt/lists/*_Packages.lz4`, or `apt-cache dumpavail`): stanzas of RFC 822-style
 * fields separated by blank lines, continuation lines starting with a space (Debian Policy
 * §5.1 "Syntax of control files"; the fields are those of §5.3 "Binary package control
 * files"; relationship fields follow §7.1 "Syntax of relationship fields").
 *
 * Output: RDF 1.1 N-Triples in tiepoint's RDF mapping (README "RDF") plus a JSON Lines
 * declaration of the one numeric attribute's unit (the N-Triples mapping has no unit):
 * - each package is an entity (type `package`), labelled by its name, described by the
 *   first line of its Description (the synopsis, Policy §5.6.13);
 * - `Installed-Size` (Policy §5.6.20: "an estimate of the total amount of disk space
 *   required to install the named package", in kibibytes) is the numeric attribute
 *   `installed size`, unit `kibibytes`;
 * - `Section` → edge `in section` to a section entity, `Priority` → edge `has priority` to a
 *   priority entity, `Maintainer` → edge `maintained by` to a maintainer entity (keyed by
 *   e-mail address, labelled by name), `Architecture` → edge `built for` to an architecture
 *   entity (`all` is labelled "architecture-independent", its meaning in Policy §5.6.8, so
 *   the English word "all" links to nothing), `Homepage` → the text attribute `homepage`;
 * - `Depends`, `Pre-Depends`, `Recommends`, `Suggests`, `Provides` → edges `depends on`,
 *   `pre-depends on`, `recommends`, `suggests`, `provides`; an alternative `a | b` gives an
 *   edge to each; version constraints `(>= 1.2)`, architecture qualifiers (`:any`, Policy
 *   §7.1 / Multi-Arch) and restriction lists are stripped;
 * - a name that is only referred to (a virtual package, Policy §7.5, or one missing from
 *   the index) becomes an entity of type `virtual package`.
 *
 * Usage: `node dist/eval/debian-packages.js [--in FILE] --out DIR` writes
 * `DIR/debian-packages.nt` and `DIR/debian-declarations.jsonl` (load both with
 * `tiepoint load DIR/debian-packages.nt DIR/debian-declarations.jsonl --db PATH`). FILE may be
 * plain, `.gz` or `.lz4` (through `lz4cat`); the default is the apt list of this machine.
 * `--slice N --seed S --out FILE.gz` instead writes the raw stanzas of a dependency-closed
 * subset of about N packages (see {@link sliceStanzas}).
 */
import { execFileSync } from "node:child_process";
import { existsSync, mkdirSync, readdirSync, readFileSync, writeFileSync } from "node:fs";
import { join, resolve } from "node:path";
import { fileURLToPath } from "node:url";
import { gunzipSync, gzipSync } from "node:zlib";
import { Rng } from "../gen/index.js";

/** Converter options; all optional. */
export const DEFAULTS = {
  /** Where the apt lists of this machine live (Debian's default `Dir::State::Lists`). */
  aptLists: "/var/lib/apt/lists",
  /** IRI prefix of everything the converter names (an invented, non-resolving URN namespace). */
  base: "urn:x-debian:",
  /** The unit of `Installed-Size` (Debian Policy §5.6.20: kibibytes). */
  sizeUnit: "kibibytes",
  /** Slice: seed of the package choice. */
  sliceSeed: 1,
};

/** One stanza: field name (as written) → value (continuation lines joined with "\n"). */
export type Stanza = ReadonlyMap<string, string>;

/** The relationship fields converted, with the relation's label and aliases. */
export const RELATIONS = [
  { field: "Depends", key: "depends", label: "depends on", aliases: ["requires", "needs"] },
  { field: "Pre-Depends", key: "pre-depends", label: "pre-depends on", aliases: [] },
  { field: "Recommends", key: "recommends", label: "recommends", aliases: [] },
  { field: "Suggests", key: "suggests", label: "suggests", aliases: [] },
  { field: "Provides", key: "provides", label: "provides", aliases: [] },
] as const;

/** Single-valued fields whose value names an entity: the relation to it, and its key and label. */
const VALUE_FIELDS: readonly { field: string; kind: string; relation: string; read: (v: string) => { key: string; label: string } }[] = [
  { field: "Architecture", kind: "architecture", relation: "built for", read: (v) => ({ key: v, label: v === "all" ? "architecture-independent" : v }) },
  { field: "Section", kind: "section", relation: "in section", read: (v) => ({ key: v, label: v }) },
  { field: "Priority", kind: "priority", relation: "has priority", read: (v) => ({ key: v, label: v }) },
  {
    field: "Maintainer",
    kind: "maintainer",
    relation: "maintained by",
    read: (v) => {
      const m = parseMaintainer(v);
      return { key: m.email, label: m.name };
    },
  },
];

/**
 * Splits Packages text into stanzas (Debian Policy §5.1): fields `Name: value`, a line
 * starting with space or tab continues the previous field, blank lines separate stanzas.
 * A line that is neither is an error naming its line.
 */
export function parseStanzas(text: string, file = "<input>"): Stanza[] {
  const out: Stanza[] = [];
  let cur = new Map<string, string>();
  let last: string | null = null;
  const lines = text.split("\n");
  for (let i = 0; i < lines.length; i++) {
    const line = lines[i]!.replace(/\r$/, "");
    if (line.trim() === "") {
      if (cur.size > 0) out.push(cur);
      cur = new Map();
      last = null;
      continue;
    }
    if (line[0] === " " || line[0] === "\t") {
      if (last === null) throw new Error(`${file}:${i + 1}: a continuation line with no field before it`);
      cur.set(last, `${cur.get(last)!}\n${line.slice(1)}`);
      continue;
    }
    const colon = line.indexOf(":");
    if (colon <= 0) throw new Error(`${file}:${i + 1}: expected "Field: value"`);
    last = line.slice(0, colon);
    cur.set(last, line.slice(colon + 1).trim());
  }
  if (cur.size > 0) out.push(cur);
  return out;
}

/**
 * The package names of a relationship field (Policy §7.1): comma-separated groups of
 * `|`-separated alternatives; each name without its version constraint `(op version)`,
 * architecture qualifier `:arch` / `:any`, architecture list `[…]` and restriction list `<…>`.
 * Duplicates are dropped, order kept.
 */
export function relationNames(value: string): string[] {
  const names: string[] = [];
  for (const group of value.split(",")) {
    for (const alt of group.split("|")) {
      const name = alt
        .replace(/\([^)]*\)/g, " ")
        .replace(/\[[^\]]*\]/g, " ")
        .replace(/<[^>]*>/g, " ")
        .trim()
        .split(/\s+/)[0]!
        .replace(/:[a-z0-9-]+$/, "");
      if (name !== "" && !names.includes(name)) names.push(name);
    }
  }
  return names;
}

/** `Name <address>` (RFC 5322 name-addr, as Policy §5.6.2 asks) → its parts. */
export function parseMaintainer(value: string): { name: string; email: string } {
  const m = /^(.*?)\s*<([^>]*)>\s*$/.exec(value.trim());
  if (!m) return { name: value.trim(), email: value.trim().toLowerCase() };
  const name = m[1]!.replace(/^"(.*)"$/, "$1").trim();
  return { name: name === "" ? m[2]!.trim() : name, email: m[2]!.trim().toLowerCase() };
}

/** Escapes a string for an N-Triples literal (RDF 1.1 N-Triples §2.4 ECHAR). */
function lit(s: string): string {
  return `"${s.replace(/\\/g, "\\\\").replace(/"/g, '\\"').replace(/\n/g, "\\n").replace(/\r/g, "\\r")}"`;
}

/** An IRI-safe local name: characters outside RFC 3987's unreserved set percent-encoded. */
function local(s: string): string {
  return encodeURIComponent(s).replace(/[!'()*]/g, (c) => `%${c.charCodeAt(0).toString(16).toUpperCase()}`);
}

const RDF_TYPE = "<http://www.w3.org/1999/02/22-rdf-syntax-ns#type>";
const LABEL = "<http://www.w3.org/2000/01/rdf-schema#label>";
const ALT = "<http://www.w3.org/2004/02/skos/core#altLabel>";
const COMMENT = "<http://www.w3.org/2000/01/rdf-schema#comment>";
const XSD_INTEGER = "<http://www.w3.org/2001/XMLSchema#integer>";

/** The IRIs the converter gives to things, so tests and tools can name them. */
export function debianIris(base = DEFAULTS.base) {
  const iri = (kind: string, name: string) => `${base}${kind}:${local(name)}`;
  return {
    package: (name: string) => iri("package", name),
    /** The entity a value field names (`section`, `priority`, `maintainer` by e-mail, `architecture`). */
    value: (kind: string, key: string) => iri(kind, key),
    schema: (name: string) => iri("schema", name),
  };
}

/** What {@link stanzasToNTriples} produced. */
export interface DebianCatalog {
  /** N-Triples text, one triple a line. */
  readonly nt: string;
  /** JSON Lines declarations (the attribute's unit). */
  readonly declarations: string;
  /** Counts, for reports. */
  readonly triples: number;
  readonly packages: number;
  readonly virtualPackages: number;
  readonly sized: number;
}

/**
 * Converts Packages text (or parsed stanzas) to N-Triples + declarations (see the header for
 * the mapping). A package listed twice (two versions) is merged: the first stanza's label,
 * description and size win, relations are united.
 */
export function stanzasToNTriples(input: string | readonly Stanza[], base = DEFAULTS.base): DebianCatalog {
  const stanzas = typeof input === "string" ? parseStanzas(input) : input;
  const I = debianIris(base);
  const out: string[] = [];
  const t = (s: string, p: string, o: string) => out.push(`<${s}> ${p} ${o} .`);
  const rel = (key: string) => `<${I.schema(key)}>`;
  // schema: types, relations, the attribute
  const types = { package: "package", virtual: "virtual package", section: "archive section", priority: "priority level", maintainer: "maintainer", architecture: "architecture" };
  for (const [k, label] of Object.entries(types)) t(I.schema(`type-${k}`), LABEL, lit(label));
  for (const r of RELATIONS) {
    t(I.schema(r.key), LABEL, lit(r.label));
    for (const a of r.aliases) t(I.schema(r.key), ALT, lit(a));
  }
  for (const f of VALUE_FIELDS) t(I.schema(f.kind), LABEL, lit(f.relation));
  const size = I.schema("installed-size");
  t(size, LABEL, lit("installed size"));
  const homepage = I.schema("homepage");
  t(homepage, LABEL, lit("homepage"));

  const real = new Set<string>();
  for (const s of stanzas) {
    const name = s.get("Package");
    if (name !== undefined) real.add(name);
  }
  const seen = new Set<string>();
  const referred = new Set<string>();
  /** Per value field: key → label of the entities it names. */
  const values = new Map(VALUE_FIELDS.map((f) => [f.kind, new Map<string, string>()]));
  let sized = 0;
  for (const s of stanzas) {
    const name = s.get("Package");
    if (name === undefined) continue;
    const p = I.package(name);
    const first = !seen.has(name);
    seen.add(name);
    if (first) {
      t(p, RDF_TYPE, `<${I.schema("type-package")}>`);
      t(p, LABEL, lit(name));
      const desc = s.get("Description");
      if (desc !== undefined) {
        const synopsis = desc.split("\n")[0]!.trim();
        if (synopsis !== "") t(p, COMMENT, lit(synopsis));
      }
      const kib = s.get("Installed-Size");
      if (kib !== undefined && /^\d+$/.test(kib.trim())) {
        t(p, `<${size}>`, `${lit(kib.trim())}^^${XSD_INTEGER}`);
        sized++;
      }
      const home = s.get("Homepage");
      if (home !== undefined && home.trim() !== "") t(p, `<${homepage}>`, lit(home.trim()));
    }
    for (const f of VALUE_FIELDS) {
      const v = s.get(f.field)?.trim();
      if (v === undefined || v === "") continue;
      const { key, label } = f.read(v);
      const seenOf = values.get(f.kind)!;
      if (!seenOf.has(key)) seenOf.set(key, label);
      t(p, rel(f.kind), `<${I.value(f.kind, key)}>`);
    }
    for (const r of RELATIONS) {
      const v = s.get(r.field);
      if (v === undefined) continue;
      for (const target of relationNames(v)) {
        if (target === name) continue;
        if (!real.has(target)) referred.add(target);
        t(p, rel(r.key), `<${I.package(target)}>`);
      }
    }
  }
  for (const v of referred) {
    t(I.package(v), RDF_TYPE, `<${I.schema("type-virtual")}>`);
    t(I.package(v), LABEL, lit(v));
  }
  for (const f of VALUE_FIELDS) {
    for (const [key, label] of values.get(f.kind)!) {
      t(I.value(f.kind, key), RDF_TYPE, `<${I.schema(`type-${f.kind}`)}>`);
      t(I.value(f.kind, key), LABEL, lit(label));
    }
  }
  const declarations = `${JSON.stringify({ kind: "attribute", id: size, label: "installed size", unit: DEFAULTS.sizeUnit, description: "Installed-Size: disk space the installed package takes (Debian Policy 5.6.20)" })}\n`;
  return { nt: `${out.join("\n")}\n`, declarations, triples: out.length, packages: seen.size, virtualPackages: referred.size, sized };
}

/**
 * A dependency-closed subset of about `target` packages, chosen by a seeded rule: packages
 * are drawn in a seeded random order (xoshiro128**, gen/random.ts; Fisher–Yates shuffle), and each drawn package is added with the
 * closure of its `Depends` and `Pre-Depends` (every alternative that is a real package), until
 * the subset holds `target` packages or more. Returns the chosen stanzas in index order.
 */
export function sliceStanzas(stanzas: readonly Stanza[], target: number, seed = DEFAULTS.sliceSeed): Stanza[] {
  const byName = new Map<string, number>();
  stanzas.forEach((s, i) => {
    const n = s.get("Package");
    if (n !== undefined && !byName.has(n)) byName.set(n, i);
  });
  const rng = new Rng(seed);
  const order = [...byName.values()];
  for (let i = order.length - 1; i > 0; i--) {
    const j = rng.int(i + 1);
    [order[i], order[j]] = [order[j]!, order[i]!];
  }
  const chosen = new Set<number>();
  for (const start of order) {
    if (chosen.size >= target) break;
    const stack = [start];
    while (stack.length > 0) {
      const i = stack.pop()!;
      if (chosen.has(i)) continue;
      chosen.add(i);
      const s = stanzas[i]!;
      for (const f of ["Depends", "Pre-Depends"]) {
        const v = s.get(f);
        if (v === undefined) continue;
        for (const n of relationNames(v)) {
          const j = byName.get(n);
          if (j !== undefined && !chosen.has(j)) stack.push(j);
        }
      }
    }
  }
  return [...chosen].sort((a, b) => a - b).map((i) => stanzas[i]!);
}

/** Stanzas back to Packages text (fields in their original order). */
export function formatStanzas(stanzas: readonly Stanza[]): string {
  return stanzas.map((s) => [...s].map(([k, v]) => `${k}: ${v.replace(/\n/g, "\n ")}`).join("\n")).join("\n\n") + "\n";
}

/** The Packages file(s) of this machine's apt lists (the main binary index first). */
export function defaultPackagesFile(dir = DEFAULTS.aptLists): string | null {
  if (!existsSync(dir)) return null;
  const files = readdirSync(dir).filter((f) => /_Packages(\.lz4|\.gz)?$/.test(f)).sort((a, b) => Number(b.includes("_main_")) - Number(a.includes("_main_")) || a.localeCompare(b));
  return files.length > 0 ? join(dir, files[0]!) : null;
}

/** Reads a Packages file: plain, `.gz` (zlib) or `.lz4` (through the `lz4cat` program). */
export function readPackagesText(file: string): string {
  if (file.endsWith(".lz4")) return execFileSync("lz4cat", [file], { maxBuffer: 1 << 30 }).toString("utf8");
  const buf = readFileSync(file);
  return (file.endsWith(".gz") ? gunzipSync(buf) : buf).toString("utf8");
}

function main(argv: readonly string[]): void {
  const opt = (name: string): string | undefined => {
    const i = argv.indexOf(name);
    return i >= 0 ? argv[i + 1] : undefined;
  };
  const input = opt("--in") ?? defaultPackagesFile();
  const out = opt("--out");
  if (input === null || out === undefined) {
    process.stderr.write("usage: debian-packages [--in Packages[.gz|.lz4]] --out DIR | --slice N [--seed S] --out FILE.gz\n");
    process.exit(2);
  }
  const text = readPackagesText(input);
  const stanzas = parseStanzas(text, input);
  const slice = opt("--slice");
  if (slice !== undefined) {
    const chosen = sliceStanzas(stanzas, Number(slice), Number(opt("--seed") ?? DEFAULTS.sliceSeed));
    writeFileSync(out, gzipSync(formatStanzas(chosen), { level: 9 }));
    process.stderr.write(`${chosen.length} of ${stanzas.length} stanzas → ${out}\n`);
    return;
  }
  const c = stanzasToNTriples(stanzas);
  mkdirSync(out, { recursive: true });
  writeFileSync(join(out, "debian-packages.nt"), c.nt);
  writeFileSync(join(out, "debian-declarations.jsonl"), c.declarations);
  process.stderr.write(`${c.packages} packages (${c.sized} with an installed size), ${c.virtualPackages} virtual, ${c.triples} triples → ${out}\n`);
}

if (process.argv[1] !== undefined && resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  try {
    main(process.argv.slice(2));
  } catch (e) {
    process.stderr.write(`debian-packages: ${(e as Error).message}\n`);
    process.exit(1);
  }
}
