/**
 * Every command of the CLI, registered in one place so the surface fits on a screen.
 */
import type { Command } from "commander";

/** Adds all commands to the program. */
export function registerCommands(program: Command): void {
  void program;
}
