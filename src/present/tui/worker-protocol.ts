/** The messages between the screen and its engine worker (structured-clone safe). */
import type { ComposeView, EntityCard, OpenProgress, PinView, TuiResult } from "./view-types.js";

/** Screen → worker. */
export type WorkerRequest =
  | { readonly op: "ask"; readonly id: number; readonly question: string; readonly pins: readonly PinView[]; readonly top: number }
  | { readonly op: "card"; readonly id: number; readonly entity: string }
  | { readonly op: "compose"; readonly id: number; readonly entity: string }
  | { readonly op: "close" };

/** Worker → screen. */
export type WorkerReply =
  | { readonly type: "progress"; readonly progress: OpenProgress }
  | { readonly type: "ready"; readonly title: string }
  | { readonly type: "open-failed"; readonly message: string }
  | { readonly type: "reply"; readonly id: number; readonly ok: true; readonly value: TuiResult | EntityCard | ComposeView | null }
  | { readonly type: "reply"; readonly id: number; readonly ok: false; readonly message: string };
