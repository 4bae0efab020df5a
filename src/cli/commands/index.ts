/**
 * Every command of the CLI, registered in one place so the surface fits on a screen.
 *
 * Start-up: each command's module is imported only when it is registered, and when the
 * command line names one command (`tiepoint show X …`) only that one is registered, so a
 * process loads the modules its command uses and no others (`show` of one entity: about a
 * third of the program). Without a command name (help, the interactive screen, an unknown
 * word that commander answers with "did you mean") every command is registered.
 */
import type { Command } from "commander";

/** Each command's module, in the order of the help listing. */
const COMMANDS: Record<string, (program: Command) => Promise<void>> = {
  load: async (p) => (await import("./load.js")).registerLoad(p),
  show: async (p) => (await import("./show.js")).registerShow(p),
  stats: async (p) => (await import("./stats.js")).registerStats(p),
  ask: async (p) => (await import("./ask.js")).registerAsk(p),
  check: async (p) => (await import("./check.js")).registerCheck(p),
  compose: async (p) => (await import("./compose.js")).registerCompose(p),
  tui: async (p) => (await import("./tui.js")).registerTui(p),
  attach: async (p) => (await import("./attach.js")).registerAttach(p),
};

/**
 * Adds the commands to the program: only the one `argv` names (its first word after the
 * script, when that is a command's name), else all of them.
 */
export async function registerCommands(program: Command, argv: readonly string[] = process.argv): Promise<void> {
  const named = argv[2];
  // the screen is the program's default action (tui.ts), not a command word
  if (named !== undefined && named !== "tui" && Object.hasOwn(COMMANDS, named)) {
    await COMMANDS[named]!(program);
    return;
  }
  for (const register of Object.values(COMMANDS)) await register(program);
}
