/**
 * `tiepoint compose ENTITY [--db PATH] [--json] [--count N] [--difficulty D] [--avoid X]…`
 * and `tiepoint compose --batch FILE [--db PATH]`: questions whose only answer is ENTITY, each
 * with its facts, its proof and its round trip through `ask` (src/compose). ENTITY is an id or
 * a label; an ambiguous name lists the candidates and exits 1, an unknown one names the
 * nearest entities. The batch prints a TSV ready for `check` on stdout.
 */
import type { Command } from "commander";
import { Composer, composeBatch, readAnswerFile, resolveTarget } from "../../compose/index.js";
import { TiepointError } from "../../model/index.js";
import { Session } from "../../pipeline/index.js";
import { compositionJson, renderComposeTsv, renderCompositionText } from "../../present/index.js";
import { STORE_TIMEOUT_HELP, storeSessionOptions } from "./attach.js";
import { guarded } from "../run.js";
import { nearNames } from "./show.js";

/** Candidates listed for an ambiguous name. */
const MAX_CANDIDATES = 20;

/** Parses `--count N`: a positive whole number, else a usage error. */
function parseCount(value: string | undefined): number {
  if (value === undefined) return 3;
  if (!/^\s*\d+\s*$/.test(value) || Number(value) < 1 || Number(value) > 50) throw new TiepointError("cli/usage", `--count "${value}": expected a whole number from 1 to 50, e.g. --count 3`);
  return Number(value);
}

/** Registers `compose`. */
export function registerCompose(program: Command): void {
  program
    .command("compose")
    .description("propose questions whose only answer is ENTITY (well-known clues first), each checked by asking it back")
    .argument("[entity]", "the intended answer: an entity id or label")
    .option("--db <path>", "the catalog file (default: the bundled demo catalog)")
    .option("--json", "print the JSON document on stdout")
    .option("--count <n>", "how many questions to propose", "3")
    .option("--difficulty <d>", "easy (well-known clues), medium, hard (obscure clues), or a number from 0 to 1", "easy")
    .option("--avoid <entity-or-relation>", "never use this entity or relation (an id or a label) in a clue; repeatable", (v: string, prev: string[]) => [...prev, v], [] as string[])
    .option("--batch <file>", "a file of intended answers (one id or label per line): print a TSV of verified questions (question, expected id, verdict) ready for check")
    .option("--timeout <ms>", STORE_TIMEOUT_HELP)
    .action((name: string | undefined, opts: { db?: string; json?: boolean; count?: string; difficulty?: string; avoid: string[]; batch?: string; timeout?: string }) =>
      guarded(async () => {
        const count = parseCount(opts.count);
        if (opts.batch !== undefined && name !== undefined) throw new TiepointError("cli/usage", "give either ENTITY or --batch FILE, not both");
        if (opts.batch === undefined && name === undefined) throw new TiepointError("cli/usage", "missing ENTITY (an entity id or label), or --batch FILE");
        if (opts.batch !== undefined && opts.json) throw new TiepointError("cli/usage", "--batch prints a TSV; --json is for one ENTITY");
        const session = Session.open({ ...(opts.db !== undefined ? { db: opts.db } : {}), ...storeSessionOptions(opts.timeout) });
        try {
          const composer = new Composer(session);
          const options = { count, difficulty: opts.difficulty ?? "easy", avoid: opts.avoid };
          if (opts.batch !== undefined) {
            const lines = readAnswerFile(composer, opts.batch);
            // options are checked once before the long run (a bad --avoid fails here)
            composer.avoidSets(opts.avoid);
            const rows = await composeBatch(composer, lines, options, (done, total) => {
              if (process.stderr.isTTY) process.stderr.write(`\rcomposing ${done}/${total}`);
            });
            if (process.stderr.isTTY) process.stderr.write("\n");
            process.stdout.write(renderComposeTsv(rows));
            return;
          }
          const nums = resolveTarget(session.catalog, name!);
          if (nums.length === 0) {
            const near = await nearNames(session.catalog, name!);
            throw new TiepointError("compose/unknown-entity", `no entity with id or label ${JSON.stringify(name)}${near.length ? `; did you mean ${near.map((r) => `${r.label} [${r.id}]`).join(", ")}?` : ""}`);
          }
          if (nums.length > 1) {
            const list = nums.slice(0, MAX_CANDIDATES).map((n) => {
              const r = session.ref(n);
              const types = session.index.typesOf(n).map((t) => session.ref(t).label);
              return `  ${r.id}  ${r.label}${types.length ? `  (${types.join(", ")})` : ""}`;
            });
            if (nums.length > MAX_CANDIDATES) list.push(`  … and ${nums.length - MAX_CANDIDATES} more`);
            process.stderr.write(`${JSON.stringify(name)} names ${nums.length} entities; give one of these ids:\n${list.join("\n")}\n`);
            process.exitCode = 1;
            return;
          }
          const c = await composer.compose(nums[0]!, options);
          process.stdout.write(opts.json ? compositionJson(c) : renderCompositionText(c));
        } finally {
          session.close();
        }
      }),
    );
}
