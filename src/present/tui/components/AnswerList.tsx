/**
 * The ranked answers: rank, label, score bar, score, then the value that met each condition
 * (when the question has conditions) or the types; the selected one marked `>`.
 */
import { Box, Text } from "ink";
import { useContext } from "react";
import type { Answer } from "../../../model/index.js";
import { ThemeContext } from "./ThemeContext.js";
import { scoreBar } from "../score-bar.js";
import { displayWidth, fit } from "../text-width.js";

/** Layout of the answer list. */
export const DEFAULTS = {
  /** Columns kept for the last column (condition values or types) when labels are long (at most a quarter of the free width). */
  minRestColumns: 12,
};

/** Props of {@link AnswerList}. */
export interface AnswerListProps {
  readonly answers: readonly Answer[];
  /** Labels of type ids. */
  readonly labels: Readonly<Record<string, string>>;
  /** Selected answer. */
  readonly selected: number;
  /** True when the list has the keyboard. */
  readonly focused: boolean;
  /** Ids tied with the best answer (marked `~`). */
  readonly tied: readonly string[];
  /** Rows available. */
  readonly rows: number;
  /** Width in columns. */
  readonly width: number;
}

/** The answer list, scrolled to keep the selection in view. */
export function AnswerList(props: AnswerListProps) {
  const theme = useContext(ThemeContext);
  const w = props.width;
  const max = props.answers[0]?.score ?? 0;
  const barW = w >= 100 ? 16 : w >= 70 ? 10 : 6;
  const start = Math.max(0, Math.min(props.selected - props.rows + 1, props.answers.length - props.rows));
  const shown = props.answers.slice(Math.max(0, start), Math.max(0, start) + props.rows);
  // columns: mark, tie, rank and a space; the label and a space; the bar; " score "; the rest.
  // The label takes the width its longest shown label needs (answers are what the user reads),
  // the last column (the value that met a condition, else the types) what is left.
  const rankW = String(Math.max(0, start) + shown.length).length;
  const fixed = 2 + Math.max(2, rankW) + 1 + 1 + barW + 8;
  const avail = Math.max(8, w - fixed);
  const longest = Math.max(1, ...shown.map((a) => displayWidth(a.label)));
  const reserve = Math.min(DEFAULTS.minRestColumns, Math.floor(avail / 4));
  const labelW = Math.max(Math.min(8, avail), Math.min(longest, avail - reserve));
  if (props.answers.length === 0) {
    return (
      <Box width={w} height={props.rows}>
        <Text color={theme.muted}>  no answers</Text>
      </Box>
    );
  }
  return (
    <Box flexDirection="column" width={w} height={props.rows} overflow="hidden">
      {shown.map((a, k) => {
        const i = Math.max(0, start) + k;
        const sel = i === props.selected;
        const mark = sel ? (props.focused ? ">" : "·") : " ";
        const tie = props.tied.length > 0 && (i === 0 || props.tied.includes(a.id)) ? "~" : " ";
        // the value that met (or failed) each condition of the question, else the types
        // (the step text is "label: value satisfies|fails op bound", explain/conditions.ts: the value part is kept)
        const rest = a.values && a.values.length > 0 ? a.values.map((x) => x.text.replace(/ (satisfies|fails) .*$/, "")).join("; ") : a.types.map((t) => props.labels[t] ?? t).join(", ");
        const restW = Math.max(0, w - fixed - labelW);
        return (
          <Box key={a.id}>
            <Text wrap="truncate" inverse={sel && props.focused}>
              <Text bold={sel} color={sel ? theme.accent : undefined}>{`${mark}${tie}${String(i + 1).padStart(2)} `}</Text>
              <Text bold={sel}>{fit(a.label, labelW)} </Text>
              <Text color={theme.accent}>{scoreBar(a.score, max, barW)}</Text>
              <Text>{` ${a.score.toFixed(3).padStart(6)} `}</Text>
              <Text color={a.values && a.values.length > 0 ? undefined : theme.muted}>{fit(rest, restW)}</Text>
            </Text>
          </Box>
        );
      })}
    </Box>
  );
}
