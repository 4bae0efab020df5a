/**
 * A private tmux server (its own socket, so a user's sessions are never touched) with one
 * session, for the real-terminal tests: send keys, capture the pane, wait until it shows
 * something.
 */
import { execFileSync, spawnSync } from "node:child_process";

/** True when tmux is installed. */
export const HAVE_TMUX = spawnSync("tmux", ["-V"]).status === 0;

/** One tmux session on a private server. */
export interface TmuxPane {
  /** Runs `tmux ARGS…` on the private server. */
  tmux(...args: string[]): string;
  /** The pane's text (`capture-pane -p`). */
  capture(): string;
  /** The pane's text with escape sequences (`capture-pane -p -e`). */
  captureEscapes(): string;
  /** Polls the pane (every 100 ms, up to 30 s) until `ok` holds; throws naming `what` with the last pane. */
  paneWhere(ok: (pane: string) => boolean, what: string): Promise<string>;
  /** Ends the private server. */
  kill(): void;
}

/** A private server named after `name` and this process; the session is called `session`. */
export function tmuxPane(name: string, session: string): TmuxPane {
  const socket = `${name}-${process.pid}`;
  const tmux = (...args: string[]) => execFileSync("tmux", ["-L", socket, ...args], { encoding: "utf8" });
  const capture = () => tmux("capture-pane", "-p", "-t", session);
  return {
    tmux,
    capture,
    captureEscapes: () => tmux("capture-pane", "-p", "-e", "-t", session),
    async paneWhere(ok, what) {
      for (let i = 0; i < 300; i++) {
        const p = capture();
        if (ok(p)) return p;
        await new Promise((r) => setTimeout(r, 100));
      }
      throw new Error(`the terminal never showed ${what}; pane:\n${capture()}`);
    },
    kill: () => void spawnSync("tmux", ["-L", socket, "kill-server"]),
  };
}
