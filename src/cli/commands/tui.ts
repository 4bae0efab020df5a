/**
 * `tiepoint` with no command: the interactive terminal screen on the demo catalog (or
 * `--db PATH`). Not on a terminal (piped stdin or stdout), it prints the usage and exits 0.
 *
 * The screen and ink are imported only when the screen starts, so other commands start fast.
 * The catalog opens in a worker thread (present/tui workerEngine): the screen paints at once
 * and shows progress while a large catalog's index is built.
 */
import type { Command } from "commander";
import { existsSync } from "node:fs";
import { distance } from "fastest-levenshtein";
import { missingCatalog } from "../../catalog/index.js";
import { TiepointError } from "../../model/index.js";
import { guarded } from "../run.js";
import { parseTimeLimit, parseTop, TIME_LIMIT_HELP } from "./ask.js";

const ALT_SCREEN_ON = "\x1b[?1049h";
const ALT_SCREEN_OFF = "\x1b[?1049l";

/** Options of the default action. */
interface TuiOptions {
  readonly db?: string;
  readonly top?: string;
  readonly timeLimit?: string;
}

async function runScreen(opts: TuiOptions): Promise<void> {
  const top = parseTop(opts.top);
  const timeLimitMs = parseTimeLimit(opts.timeLimit);
  if (opts.db !== undefined && !existsSync(opts.db)) {
    throw missingCatalog(opts.db);
  }
  // ink renders nothing interactive when it believes it runs under CI; the user asked for
  // the screen on a real terminal, so say we are not (read once, when ink is imported).
  delete process.env["CI"];
  delete process.env["CONTINUOUS_INTEGRATION"];
  const [{ render }, { createElement }, tui] = await Promise.all([import("ink"), import("react"), import("../../present/tui/index.js")]);
  let failure: Error | undefined;
  const source = { ...(opts.db !== undefined ? { db: opts.db } : {}), timeLimitMs };
  const open = (onProgress: Parameters<typeof tui.workerEngine>[1]) =>
    tui.workerEngine(source, onProgress).catch((e: unknown) => {
      failure = e instanceof Error ? e : new Error(String(e));
      setImmediate(() => app.unmount());
      throw failure;
    });
  process.stdout.write(ALT_SCREEN_ON);
  const app = render(createElement(tui.TuiApp, { open, top, theme: tui.themeFor(process.env) }), { exitOnCtrlC: false, patchConsole: true });
  try {
    await app.waitUntilExit();
  } finally {
    process.stdout.write(ALT_SCREEN_OFF);
  }
  if (failure) throw new TiepointError("tui/open", failure.message.replace(/^tiepoint: /, ""));
  // the engine worker is closed on unmount; never linger after the user quit
  setTimeout(() => process.exit(process.exitCode ?? 0), 1000).unref();
}

/** Edit distance at most this share of the word's length counts as a likely typo of a command name. */
const TYPO_SHARE = 0.4;

/**
 * The usage error for `tiepoint WORD …` when WORD names no command: the list of commands and,
 * when one is within a few edits (Levenshtein distance), that one as the likely meaning.
 */
export function unknownCommand(word: string, commands: readonly string[]): TiepointError {
  const near = commands
    .map((c) => ({ c, d: distance(word.toLowerCase(), c) }))
    .filter((x) => x.d <= Math.max(1, Math.ceil(TYPO_SHARE * Math.max(word.length, x.c.length))) || (word.length >= 2 && x.c.startsWith(word.toLowerCase())))
    .sort((a, b) => a.d - b.d || a.c.localeCompare(b.c));
  const guess = near.length > 0 ? ` (did you mean ${near[0]!.c}?)` : "";
  return new TiepointError("cli/usage", `unknown command '${word}'${guess}; the commands are ${commands.join(", ")} (tiepoint COMMAND --help for each)`);
}

/** Registers the default action (no command) on the program. */
export function registerTui(program: Command): void {
  // `--db` belongs to the program here and to each command after its name
  program.enablePositionalOptions();
  program.hook("preSubcommand", (self, sub) => {
    const given = Object.keys(self.opts()).filter((k) => self.getOptionValueSource(k) === "cli");
    if (given.length > 0) {
      self.error(`tiepoint: --${given[0]} before the command name is for the terminal screen; put it after: tiepoint ${sub.name()} … --${given[0]} …`, { exitCode: 2, code: "tiepoint.usage" });
    }
  });
  program
    .option("--db <path>", "the catalog for the terminal screen (default: the bundled demo catalog)")
    .option("--top <n>", "answers per question on the terminal screen", "10")
    .option("--time-limit <ms>", TIME_LIMIT_HELP)
    // words after `tiepoint` that name no command reach this action: say so (not "too many arguments")
    .allowExcessArguments(true)
    .action((opts: TuiOptions) =>
      guarded(async () => {
        if (program.args.length > 0) throw unknownCommand(program.args[0]!, program.commands.map((c) => c.name()));
        if (!process.stdout.isTTY || !process.stdin.isTTY) {
          // a reader that stops early (`tiepoint | head`) ends quietly (closed-output.ts, main.ts)
          process.stdout.write(program.helpInformation());
          process.stdout.write("\n(run tiepoint on a terminal, with no command, for the interactive screen)\n");
          return;
        }
        await runScreen(opts);
      }),
    );
}
