/** A one-line message: progress while the catalog opens, an error, or a note. */
import { Box, Text } from "ink";
import { useContext } from "react";
import { ThemeContext } from "./ThemeContext.js";
import type { OpenProgress } from "../view-types.js";
import { scoreBar } from "../score-bar.js";

/** Props of {@link StatusLine}. */
export interface StatusLineProps {
  /** Progress of the opening catalog, if it is opening. */
  readonly progress?: OpenProgress;
  /** A message to show (errors start with "error:"). */
  readonly message?: string;
  /** Width in columns. */
  readonly width: number;
}

/** The status line. */
export function StatusLine(props: StatusLineProps) {
  const theme = useContext(ThemeContext);
  if (props.progress) {
    const p = props.progress;
    const pct = p.fraction !== undefined ? ` ${scoreBar(p.fraction, 1, 12)} ${Math.round(p.fraction * 100)}%` : " …";
    return (
      <Box width={props.width}>
        <Text wrap="truncate" color={theme.warn}>{`* ${p.phase}${pct}`}</Text>
      </Box>
    );
  }
  const msg = props.message ?? "";
  const isError = msg.startsWith("error");
  return (
    <Box width={props.width}>
      <Text wrap="truncate" color={isError ? theme.bad : theme.muted}>{msg ? `${isError ? "!" : "*"} ${msg}` : " "}</Text>
    </Box>
  );
}
