/**
 * Every command of the CLI, registered in one place so the surface fits on a screen.
 */
import type { Command } from "commander";
import { registerLoad } from "./load.js";
import { registerShow } from "./show.js";
import { registerStats } from "./stats.js";
import { registerAsk } from "./ask.js";
import { registerCheck } from "./check.js";
import { registerTui } from "./tui.js";
import { registerCompose } from "./compose.js";
import { registerAttach } from "./attach.js";

/** Adds all commands to the program. */
export function registerCommands(program: Command): void {
  registerLoad(program);
  registerShow(program);
  registerStats(program);
  registerAsk(program);
  registerCheck(program);
  registerCompose(program);
  registerTui(program);
  registerAttach(program);
}
