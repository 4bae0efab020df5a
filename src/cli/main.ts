#!/usr/bin/env node
/**
 * The `tiepoint` executable: one commander program, one module per command in commands/.
 */
import { Command, CommanderError } from "commander";
import { registerCommands } from "./commands/index.js";
import { endQuietlyWhenReaderGone } from "./closed-output.js";

endQuietlyWhenReaderGone();

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

program.addHelpText(
  "after",
  `
Examples (the bundled demo catalog is used when --db is left out):
  tiepoint ask "Which vessel carried the instrument used by the project that Jessa Moll leads?"
  tiepoint ask "Which vessels have Tolvane as their home port?" --json
  tiepoint check data/demo-questions.tsv --format html --out report.html
  tiepoint load people.csv links.nt --db my.db && tiepoint ask "Who leads Project X?" --db my.db
  tiepoint show ves:caddrow      (an id or a label; a shared label lists the candidates)
  tiepoint                      (on a terminal: the interactive screen)

Exit status: 0 success, 1 bad input (one line naming the file and line or field), 2 bad usage.`,
);

await registerCommands(program);

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
