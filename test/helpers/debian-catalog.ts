/**
 * The Debian package slice (test/fixtures/debian/packages-slice.txt.gz, Debian 12 "bookworm"
 * main amd64; see its README) as raw text and as a tiepoint catalog: converted by
 * src/eval/debian-packages.ts and loaded through the real `loadFiles` (so ANALYZE has run).
 */
import { readFileSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { gunzipSync } from "node:zlib";
import { Catalog, loadFiles } from "../../src/catalog/index.js";
import { stanzasToNTriples } from "../../src/eval/debian-packages.js";

/** The slice's raw Packages text. */
export function debianSliceText(): string {
  return gunzipSync(readFileSync(new URL("../fixtures/debian/packages-slice.txt.gz", import.meta.url))).toString("utf8");
}

/** Converts and loads the slice into `dir/debian.db`; returns the catalog path. */
export function buildDebianSliceCatalog(dir: string): string {
  const c = stanzasToNTriples(debianSliceText());
  writeFileSync(join(dir, "debian.nt"), c.nt);
  writeFileSync(join(dir, "debian-declarations.jsonl"), c.declarations);
  const db = join(dir, "debian.db");
  const cat = Catalog.open(db, { create: true });
  loadFiles(cat, [join(dir, "debian.nt"), join(dir, "debian-declarations.jsonl")]);
  cat.close();
  return db;
}
