/**
 * `tiepoint load`, `show` and `stats` through the real CLI (spawned `node dist/cli/main.js`):
 * every bad input of issue 2 ends in `FILE:LINE: message` lines on stderr, exit status 1,
 * and a catalog that is row-for-row unchanged; bad catalog files give one-line messages.
 * Needs a build (`npm test` builds first; otherwise this file builds once when dist is missing).
 */
import { spawnSync, execFileSync } from "node:child_process";
import { chmodSync, copyFileSync, existsSync, mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import Database from "better-sqlite3";
import { beforeAll, describe, expect, it } from "vitest";
import { dumpCatalog, integrity } from "./catalog-dump.js";
import { ensureBuilt, MAIN } from "./reliability-cli.js";

let dir = "";
let base = ""; // a catalog with some content, copied per test

/** A half-written dist/ (another build running at the same moment) fails at module load. */
const BUILD_IN_FLUX = /SyntaxError: The requested module|ERR_MODULE_NOT_FOUND|Cannot find module/;

function tp(...args: string[]): { status: number | null; stdout: string; stderr: string } {
  for (let attempt = 0; ; attempt++) {
    const r = spawnSync(process.execPath, [MAIN, ...args], { cwd: dir, encoding: "utf8", env: { ...process.env, TIEPOINT_DEBUG: "" } });
    // only a module-load failure of the build itself is retried, never tiepoint's own output
    if (attempt < 5 && BUILD_IN_FLUX.test(r.stderr)) {
      spawnSync("sleep", ["2"]);
      continue;
    }
    return { status: r.status, stdout: r.stdout, stderr: r.stderr };
  }
}

function write(name: string, content: string | Buffer): string {
  const f = join(dir, name);
  writeFileSync(f, content);
  return name;
}

let n = 0;
function freshCopy(): string {
  const db = `copy${++n}.db`;
  copyFileSync(base, join(dir, db));
  return db;
}

beforeAll(() => {
  ensureBuilt();
  dir = mkdtempSync(join(tmpdir(), "tp-cli-"));
  write(
    "seed.jsonl",
    [
      '{"kind":"relation","id":"r:dockedAt","label":"docked at"}',
      '{"kind":"type","id":"t:Boat","label":"boat"}',
      '{"id":"b:wren","label":"Wren","types":["t:Boat"],"relations":{"r:dockedAt":["q:east"]}}',
      '{"id":"q:east","label":"East Quay"}',
      '{"id":"q:west","label":"West Quay"}',
      '{"id":"p:lamp","label":"East Quay"}',
      "",
    ].join("\n"),
  );
  const r = tp("load", "seed.jsonl", "--db", "base.db");
  expect(r.stderr).toMatch(/loaded 1 file/);
  expect(r.status).toBe(0);
  base = join(dir, "base.db");
  // fold the WAL into the main file so copies carry everything
  const db = new Database(base);
  db.pragma("wal_checkpoint(TRUNCATE)");
  db.close();
});

interface BadCase {
  readonly name: string;
  readonly files: Record<string, string | Buffer>;
  /** Expected first stderr line. */
  readonly first: RegExp;
}

const LONG = "x".repeat((1 << 20) + 10);
const CASES: BadCase[] = [
  { name: "N-Triples syntax error", files: { "a.nt": "<s:1> <p:1> <o:1> .\n<s:1> <p:1> .\n" }, first: /^a\.nt:2: syntax error: / },
  { name: "Turtle syntax error", files: { "a.ttl": "@prefix q: <q:> .\nq:a q:b q:c\nq:d q:e q:f .\n" }, first: /^a\.ttl:3: syntax error: / },
  { name: "JSON Lines syntax error", files: { "a.jsonl": '{"id":"x"}\n{"id": "y"\n' }, first: /^a\.jsonl:2: invalid JSON: .*expected one JSON object per line/ },
  { name: "CSV syntax error (stray quote)", files: { "a.csv": 'id,label\nx,"unterminated\n' }, first: /^a\.csv:2: CSV syntax error in the record starting here: / },
  { name: "unknown file", files: {}, first: /^missing\.nt:1: cannot read the file: no such file$/ },
  { name: "unknown extension", files: { "a.xml": "<rdf/>\n" }, first: /^a\.xml:1: unknown file extension "\.xml" \(expected \.nt, \.ttl, \.jsonl, \.csv or \.tsv\)$/ },
  { name: "a directory instead of a file", files: {}, first: /^sub:1: is a directory, expected a file$/ },
  { name: "CSV missing required columns", files: { "a.csv": "subject,object\ns,o\n" }, first: /^a\.csv:1: missing required column relation/ },
  { name: "CSV header with neither layout", files: { "a.csv": "name,label\nx,y\n" }, first: /^a\.csv:1: missing required columns: expected a column "id"/ },
  { name: "CSV edge row with a missing value", files: { "a.csv": "subject,relation,object\nb:wren,r:dockedAt\n" }, first: /^a\.csv:2: missing value for object/ },
  { name: "TSV unknown edge endpoint", files: { "a.tsv": "subject\trelation\tobject\nb:wren\tr:dockedAt\tq:nowhere\n" }, first: /^a\.tsv:2: unknown entity "q:nowhere"/ },
  { name: "JSON Lines unknown edge endpoint", files: { "a.jsonl": '{"subject":"b:ghost","relation":"r:dockedAt","object":"q:west"}\n' }, first: /^a\.jsonl:1: unknown entity "b:ghost"/ },
  { name: "invalid UTF-8 (a lone continuation byte)", files: { "a.nt": Buffer.concat([Buffer.from('<s:1> <p:1> "ok" .\n<s:1> <p:1> "bad'), Buffer.from([0x80]), Buffer.from('" .\n')]) }, first: /^a\.nt:2: not valid UTF-8: invalid UTF-8 at byte 17 of the line$/ },
  { name: "invalid UTF-8 in CSV (overlong encoding C0 AF)", files: { "a.csv": Buffer.concat([Buffer.from("id,label\nx,"), Buffer.from([0xc0, 0xaf]), Buffer.from("\n")]) }, first: /^a\.csv:2: not valid UTF-8/ },
  { name: "empty label in JSON Lines", files: { "a.jsonl": '{"id":"x","label":""}\n' }, first: /^a\.jsonl:1: empty label/ },
  { name: "empty label in CSV", files: { "a.csv": "id,label\nx,\n" }, first: /^a\.csv:2: empty label/ },
  { name: "empty label in N-Triples", files: { "a.nt": '<s:1> <http://www.w3.org/2000/01/rdf-schema#label> "" .\n' }, first: /^a\.nt:1: empty label/ },
  { name: "over-long line (limit 1 MiB)", files: { "a.jsonl": `{"id":"ok"}\n{"id":"${LONG}"}\n{"id":"ok2"}\n` }, first: /^a\.jsonl:2: line longer than 1048576 bytes$/ },
];

describe("tiepoint load: bad input leaves the catalog unchanged", () => {
  for (const c of CASES) {
    it(`${c.name}: FILE:LINE: message, exit 1, catalog unchanged`, () => {
      const db = freshCopy();
      const before = dumpCatalog(join(dir, db));
      for (const [name, content] of Object.entries(c.files)) write(name, content);
      const names = Object.keys(c.files);
      if (c.name === "unknown file") names.push("missing.nt");
      if (c.name.startsWith("a directory")) {
        execFileSync("mkdir", ["-p", join(dir, "sub")]);
        names.push("sub");
      }
      // a good file in the same call must not land either
      write("good.jsonl", '{"id":"g:new","label":"Brand New"}\n');
      const r = tp("load", "good.jsonl", ...names, "--db", db);
      expect(r.status, r.stderr).toBe(1);
      const lines = r.stderr.trimEnd().split("\n");
      expect(lines[0], r.stderr.slice(0, 2000)).toMatch(c.first);
      expect(r.stderr).not.toMatch(/at .*\.js:\d+|internal error/);
      expect(dumpCatalog(join(dir, db))).toBe(before);
    });
  }

  it("collects many errors in one run, in file and line order, each FILE:LINE:", () => {
    const db = freshCopy();
    const before = dumpCatalog(join(dir, db));
    write("m.nt", ["<a:1> <p:1> .", "<a:1> <p:1> <a:2> .", "<a:1> <p:1> <a:2>", "oops", ""].join("\n"));
    write("m.jsonl", '{"id":""}\n{"id":"x","label":""}\n');
    const r = tp("load", "m.nt", "m.jsonl", "--db", db);
    expect(r.status).toBe(1);
    const lines = r.stderr.trimEnd().split("\n");
    expect(lines.slice(0, -1).map((l) => l.replace(/: .*/, ""))).toEqual(["m.nt:1", "m.nt:3", "m.nt:4", "m.jsonl:1", "m.jsonl:2"]);
    expect(lines.at(-1)).toBe("5 errors; nothing was loaded");
    expect(dumpCatalog(join(dir, db))).toBe(before);
  });

  it("stops after 50 errors", () => {
    const db = freshCopy();
    write("many.jsonl", "{\n".repeat(120));
    const r = tp("load", "many.jsonl", "--db", db);
    expect(r.status).toBe(1);
    const lines = r.stderr.trimEnd().split("\n");
    expect(lines).toHaveLength(51);
    expect(lines[49]).toMatch(/^many\.jsonl:50: invalid JSON/);
    expect(lines[50]).toBe("stopped after 50 errors; nothing was loaded");
  });

  it("a failed first load leaves no catalog file behind", () => {
    write("bad.jsonl", "nope\n");
    const r = tp("load", "bad.jsonl", "--db", "never.db");
    expect(r.status).toBe(1);
    expect(existsSync(join(dir, "never.db"))).toBe(false);
  });
});

describe("tiepoint load: adding, replacing", () => {
  it("loading adds to a catalog; --replace starts fresh in the same transaction", () => {
    const db = freshCopy();
    write("add.jsonl", '{"id":"g:x","label":"Gantry"}\n');
    const add = tp("load", "add.jsonl", "--db", db);
    expect(add.status, add.stderr).toBe(0);
    let r = tp("show", "b:wren", "--db", db);
    expect(r.status, r.stderr).toBe(0);
    expect(tp("show", "Gantry", "--db", db).stdout).toMatch(/^Gantry {2}\[g:x\]/);
    const rep = tp("load", "add.jsonl", "--replace", "--db", db);
    expect(rep.status, rep.stderr).toBe(0);
    r = tp("show", "b:wren", "--db", db);
    expect(r.status).toBe(1);
    expect(r.stderr).toBe('tiepoint: no entity with id or label "b:wren"\n');
    expect(integrity(join(dir, db))).toBe("ok");
  });
});

describe("tiepoint show and stats", () => {
  it("show prints labels, types and relations in both directions", () => {
    const r = tp("show", "b:wren", "--db", "base.db");
    expect(r.status, r.stderr).toBe(0);
    expect(r.stdout).toContain("Wren  [b:wren]");
    expect(r.stdout).toContain("types:       boat [t:Boat]");
    expect(r.stdout).toContain("—docked at→ East Quay [q:east]");
    const q = tp("show", "q:east", "--db", "base.db");
    expect(q.stdout).toContain("←docked at— Wren [b:wren]");
  });

  it("an ambiguous label lists the candidates with ids and types, exit 1", () => {
    const r = tp("show", "East Quay", "--db", "base.db");
    expect(r.status, r.stderr).toBe(1);
    expect(r.stderr.split("\n").slice(0, 3)).toEqual(['"East Quay" names 2 entities; give one of these ids:', "  p:lamp  East Quay", "  q:east  East Quay"]);
  });

  it("stats: counts, degree summary and components (hand-computed for the seed file)", () => {
    const r = tp("stats", "--db", "base.db", "--json");
    expect(r.status, r.stderr).toBe(0);
    const s = JSON.parse(r.stdout);
    // entities: t:Boat, b:wren, q:east, q:west, p:lamp = 5; one edge wren→east
    expect(s.counts.entities).toBe(5);
    expect(s.counts.edges).toBe(1);
    // the type t:Boat has no edges: not a node of the relation graph (issue 18)
    // degrees of wren, east, west, lamp sorted: 0,0,1,1 → min 0, median (nearest rank 2) 0, p99 (rank 4) 1, max 1
    expect(s.degree).toMatchObject({ min: 0, median: 0, p99: 1, max: 1, mean: 0.5 });
    // components: {wren, east}, {west}, {lamp} = 3 (type links are not edges); without edges: west, lamp
    expect(s.components).toBe(3);
    expect(s.largestComponent).toBe(2);
    expect(s.isolated).toBe(2);
    expect(s.hubs.map((h: { id: string }) => h.id)).toEqual(["b:wren", "q:east"]);
    // per type, per relation, shared names (East Quay: q:east and p:lamp), no empty type
    expect(s.types).toEqual([{ id: "t:Boat", label: "boat", members: 1, withSubtypes: 1 }]);
    expect(s.relations).toEqual([{ id: "r:dockedAt", label: "docked at", edges: 1 }]);
    expect(s.sharedNames).toEqual({ count: 1, top: [{ name: "East Quay", entities: 2 }] });
    expect(s.emptyTypes).toEqual([]);
  });
});

describe("bad catalog files: one line, exit 1, nothing corrupted", () => {
  it("a file that is not SQLite", () => {
    write("junk.db", "this is not a database\n".repeat(100));
    const before = readFileSync(join(dir, "junk.db"));
    for (const args of [["show", "x", "--db", "junk.db"], ["stats", "--db", "junk.db"], ["load", "seed.jsonl", "--db", "junk.db"]]) {
      const r = tp(...args);
      expect(r.status, r.stderr).toBe(1);
      expect(r.stderr).toBe("tiepoint: junk.db: not a tiepoint catalog (not an SQLite database file)\n");
    }
    expect(readFileSync(join(dir, "junk.db")).equals(before)).toBe(true);
  });

  it("a catalog of a newer schema version", () => {
    const db = freshCopy();
    const h = new Database(join(dir, db));
    h.prepare("UPDATE meta SET value = '99' WHERE key = 'schema_version'").run();
    h.close();
    const before = dumpCatalog(join(dir, db));
    for (const args of [["show", "b:wren", "--db", db], ["load", "seed.jsonl", "--db", db]]) {
      const r = tp(...args);
      expect(r.status).toBe(1);
      expect(r.stderr).toBe(`tiepoint: ${db}: catalog schema version 99 is newer than this tiepoint understands (1); upgrade tiepoint\n`);
    }
    expect(dumpCatalog(join(dir, db))).toBe(before);
  });

  it("a missing catalog file", () => {
    const r = tp("show", "x", "--db", "absent.db");
    expect(r.status).toBe(1);
    expect(r.stderr).toBe("tiepoint: absent.db: catalog not found; make one from your data with: tiepoint load FILE… --db absent.db\n");
    expect(existsSync(join(dir, "absent.db"))).toBe(false);
  });

  it("a read-only catalog: reads work, a load is refused with one line", () => {
    const db = freshCopy();
    const path = join(dir, db);
    chmodSync(path, 0o444);
    // root ignores file modes: make the file immutable instead (chattr +i), when the file system allows it
    const isRoot = process.getuid?.() === 0;
    const immutable = isRoot && spawnSync("chattr", ["+i", path]).status === 0;
    try {
      const before = dumpCatalog(path);
      const show = tp("show", "b:wren", "--db", db);
      expect(show.status, show.stderr).toBe(0);
      expect(show.stdout).toContain("Wren  [b:wren]");
      const stats = tp("stats", "--db", db);
      expect(stats.status, stats.stderr).toBe(0);
      const r = tp("load", "seed.jsonl", "--db", db);
      if (!isRoot || immutable) {
        expect(r.status).toBe(1);
        expect(r.stderr).toBe(`tiepoint: ${db}: the catalog is read-only (file permissions); cannot load into it\n`);
        expect(dumpCatalog(path)).toBe(before);
      } else {
        expect(r.status, r.stderr).toBe(0); // root without chattr may write; the catalog stays sound
      }
    } finally {
      if (immutable) spawnSync("chattr", ["-i", path]);
      chmodSync(path, 0o644);
    }
    expect(integrity(path)).toBe("ok");
  });
});
