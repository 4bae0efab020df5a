/** The ranked answers: rank, label, score bar, score, types; the selected one marked `>`. */
import { Box, Text } from "ink";
import { useContext } from "react";
import type { Answer } from "../../../model/index.js";
import { ThemeContext } from "./ThemeContext.js";
import { scoreBar } from "../score-bar.js";
import { fit } from "../text-width.js";

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
  const labelW = Math.max(8, Math.floor((w - barW - 16) * 0.6));
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
        const types = a.types.map((t) => props.labels[t] ?? t).join(", ");
        const typeW = Math.max(0, w - 4 - String(i + 1).length - labelW - barW - 9);
        return (
          <Box key={a.id}>
            <Text wrap="truncate" inverse={sel && props.focused}>
              <Text bold={sel} color={sel ? theme.accent : undefined}>{`${mark}${tie}${String(i + 1).padStart(2)} `}</Text>
              <Text bold={sel}>{fit(a.label, labelW)} </Text>
              <Text color={theme.accent}>{scoreBar(a.score, max, barW)}</Text>
              <Text>{` ${a.score.toFixed(3).padStart(6)} `}</Text>
              <Text color={theme.muted}>{fit(types, typeW)}</Text>
            </Text>
          </Box>
        );
      })}
    </Box>
  );
}
