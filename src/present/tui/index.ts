/**
 * The interactive terminal screen (ink): the root component, the engines that feed it, and
 * the pure pieces (reducers, key parsing, layout, text width) other presenters may reuse.
 */
export { TuiApp } from "./screens/TuiApp.js";
export type { TuiAppProps } from "./screens/TuiApp.js";
export { MainScreen } from "./screens/MainScreen.js";
export type { MainScreenProps } from "./screens/MainScreen.js";
export { inProcessEngine, buildCard, DEFAULTS as ENGINE_DEFAULTS } from "./engine.js";
export type { EngineSource } from "./engine.js";
export { workerEngine } from "./worker-engine.js";
export type { EngineOpener } from "./hooks/use-engine.js";
export { initialState, tuiReducer, focusedEntity, detailEntities, PANES, DETAIL_TABS } from "./state.js";
export type { TuiState, TuiAction, Pane, DetailTab, CardFrame, AskRequest } from "./state.js";
export { initialLine, lineReducer } from "./line-editor.js";
export type { LineState, LineAction } from "./line-editor.js";
export { keyAction, keyHint, keyView, HELP } from "./keymap.js";
export type { KeyView, KeyResult, HintItem } from "./keymap.js";
export { parseKeys } from "./keys.js";
export type { KeyEvent, KeyName } from "./keys.js";
export { layoutFor } from "./layout.js";
export type { Layout, LayoutNeeds } from "./layout.js";
export { displayWidth, truncate, fit, graphemes } from "./text-width.js";
export { scoreBar } from "./score-bar.js";
export { markQuestion, percent } from "./marked-question.js";
export type { QuestionRun } from "./marked-question.js";
export { themeFor, COLOUR_THEME, PLAIN_THEME } from "./theme.js";
export type { Theme } from "./theme.js";
export type { TuiEngine, TuiResult, EntityCard, CardNeighbour, ClueView, CoverageRow, CoverageCell, AblationView, SuggestionView, PinView, OpenProgress } from "./view-types.js";
