/** The asked question with its linked mentions marked `[text 93%]` (a fixed link `[text!]`). */
import { Box, Text } from "ink";
import { useContext } from "react";
import type { Mention } from "../../../model/index.js";
import { ThemeContext } from "./ThemeContext.js";
import { markQuestion, percent } from "../marked-question.js";
import type { Theme } from "../theme.js";
import { displayWidth } from "../text-width.js";

/** Props of {@link MarkedQuestion}. */
export interface MarkedQuestionProps {
  /** The question as asked. */
  readonly question: string;
  /** Its linked mentions. */
  readonly mentions: readonly Mention[];
  /** Index of the selected mention, -1 for none. */
  readonly selected: number;
  /** Width in columns. */
  readonly width: number;
  /** Rows it may wrap onto. @default 1 */
  readonly rows?: number;
}

/** Display width of the marked question, to decide how many rows it needs. */
export function markedWidth(question: string, mentions: readonly Mention[]): number {
  let extra = 5;
  for (const m of mentions) extra += 2 + (m.pinned ? 1 : 1 + percent(m.confidence).length);
  return displayWidth(question) + extra;
}

/** Colour of a confidence (second channel; the percentage is always printed). */
export function confidenceColour(theme: Theme, c: number): string | undefined {
  return c >= 0.75 ? theme.good : c >= 0.4 ? theme.warn : theme.bad;
}

/** The asked question with its mentions marked. */
export function MarkedQuestion(props: MarkedQuestionProps) {
  const theme = useContext(ThemeContext);
  const runs = markQuestion(props.question, props.mentions);
  return (
    <Box width={props.width} height={props.rows ?? 1} overflow="hidden">
      <Text wrap={(props.rows ?? 1) > 1 ? "wrap" : "truncate-end"}>
        <Text color={theme.muted}>{"  Q: "}</Text>
        {runs.map((r, i) => {
          if (r.mention === undefined) return <Text key={i}>{r.text}</Text>;
          const m = props.mentions[r.mention]!;
          const mark = m.pinned ? "!" : ` ${percent(m.confidence)}`;
          return (
            <Text key={i} bold inverse={r.mention === props.selected} color={confidenceColour(theme, m.confidence)}>
              [{r.text}{mark}]
            </Text>
          );
        })}
      </Text>
    </Box>
  );
}
