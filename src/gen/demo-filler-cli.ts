#!/usr/bin/env node
/**
 * `npm run gen:demo [-- OUTFILE]`: rewrites data/filler.jsonl (the demo catalog's seeded
 * background) from src/gen/demo-filler.ts. The written file is the source users load.
 */
import { writeFileSync } from "node:fs";
import { demoFillerJsonl } from "./demo-filler.js";

const out = process.argv[2] ?? "data/filler.jsonl";
const text = demoFillerJsonl();
writeFileSync(out, text);
process.stdout.write(`wrote ${text.split("\n").length - 1} records to ${out}\n`);
