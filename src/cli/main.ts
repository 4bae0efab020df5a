#!/usr/bin/env node
/**
 * The `tiepoint` executable: one commander program, one module per command in commands/.
 */
import { Command, CommanderError } from "commander";
import { registerCommands } from "./commands/index.js";

const program = new Command();
program
  .name("tiepoint")
  .description(
    "Answers multi-hop questions over your own knowledge base and shows why.\n" +
      "Answers are ranked suggestions drawn from the catalog, not facts: check the paths.",
  )
  .version("0.1.0")
  .showHelpAfterError("(run tiepoint --help for usage)")
  .exitOverride();

registerCommands(program);

try {
  await program.parseAsync(process.argv);
} catch (e) {
  if (e instanceof CommanderError) {
    // help and version exit 0; usage errors were already printed by commander
    process.exitCode = e.exitCode === 0 ? 0 : 2;
  } else {
    throw e;
  }
}
