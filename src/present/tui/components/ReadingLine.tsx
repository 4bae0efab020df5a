/** The reading of the question (its query graph in one line, as `ask` prints it) and the words it ignores. */
import { Box, Text } from "ink";
import { useContext } from "react";
import type { ReadingDoc } from "../../../model/index.js";
import { ignoredLine, readingLine } from "../../reading-line.js";
import { ThemeContext } from "./ThemeContext.js";
import { truncate } from "../text-width.js";

/** Props of {@link ReadingLine}. */
export interface ReadingLineProps {
  readonly reading: ReadingDoc;
  /** Width in columns. */
  readonly width: number;
}

/** Rows {@link ReadingLine} takes for a reading: the reading, and the ignored words when there are any. */
export function readingRows(reading: ReadingDoc | undefined): number {
  if (!reading) return 0;
  return reading.ignored.length > 0 ? 2 : 1;
}

/** The reading line ("reading ?answer (vessel) ← operated by — …  [1 fits]") and, below it, "ignored 'x', 'y'". */
export function ReadingLine(props: ReadingLineProps) {
  const theme = useContext(ThemeContext);
  const rd = props.reading;
  // "reading " and "ignored " are 8 columns, as "verdict " is
  const room = Math.max(0, props.width - 8);
  return (
    <Box flexDirection="column" width={props.width}>
      <Text wrap="truncate">
        <Text>{"reading "}</Text>
        <Text color={rd.fallback ? theme.warn : undefined}>{truncate(readingLine(rd), room)}</Text>
      </Text>
      {rd.ignored.length > 0 ? (
        <Text wrap="truncate">
          <Text>{"ignored "}</Text>
          <Text color={theme.muted}>{truncate(ignoredLine(rd), room)}</Text>
        </Text>
      ) : null}
    </Box>
  );
}
