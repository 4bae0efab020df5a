/**
 * `tiepoint attach URL --db PATH [--graph IRI]` and `tiepoint attach --db PATH --refresh`:
 * makes (or remakes) a catalog whose relation edges stay in a SPARQL 1.1 store
 * (pipeline/attach.ts). Progress lines on stderr, one summary line on stdout.
 *
 * Credentials for HTTP basic authentication: `TIEPOINT_SPARQL_CREDENTIALS=user:password` in
 * the environment, or `--credentials-file FILE` (its first line `user:password`); never in
 * the URL, never printed, never stored.
 */
import { readFileSync } from "node:fs";
import type { Command } from "commander";
import { TiepointError } from "../../model/index.js";
import { guarded } from "../run.js";

/** The environment variable holding `user:password`. */
export const CREDENTIALS_VARIABLE = "TIEPOINT_SPARQL_CREDENTIALS";

/** `user:password` from `--credentials-file` or the environment (undefined when neither is set). */
export function storeCredentials(file: string | undefined): string | undefined {
  if (file !== undefined) {
    let text: string;
    try {
      text = readFileSync(file, "utf8");
    } catch (e) {
      throw new TiepointError("cli/credentials", `cannot read the credentials file (${(e as { code?: string }).code ?? "error"})`, { file });
    }
    const line = text.split(/\r?\n/)[0] ?? "";
    if (!line.includes(":")) throw new TiepointError("cli/credentials", "expected user:password on the first line", { file, line: 1 });
    return line;
  }
  const env = process.env[CREDENTIALS_VARIABLE];
  if (env !== undefined && env !== "") {
    if (!env.includes(":")) throw new TiepointError("cli/credentials", `${CREDENTIALS_VARIABLE} must be user:password`);
    return env;
  }
  return undefined;
}

/** Parses `--timeout MS`. */
export function timeoutOption(v: string | undefined): number | undefined {
  if (v === undefined) return undefined;
  const n = Number(v);
  if (!Number.isInteger(n) || n < 1 || n > 3_600_000) throw new TiepointError("cli/usage", `--timeout must be milliseconds from 1 to 3600000, got ${JSON.stringify(v)}`);
  return n;
}

/** What `ask`, `check`, `show` and the screen pass to an attached catalog's session: `--timeout` and the environment's credentials. */
export function storeSessionOptions(timeout: string | undefined): { store: { timeoutMs?: number; credentials?: string } } {
  const timeoutMs = timeoutOption(timeout);
  const credentials = storeCredentials(undefined);
  return { store: { ...(timeoutMs !== undefined ? { timeoutMs } : {}), ...(credentials !== undefined ? { credentials } : {}) } };
}

/** The help of `--timeout` on the commands that read a catalog. */
export const STORE_TIMEOUT_HELP = "on a catalog attached to a SPARQL store: milliseconds one request may take (default 30000)";

export function registerAttach(program: Command): void {
  program
    .command("attach")
    .description("make a catalog whose relation edges stay in a SPARQL 1.1 store (names, types and attributes are copied)")
    .argument("[url]", "the store's SPARQL endpoint (SPARQL 1.1 Protocol, results as JSON)")
    .requiredOption("--db <path>", "the catalog file to make")
    .option("--graph <iri>", "only this named graph of the store")
    .option("--refresh", "pull again from the endpoint the catalog is bound to, then swap the files atomically")
    .option("--timeout <ms>", "milliseconds one request may take (default 30000)")
    .option("--credentials-file <file>", `a file whose first line is user:password (else ${CREDENTIALS_VARIABLE})`)
    .action((url: string | undefined, opts: { db: string; graph?: string; refresh?: boolean; timeout?: string; credentialsFile?: string }) =>
      guarded(async () => {
        const { attachStore, existingBinding } = await import("../../pipeline/index.js");
        const timeoutMs = timeoutOption(opts.timeout);
        const credentials = storeCredentials(opts.credentialsFile);
        let endpoint = url;
        let graph = opts.graph;
        if (opts.refresh) {
          const b = existingBinding(opts.db);
          if (url !== undefined && url !== b.endpoint) throw new TiepointError("cli/usage", `--refresh pulls from the endpoint the catalog is bound to (${b.endpoint}); leave out the URL, or attach to a new file`);
          endpoint = b.endpoint;
          graph ??= b.graph ?? undefined;
        }
        if (endpoint === undefined) throw new TiepointError("cli/usage", "attach needs the store's SPARQL endpoint URL (or --refresh for a catalog already attached)");
        const r = await attachStore(endpoint, opts.db, {
          ...(graph !== undefined ? { graph } : {}),
          ...(timeoutMs !== undefined ? { timeoutMs } : {}),
          ...(credentials !== undefined ? { credentials } : {}),
          refresh: opts.refresh === true,
          onProgress: (line) => process.stderr.write(`${line}\n`),
        });
        const rate = r.seconds > 0 ? Math.round(r.labels / r.seconds) : r.labels;
        process.stdout.write(
          `${opts.refresh ? "refreshed" : "attached"} ${opts.db}: ${r.entities.toLocaleString("en-US")} entities, ${r.labels.toLocaleString("en-US")} labels (${rate.toLocaleString("en-US")}/s), ` +
            `${r.relations} relations with ${r.edges.toLocaleString("en-US")} edges left in the store; ${r.requests} requests, ${r.rows.toLocaleString("en-US")} rows, ${r.seconds.toFixed(2)} s\n`,
        );
      }),
    );
}
