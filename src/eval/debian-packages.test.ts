/**
 * The Debian Packages converter: relationship-field syntax against the examples of Debian
 * Policy §7.1, and the committed slice (test/fixtures/debian, Debian 12 "bookworm" main amd64)
 * converted and loaded through the real importer, with counts checked against a recount of the
 * raw stanza text by line patterns (independent of the converter's stanza parser).
 */
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { gunzipSync } from "node:zlib";
import { afterAll, describe, expect, it } from "vitest";
import { Catalog, loadFiles } from "../catalog/index.js";
import { debianIris, parseMaintainer, parseStanzas, relationNames, sliceStanzas, stanzasToNTriples } from "./debian-packages.js";

const SLICE = new URL("../../test/fixtures/debian/packages-slice.txt.gz", import.meta.url);
const text = gunzipSync(readFileSync(SLICE)).toString("utf8");
const dir = mkdtempSync(join(tmpdir(), "tp-debian-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe("relationship fields (Debian Policy §7.1)", () => {
  it("strips versions and architecture qualifiers, one name per alternative", () => {
    // Policy §7.1 examples: "Depends: libc6 (>= 2.2.1), exim | mail-transport-agent"
    expect(relationNames("libc6 (>= 2.2.1), exim | mail-transport-agent")).toEqual(["libc6", "exim", "mail-transport-agent"]);
    // Policy §7.1: "Depends: foo [i386], bar [amd64]"; Multi-Arch ":any" (Policy §7.1)
    expect(relationNames("foo [i386], bar [amd64], python3:any (>= 3.11~)")).toEqual(["foo", "bar", "python3"]);
    expect(relationNames("a (<< 2) | a (>= 3), b <!nocheck>")).toEqual(["a", "b"]);
  });
  it("reads a maintainer's name and address (RFC 5322 name-addr)", () => {
    expect(parseMaintainer("Debian Games Team <pkg-games-devel@lists.alioth.debian.org>")).toEqual({ name: "Debian Games Team", email: "pkg-games-devel@lists.alioth.debian.org" });
  });
  it("names the line of a malformed stanza", () => {
    expect(() => parseStanzas("Package: a\n continued\nno colon here\n", "P")).toThrow("P:3:");
    expect(() => parseStanzas(" orphan\n", "P")).toThrow("P:1:");
  });
});

describe("the committed slice", () => {
  const stanzas = parseStanzas(text);
  it("a slice holds the Depends/Pre-Depends closure of every package it draws", () => {
    // a hand-made index: a → b | c, b → d; e alone; v is only referred to (virtual)
    const idx = parseStanzas("Package: a\nDepends: b (>= 1) | c, v\n\nPackage: b\nPre-Depends: d:any\n\nPackage: c\n\nPackage: d\n\nPackage: e\n");
    for (let seed = 1; seed <= 20; seed++) {
      const got = new Set(sliceStanzas(idx, 1, seed).map((s) => s.get("Package")));
      if (got.has("a")) expect([...got].sort()).toEqual(["a", "b", "c", "d"]);
      if (got.has("b")) expect(got.has("d")).toBe(true);
    }
    const all = sliceStanzas(stanzas, 10 * stanzas.length);
    expect(all.length).toBe(stanzas.length);
  });

  it("converts and loads; counts agree with a recount of the raw text", () => {
    const c = stanzasToNTriples(stanzas);
    const packages = text.match(/^Package: /gm)!.length;
    const sized = text.match(/^Installed-Size: \d+$/gm)!.length;
    expect(c.packages).toBe(packages);
    expect(c.sized).toBe(sized);
    writeFileSync(join(dir, "p.nt"), c.nt);
    writeFileSync(join(dir, "d.jsonl"), c.declarations);
    const cat = Catalog.open(join(dir, "c.db"), { create: true });
    loadFiles(cat, [join(dir, "p.nt"), join(dir, "d.jsonl")]);
    const I = debianIris();
    const size = cat.predicates().find((p) => p.id === I.schema("installed-size"))!;
    expect(cat.predicateUnits().get(size.id)).toBe("kibibytes");
    const n = (cat.db.prepare("SELECT count(*) FROM attribute WHERE predicate = ? AND num IS NOT NULL").pluck().get(size.num)) as number;
    expect(n).toBe(sized);
    // wget's Depends line, recounted from the raw stanza text
    const wgetDeps = /^Package: wget\n(?:.*\n)*?Depends: (.*)$/m.exec(text)![1]!.split(",").flatMap((g) => g.split("|").map((a) => a.trim().split(/[\s:(]/)[0]));
    const wget = cat.numOf(I.package("wget"))!;
    const depends = cat.predicates().find((p) => p.id === I.schema("depends"))!;
    const got = cat.db.prepare("SELECT e.id FROM edge JOIN entity e ON e.num = dst WHERE src = ? AND rel = ?").pluck().all(wget, depends.num) as string[];
    expect(got.sort()).toEqual([...new Set(wgetDeps)].map((d) => I.package(d!)).sort());
    expect(depends.label).toBe("depends on");
    cat.close();
  });
});
