/**
 * Colours as a second channel only: every state is also shown by a mark (brackets,
 * asterisks, `>`), and colour is switched off when NO_COLOR is set (https://no-color.org,
 * "when present and not an empty string").
 */

/** Colour names (ink/chalk names) for each role, or undefined when colour is off. */
export interface Theme {
  /** Focused pane headings and the selection. */
  readonly accent?: string;
  /** A unique verdict, high confidence. */
  readonly good?: string;
  /** Tied/weak verdicts, middling confidence. */
  readonly warn?: string;
  /** No answer, low confidence, errors. */
  readonly bad?: string;
  /** Secondary text (ids, types). */
  readonly muted?: string;
}

/** The colour theme. */
export const COLOUR_THEME: Theme = { accent: "cyan", good: "green", warn: "yellow", bad: "red", muted: "gray" };
/** No colour at all. */
export const PLAIN_THEME: Theme = {};

/** The theme for an environment: plain when NO_COLOR is set to a non-empty value. */
export function themeFor(env: Readonly<Record<string, string | undefined>>): Theme {
  const nc = env["NO_COLOR"];
  return nc !== undefined && nc !== "" ? PLAIN_THEME : COLOUR_THEME;
}
