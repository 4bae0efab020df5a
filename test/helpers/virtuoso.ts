/**
 * A real SPARQL 1.1 store for the tests: Debian's `virtuoso-opensource` package (Virtuoso
 * Open-Source 7.2; `.ci/run` installs it when missing). Each server runs from its own
 * temporary directory with its own ini file, on free loopback ports, and is stopped (and the
 * directory removed) by `stop()`.
 *
 * Data goes in with Virtuoso's bulk loader through its SQL client `isql-vt` (`ld_dir` names the
 * file and the target graph, `rdf_loader_run` loads it, `checkpoint` makes it durable); the
 * directory must be listed in the ini's `DirsAllowed` for `ld_dir` to read it. The SPARQL 1.1
 * Protocol endpoint is `http://127.0.0.1:PORT/sparql`. `maxRows` sets the ini's
 * `[SPARQL] ResultSetMaxRows`: the store cuts every result to that many rows without an
 * error, which the tests use to check tiepoint's truncation detection.
 */
import { spawn, spawnSync, type ChildProcess } from "node:child_process";
import { mkdtempSync, rmSync, writeFileSync, existsSync } from "node:fs";
import { createServer } from "node:net";
import { tmpdir } from "node:os";
import { join } from "node:path";

const SERVER = "/usr/bin/virtuoso-t";
const CLIENT = "/usr/bin/isql-vt";

/** The one command that makes the store tests run on a machine without Virtuoso. */
export const ENABLE_COMMAND = "apt-get install -y virtuoso-opensource";

/** True when Debian's Virtuoso binaries are installed. */
export const HAVE_VIRTUOSO = existsSync(SERVER) && existsSync(CLIENT);

/** Prints the one line saying which tests are skipped and how to enable them (when Virtuoso is absent). */
export function noteSkipped(file: string): void {
  if (!HAVE_VIRTUOSO) process.stderr.write(`${file}: ${SERVER} not found, SPARQL store tests skipped (enable: ${ENABLE_COMMAND})\n`);
}

/** A free TCP port on the loopback interface (asked of the kernel, then released). */
export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = createServer();
    s.once("error", reject);
    s.listen(0, "127.0.0.1", () => {
      const a = s.address();
      const port = typeof a === "object" && a ? a.port : 0;
      s.close(() => resolve(port));
    });
  });
}

/** One running server. */
export interface VirtuosoServer {
  /** The SPARQL endpoint URL. */
  readonly url: string;
  readonly dir: string;
  readonly sqlPort: number;
  readonly httpPort: number;
  readonly process: ChildProcess;
  /** Bulk-loads N-Triples text into `graph`; returns the milliseconds it took. */
  load(ntriples: string, graph: string): number;
  /** Kills the server at once (SIGKILL), as a crash would. */
  kill(): void;
  /** Stops the server and removes its directory. */
  stop(): Promise<void>;
}

/** Options of {@link startVirtuoso}. */
export interface StartOptions {
  /** `[SPARQL] ResultSetMaxRows`. @default 10000 (the Debian package's ini) */
  readonly maxRows?: number;
}

/** Starts a server in a new temporary directory; resolves when its SPARQL endpoint answers. */
export async function startVirtuoso(options: StartOptions = {}): Promise<VirtuosoServer> {
  const dir = mkdtempSync(join(tmpdir(), "tiepoint-virtuoso-"));
  const sqlPort = await freePort();
  let httpPort = await freePort();
  while (httpPort === sqlPort) httpPort = await freePort();
  const ini = [
    "[Database]",
    `DatabaseFile = ${dir}/virtuoso.db`,
    `ErrorLogFile = ${dir}/virtuoso.log`,
    `LockFile = ${dir}/virtuoso.lck`,
    `TransactionFile = ${dir}/virtuoso.trx`,
    `xa_persistent_file = ${dir}/virtuoso.pxa`,
    "[TempDatabase]",
    `DatabaseFile = ${dir}/virtuoso-temp.db`,
    `TransactionFile = ${dir}/virtuoso-temp.trx`,
    "[Parameters]",
    `ServerPort = 127.0.0.1:${sqlPort}`,
    "DisableUnixSocket = 1",
    `DirsAllowed = ., ${dir}`,
    // 8 KiB pages: ~160 MB of buffers, enough for a few million triples in memory
    "NumberOfBuffers = 20000",
    "MaxDirtyBuffers = 15000",
    "CheckpointInterval = 0",
    "[HTTPServer]",
    `ServerPort = 127.0.0.1:${httpPort}`,
    `ServerRoot = ${dir}`,
    // 8 HTTP threads: tiepoint keeps up to 4 requests in flight (catalog/sparql/client.ts), a test may run two clients at once
    "ServerThreads = 8",
    "MaxClientConnections = 8",
    "[SPARQL]",
    `ResultSetMaxRows = ${options.maxRows ?? 10000}`,
    "MaxQueryExecutionTime = 120",
    "",
  ].join("\n");
  writeFileSync(join(dir, "virtuoso.ini"), ini);
  const child = spawn(SERVER, ["+configfile", join(dir, "virtuoso.ini"), "+foreground"], { cwd: dir, stdio: "ignore" });
  const url = `http://127.0.0.1:${httpPort}/sparql`;
  const deadline = Date.now() + 90_000;
  let exited = false;
  child.once("exit", () => (exited = true));
  for (;;) {
    if (exited) throw new Error(`virtuoso-t exited while starting (log: ${dir}/virtuoso.log)`);
    try {
      const r = await fetch(`${url}?query=${encodeURIComponent("ASK {}")}`, { headers: { accept: "application/sparql-results+json" } });
      if (r.ok) break;
    } catch {
      /* not listening yet */
    }
    if (Date.now() > deadline) {
      child.kill("SIGKILL");
      throw new Error(`virtuoso-t did not answer on ${url} within 90 s (log: ${dir}/virtuoso.log)`);
    }
    await new Promise((r) => setTimeout(r, 200));
  }
  let n = 0;
  const server: VirtuosoServer = {
    url,
    dir,
    sqlPort,
    httpPort,
    process: child,
    load(ntriples: string, graph: string): number {
      const t0 = performance.now();
      const file = `load-${++n}.nt`;
      writeFileSync(join(dir, file), ntriples);
      const sql = `ld_dir('${dir}', '${file}', '${graph.replace(/'/g, "''")}'); rdf_loader_run(); checkpoint;`;
      const r = spawnSync(CLIENT, [`127.0.0.1:${sqlPort}`, "dba", "dba", `exec=${sql}`], { encoding: "utf8", timeout: 600_000 });
      if (r.status !== 0 || /\*\*\* Error/.test(r.stdout + r.stderr)) throw new Error(`isql-vt load failed: ${(r.stdout + r.stderr).slice(0, 500)}`);
      // the bulk loader records per-file errors in its own table rather than failing
      const check = spawnSync(CLIENT, [`127.0.0.1:${sqlPort}`, "dba", "dba", `exec=SELECT ll_error FROM DB.DBA.load_list WHERE ll_error IS NOT NULL;`], { encoding: "utf8" });
      if (/\b\d+ Rows\./.test(check.stdout) && !/\b0 Rows\./.test(check.stdout)) throw new Error(`isql-vt load reported errors: ${check.stdout.slice(0, 500)}`);
      return performance.now() - t0;
    },
    kill(): void {
      if (!exited) child.kill("SIGKILL");
    },
    async stop(): Promise<void> {
      if (!exited) {
        const gone = new Promise<void>((r) => child.once("exit", () => r()));
        child.kill("SIGKILL");
        await gone;
      }
      rmSync(dir, { recursive: true, force: true });
    },
  };
  return server;
}
