/** The top line: program, catalog, and what the engine is doing. */
import { Box, Text } from "ink";
import { useContext } from "react";
import { ThemeContext } from "./ThemeContext.js";
import { fit, displayWidth } from "../text-width.js";

/** Props of {@link TitleBar}. */
export interface TitleBarProps {
  /** The catalog title ("" while opening). */
  readonly title: string;
  /** A short status, e.g. "ready", "asking…". */
  readonly status: string;
  /** Width in columns. */
  readonly width: number;
}

/** The top line. */
export function TitleBar(props: TitleBarProps) {
  const theme = useContext(ThemeContext);
  const right = `[${props.status}]`;
  const left = `tiepoint · ${props.title || "opening…"}`;
  const room = Math.max(1, props.width - displayWidth(right) - 1);
  return (
    <Box width={props.width}>
      <Text bold color={theme.accent} wrap="truncate">{fit(left, room)} </Text>
      <Text color={theme.muted}>{right}</Text>
    </Box>
  );
}
