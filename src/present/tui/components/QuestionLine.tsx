/** The question line: a prompt, the text being edited, and the cursor. */
import { Box, Text } from "ink";
import { useContext } from "react";
import { ThemeContext } from "./ThemeContext.js";
import { displayWidth, graphemes } from "../text-width.js";

/** Props of {@link QuestionLine}. */
export interface QuestionLineProps {
  /** The text being edited. */
  readonly text: string;
  /** Cursor offset (UTF-16) into `text`. */
  readonly cursor: number;
  /** True when the line has the keyboard. */
  readonly focused: boolean;
  /** Width in columns. */
  readonly width: number;
  /** Shown when the line is empty. */
  readonly placeholder?: string;
}

/** The question line; the cursor is an inverse cell, the focus a `»` prompt. */
export function QuestionLine(props: QuestionLineProps) {
  const theme = useContext(ThemeContext);
  const prompt = props.focused ? "ask » " : "ask   ";
  const room = Math.max(4, props.width - prompt.length - 1);
  let before = props.text.slice(0, props.cursor);
  const atCursor = graphemes(props.text.slice(props.cursor))[0] ?? " ";
  const after = props.text.slice(props.cursor + (atCursor === " " && props.cursor >= props.text.length ? 0 : atCursor.length));
  // keep the cursor in view: drop leading graphemes when the text before it is too wide
  let cut = false;
  while (displayWidth(before) > room - 2 && before.length > 0) {
    before = before.slice(graphemes(before)[0]!.length);
    cut = true;
  }
  const shownBefore = cut ? "…" + before : before;
  const restRoom = Math.max(0, room - displayWidth(shownBefore) - displayWidth(atCursor));
  let shownAfter = "";
  for (const g of graphemes(after)) {
    if (displayWidth(shownAfter + g) > restRoom) break;
    shownAfter += g;
  }
  if (props.text.length === 0 && !props.focused) {
    return (
      <Box width={props.width}>
        <Text color={theme.muted}>{prompt}{props.placeholder ?? ""}</Text>
      </Box>
    );
  }
  return (
    <Box width={props.width}>
      <Text bold={props.focused} color={props.focused ? theme.accent : undefined}>{prompt}</Text>
      <Text wrap="truncate">
        {shownBefore}
        {props.focused ? <Text inverse>{atCursor}</Text> : atCursor}
        {shownAfter}
      </Text>
      {props.text.length === 0 && props.placeholder ? <Text color={theme.muted} wrap="truncate"> {props.placeholder}</Text> : null}
    </Box>
  );
}
