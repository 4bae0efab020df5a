/**
 * The interactive screen's root: owns the state (reducer), opens the engine after the first
 * paint, turns keys into actions, and runs questions and card look-ups through the hooks.
 */
import { useApp } from "ink";
import { useCallback, useReducer } from "react";
import { ThemeContext } from "../components/ThemeContext.js";
import { useAsk } from "../hooks/use-ask.js";
import { useCard } from "../hooks/use-card.js";
import { useCompose } from "../hooks/use-compose.js";
import { useEngine, type EngineOpener } from "../hooks/use-engine.js";
import { useKeys } from "../hooks/use-keys.js";
import { useTerminalSize } from "../hooks/use-terminal-size.js";
import { keyAction } from "../keymap.js";
import { initialState, tuiReducer } from "../state.js";
import { COLOUR_THEME, type Theme } from "../theme.js";
import { MainScreen } from "./MainScreen.js";

/** Props of {@link TuiApp}. */
export interface TuiAppProps {
  /** Opens the engine (called once, after the first paint). */
  readonly open: EngineOpener;
  /** Answers asked per question. @default 10 */
  readonly top?: number;
  /** Colours. @default the colour theme */
  readonly theme?: Theme;
  /** Fixed width (tests). @default the terminal's */
  readonly columns?: number;
  /** Fixed height (tests). @default the terminal's */
  readonly rows?: number;
  /** Earlier questions for the history. */
  readonly history?: readonly string[];
  /** Called when the user quits, before the app unmounts. */
  readonly onQuit?: () => void;
}

/** The interactive screen. */
export function TuiApp(props: TuiAppProps) {
  const [state, dispatch] = useReducer(tuiReducer, props.history, (h) => initialState(h ?? []));
  const { exit } = useApp();
  const size = useTerminalSize({ ...(props.columns !== undefined ? { columns: props.columns } : {}), ...(props.rows !== undefined ? { rows: props.rows } : {}) });
  const engine = useEngine(props.open, {
    progress: (progress) => dispatch({ type: "progress", progress }),
    opened: (title) => dispatch({ type: "opened", title }),
    failed: (message) => dispatch({ type: "open-failed", message: `error: ${message}` }),
  });
  useAsk(engine, state.request, props.top ?? 10, dispatch);
  useCard(engine, state.cards[state.cards.length - 1], dispatch);
  useCompose(engine, state.compose, dispatch);
  const onKey = useCallback(
    (ev: Parameters<typeof keyAction>[1]) => {
      const r = keyAction(state, ev);
      if (r === "quit") {
        props.onQuit?.();
        exit();
      } else if (r) dispatch(r);
    },
    [state, exit, props],
  );
  useKeys(onKey);
  return (
    <ThemeContext.Provider value={props.theme ?? COLOUR_THEME}>
      <MainScreen state={state} columns={size.columns} rows={size.rows} />
    </ThemeContext.Provider>
  );
}
