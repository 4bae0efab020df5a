/**
 * Catalog source files written by several tests: the small boat/quay seed (JSONL), a large
 * generated N-Triples file (for loads that take long enough to be killed or raced), and a
 * JSONL catalog loaded through the real `loadFiles` into a fresh SQLite file.
 */
import { closeSync, openSync, writeFileSync, writeSync } from "node:fs";
import { join } from "node:path";
import { Catalog, loadFiles } from "../../src/catalog/index.js";

/** An invented seed catalog: two boats docked at two quays (JSONL text, trailing newline). */
export const BOAT_SEED = [
  '{"kind":"relation","id":"r:dockedAt","label":"docked at"}',
  '{"kind":"type","id":"t:Boat","label":"boat"}',
  '{"id":"b:wren","label":"Wren","types":["t:Boat"],"relations":{"r:dockedAt":["q:east"]}}',
  '{"id":"b:tern","label":"Tern","types":["t:Boat"],"relations":{"r:dockedAt":["q:west"]}}',
  '{"id":"q:east","label":"East Quay"}',
  '{"id":"q:west","label":"West Quay"}',
  "",
].join("\n");

/** An invented orchard cooperative (JSONL text, trailing newline): two orchards, growers tending them; `extra` lines are added before the end. */
export function orchardSeed(extra: readonly string[] = []): string {
  return [
    '{"kind":"type","id":"t:Orchard","label":"orchard"}',
    '{"kind":"type","id":"t:Grower","label":"grower"}',
    '{"kind":"relation","id":"r:tends","label":"tends"}',
    '{"id":"o:fenwold","label":"Fenwold Orchard","types":["t:Orchard"]}',
    '{"id":"o:brisk","label":"Briskmere Orchard","types":["t:Orchard"]}',
    '{"id":"g:alia","label":"Alia Tormund","types":["t:Grower"],"relations":{"r:tends":["o:fenwold"]}}',
    '{"id":"g:bren","label":"Bren Osk","types":["t:Grower"],"relations":{"r:tends":["o:brisk"]}}',
    ...extra,
    "",
  ].join("\n");
}

/**
 * Writes `n` entities `<k:eI>` with an rdfs:label "Entity number I" and 4 edges each
 * (`<k:r1>`…`<k:r4>` to `<k:e((I·31 + J·977) mod n)>`) as N-Triples to `file`, in 1 MiB chunks.
 */
export function writeBigNTriples(file: string, n: number): void {
  const fd = openSync(file, "w");
  let chunk = "";
  for (let i = 0; i < n; i++) {
    chunk += `<k:e${i}> <http://www.w3.org/2000/01/rdf-schema#label> "Entity number ${i}" .\n`;
    for (let j = 1; j <= 4; j++) chunk += `<k:e${i}> <k:r${j}> <k:e${(i * 31 + j * 977) % n}> .\n`;
    if (chunk.length > 1 << 20) {
      writeSync(fd, chunk);
      chunk = "";
    }
  }
  writeSync(fd, chunk);
  closeSync(fd);
}

/** Writes `lines` as `NAME.jsonl` in `dir`, loads it into a new catalog `NAME.db` there and returns that path. */
export function loadJsonlCatalog(dir: string, name: string, lines: readonly string[]): string {
  const file = join(dir, `${name}.jsonl`);
  writeFileSync(file, lines.join("\n") + "\n");
  const db = join(dir, `${name}.db`);
  const cat = Catalog.open(db, { create: true });
  loadFiles(cat, [file]);
  cat.close();
  return db;
}
