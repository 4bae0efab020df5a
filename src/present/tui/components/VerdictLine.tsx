/** The verdict: a mark, the status word, the lead, and the reason or the tied answers. */
import { Box, Text } from "ink";
import { useContext } from "react";
import type { Verdict } from "../../../model/index.js";
import { ThemeContext } from "./ThemeContext.js";
import { truncate } from "../text-width.js";

/** Props of {@link VerdictLine}. */
export interface VerdictLineProps {
  readonly verdict: Verdict;
  /** Labels for tied ids. */
  readonly labels: Readonly<Record<string, string>>;
  /** Width in columns. */
  readonly width: number;
}

/** The mark of each verdict status, readable without colour. */
export const VERDICT_MARK: Readonly<Record<Verdict["status"], string>> = { unique: "(=)", tied: "(~)", weak: "(?)", none: "(-)" };

/** The verdict line. */
export function VerdictLine(props: VerdictLineProps) {
  const theme = useContext(ThemeContext);
  const v = props.verdict;
  const colour = v.status === "unique" ? theme.good : v.status === "none" ? theme.bad : theme.warn;
  const head = `${VERDICT_MARK[v.status]} ${v.status.toUpperCase()}`;
  const parts: string[] = [];
  if (v.status !== "none") parts.push(`lead ${Math.round(v.margin * 100)}%`);
  if (v.status === "tied" && v.tiedWith.length > 0) parts.push(`tied with ${v.tiedWith.map((id) => props.labels[id] ?? id).join(", ")}`);
  if (v.reason) parts.push(v.reason);
  const rest = parts.length > 0 ? " · " + parts.join(" · ") : "";
  return (
    <Box width={props.width}>
      <Text wrap="truncate">
        <Text>{"verdict "}</Text>
        <Text bold color={colour}>{head}</Text>
        <Text>{truncate(rest, Math.max(0, props.width - head.length - 8))}</Text>
      </Text>
    </Box>
  );
}
