/**
 * `tiepoint ask "QUESTION" [--db PATH] [--json | --dot] [--top N] [--pin TEXT=ENTITY]…`: links the
 * question, ranks answers and prints them (text, or the contract JSON on stdout alone).
 */
import type { Command } from "commander";
import { parsePin, type Pin } from "../../linking/index.js";
import { DEADLINE_DEFAULTS, TiepointError, checkTop } from "../../model/index.js";
import { Session } from "../../pipeline/index.js";
import { askJson, catalogLabels, evidenceDot, renderAskText, renderExplanationText } from "../../present/ask/index.js";
import { STORE_TIMEOUT_HELP, storeSessionOptions } from "./attach.js";
import { guarded } from "../run.js";

/** Parses `--top N`: a positive whole number, else a usage error. */
export function parseTop(value: string | undefined, fallback = 10): number {
  if (value === undefined) return fallback;
  if (!/^\s*\d+\s*$/.test(value) || Number(value) < 1) throw new TiepointError("cli/usage", `--top "${value}": expected a positive whole number, e.g. --top 5`);
  checkTop(Number(value), "cli/usage", "--top");
  return Number(value);
}

/** The `--time-limit MS` option's help text (ask, check, the terminal screen). */
export const TIME_LIMIT_HELP = `time budget per question in milliseconds; once spent, the long stages (conditions over a whole type, later answers' paths, clue ablation, suggestions, why-not) stop early and the answer so far is shown with a note; 0 = no limit (default ${DEADLINE_DEFAULTS.timeLimitMs})`;

/** Parses `--time-limit MS`: a whole number of milliseconds, 0 for none; else a usage error. */
export function parseTimeLimit(value: string | undefined): number {
  if (value === undefined) return DEADLINE_DEFAULTS.timeLimitMs;
  if (!/^\s*\d+\s*$/.test(value) || !Number.isSafeInteger(Number(value))) throw new TiepointError("cli/usage", `--time-limit "${value}": expected a whole number of milliseconds (0 for no limit), e.g. --time-limit 5000`);
  return Number(value);
}

/** The parts of a question `--dot` prints nothing of (the drawing shows clues, answers and their paths): left out. */
const DOT_ONLY = { ablation: false, suggestions: false } as const;

/** Registers `ask`. */
export function registerAsk(program: Command): void {
  program
    .command("ask")
    .description("answer one question: linked clues, ranked answers, verdict")
    .argument("<question>", "the question, in plain English (quote it)")
    .option("--db <path>", "the catalog file (default: the bundled demo catalog)")
    .option("--json", "print the contract JSON document on stdout")
    .option("--dot", "print the evidence graph (clues, answers, their paths) as Graphviz DOT on stdout")
    .option("--top <n>", "how many answers to return", "10")
    .option("--pin <text=entity>", "fix a link: the question words TEXT name ENTITY (id or exact label); repeatable", (v: string, prev: string[]) => [...prev, v], [] as string[])
    .option("--why-not <entity>", "explain why ENTITY (an id or a label; a shared label explains each entity of that name) is not the best answer; repeatable", (v: string, prev: string[]) => [...prev, v], [] as string[])
    .option("--time-limit <ms>", TIME_LIMIT_HELP)
    .option("--timeout <ms>", STORE_TIMEOUT_HELP)
    .action((question: string, opts: { db?: string; json?: boolean; dot?: boolean; top?: string; pin: string[]; whyNot: string[]; timeLimit?: string; timeout?: string }) =>
      guarded(async () => {
        const top = parseTop(opts.top);
        const timeLimitMs = parseTimeLimit(opts.timeLimit);
        if (opts.dot && opts.json) throw new TiepointError("cli/usage", "--dot and --json both print on stdout; use one of them");
        const pins: Pin[] = opts.pin.map(parsePin);
        const session = Session.open({ ...(opts.db !== undefined ? { db: opts.db } : {}), ...storeSessionOptions(opts.timeout) });
        try {
          const out = await session.askAsync(question, { top, ...(pins.length > 0 ? { pins } : {}), ...(opts.whyNot.length > 0 ? { whyNot: opts.whyNot } : {}), verifySuggestions: !opts.dot, timeLimitMs, ...(opts.dot ? DOT_ONLY : {}) });
          if (opts.dot) process.stdout.write(evidenceDot(out.result, { labels: catalogLabels(session.catalog) }));
          else if (opts.json) process.stdout.write(askJson(out.result, out));
          else
            process.stdout.write(
              renderAskText(out.result, {
                relationCues: out.analysis.relationCues.map((c) => `${c.label} (${c.words.join(" ")})`),
                millis: out.timings.total,
                labelOf: catalogLabels(session.catalog).entity,
                ...(out.explanation ? { paths: 0 } : {}),
              }) + (out.explanation ? "\n" + renderExplanationText(out.explanation) : ""),
            );
        } finally {
          session.close();
        }
      }),
    );
}
