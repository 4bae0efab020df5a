/**
 * Starts `tiepoint load FILE --db DB` as a real process and kills it with SIGKILL once a
 * moment is reached: after `ms` milliseconds and (when `walBytes` is given) once the
 * write-ahead log DB-wal has grown to that size, i.e. while SQLite is writing pages of the
 * uncommitted transaction (https://www.sqlite.org/wal.html). Used by the crash tests.
 * `--no-prepare` keeps the process to the load itself: the snapshot building that `load`
 * does after its commit would otherwise let a late kill land after the commit.
 */
import { spawn } from "node:child_process";
import { existsSync, statSync } from "node:fs";
import { MAIN } from "../reliability-cli.js";

/** How a killed load ended, and the WAL size seen when the kill was sent (-1: never sent). */
export interface KilledLoad {
  readonly signal: NodeJS.Signals | null;
  readonly code: number | null;
  readonly stderr: string;
  readonly walAtKill: number;
}

/** Runs one load of `file` into `db` (in `cwd`, with `extra` arguments) and kills it at the moment `when`. */
export function killLoadWhen(cwd: string, file: string, db: string, when: { readonly ms: number; readonly walBytes?: number }, extra: readonly string[] = []): Promise<KilledLoad> {
  return new Promise((done) => {
    const child = spawn(process.execPath, [MAIN, "load", file, "--db", db, "--no-prepare", ...extra], { cwd });
    let stderr = "";
    let walAtKill = -1;
    child.stderr.on("data", (d) => (stderr += String(d)));
    const start = Date.now();
    const wal = `${db}-wal`;
    const poll = setInterval(() => {
      if (Date.now() - start < when.ms) return;
      const size = existsSync(wal) ? statSync(wal).size : 0;
      if (when.walBytes !== undefined && size < when.walBytes) return;
      walAtKill = size;
      child.kill("SIGKILL");
      clearInterval(poll);
    }, 1);
    child.on("exit", (code, signal) => {
      clearInterval(poll);
      done({ signal, code, stderr, walAtKill });
    });
  });
}
