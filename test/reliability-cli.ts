/**
 * Helpers of the reliability tests (issue 10) and the catalog CLI tests: run the built CLI,
 * mount a small tmpfs.
 * Spawned commands need a build (npm test builds first; a missing dist/ is built once).
 */
import { execFileSync, spawnSync } from "node:child_process";
import { existsSync, mkdirSync } from "node:fs";
import { join, resolve } from "node:path";

/** The repository root and the built executable. */
export const ROOT = resolve(__dirname, "..");
export const MAIN = join(ROOT, "dist/cli/main.js");

/** A half-written dist/ (another build running at the same moment) fails at module load. */
export const BUILD_IN_FLUX = /SyntaxError: The requested module|ERR_MODULE_NOT_FOUND|Cannot find module/;

/** Builds dist/ once when it is missing. */
export function ensureBuilt(): void {
  if (!existsSync(MAIN)) execFileSync(process.execPath, [join(ROOT, "node_modules/typescript/bin/tsc"), "-p", join(ROOT, "tsconfig.json")], { stdio: "inherit" });
}

/** Runs `tiepoint ARGS…` in `cwd`; only a module-load failure of the build itself is retried. */
export function tp(cwd: string, ...args: string[]): { status: number | null; stdout: string; stderr: string } {
  for (let attempt = 0; ; attempt++) {
    const r = spawnSync(process.execPath, [MAIN, ...args], { cwd, encoding: "utf8", env: { ...process.env, TIEPOINT_DEBUG: "" }, maxBuffer: 64 << 20 });
    if (attempt < 5 && BUILD_IN_FLUX.test(r.stderr)) {
      spawnSync("sleep", ["2"]);
      continue;
    }
    return { status: r.status, stdout: r.stdout, stderr: r.stderr };
  }
}

/** Mounts a tmpfs of `size` (e.g. "2m") at DIR; returns why not when the mount is refused (not root, no CAP_SYS_ADMIN). */
export function mountTmpfs(dir: string, size: string): string | undefined {
  mkdirSync(dir, { recursive: true });
  const r = spawnSync("mount", ["-t", "tmpfs", "-o", `size=${size}`, "tmpfs", dir], { encoding: "utf8" });
  return r.status === 0 ? undefined : `mount -t tmpfs refused: ${(r.stderr || r.error?.message || "").trim()}`;
}

/** Remounts DIR read-only (or read-write with `rw`). */
export function remount(dir: string, mode: "ro" | "rw"): boolean {
  return spawnSync("mount", ["-o", `remount,${mode}`, dir]).status === 0;
}

/** Unmounts DIR (lazily, so an open handle cannot make it fail). */
export function unmount(dir: string): void {
  spawnSync("umount", ["-l", dir]);
}
