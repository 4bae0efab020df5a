/**
 * The links pane: one row per linked mention (what it was linked to, confidence, how many
 * candidates), and under the selected one its candidates when the pane has the keyboard.
 */
import { Box, Text } from "ink";
import { useContext, type ReactNode } from "react";
import type { Mention } from "../../../model/index.js";
import { ThemeContext } from "./ThemeContext.js";
import { confidenceColour } from "./MarkedQuestion.js";
import { percent } from "../marked-question.js";
import { fit, truncate } from "../text-width.js";

/** Props of {@link MentionList}. */
export interface MentionListProps {
  readonly mentions: readonly Mention[];
  /** Selected mention. */
  readonly selected: number;
  /** Selected candidate of the selected mention: 0 = current entity, k = alternative k-1. */
  readonly candidate: number;
  /** True when the pane has the keyboard (candidates are listed). */
  readonly focused: boolean;
  /** Rows available. */
  readonly rows: number;
  /** Width in columns. */
  readonly width: number;
}

/** The links pane. */
export function MentionList(props: MentionListProps) {
  const theme = useContext(ThemeContext);
  const w = props.width;
  const lines: { key: string; node: ReactNode }[] = [];
  props.mentions.forEach((m, i) => {
    const sel = props.focused && i === props.selected;
    const alts = m.alternatives.length;
    const text = `${sel ? ">" : " "} "${truncate(m.text, 24)}" → ${m.entity.label}${m.pinned ? " (fixed)" : ""}  ‹${m.entity.id}›`;
    const tail = ` ${percent(m.confidence).padStart(4)}  ${alts > 0 ? `+${alts} other${alts > 1 ? "s" : ""}` : "only one"}`;
    lines.push({
      key: `m${i}`,
      node: (
        <Text wrap="truncate">
          <Text bold={sel} color={sel ? theme.accent : undefined}>{fit(text, Math.max(10, w - tail.length))}</Text>
          <Text color={confidenceColour(theme, m.confidence)}>{tail}</Text>
        </Text>
      ),
    });
    if (sel) {
      const cands = [{ ...m.entity, confidence: m.confidence, current: true }, ...m.alternatives.map((a) => ({ ...a, current: false }))];
      cands.forEach((c, k) => {
        const on = k === props.candidate;
        const label = `     ${on ? ">" : " "} ${c.current ? "*" : " "} ${c.label}  ‹${c.id}›`;
        const right = ` ${percent(c.confidence).padStart(4)}${c.current ? "  linked" : on ? "  enter: re-link" : ""}`;
        lines.push({
          key: `c${i}.${k}`,
          node: (
            <Text wrap="truncate" inverse={on} color={on ? theme.accent : undefined}>
              {fit(label, Math.max(10, w - right.length - 1))}
              {right}
            </Text>
          ),
        });
      });
    }
  });
  // keep the selected candidate in view
  let start = 0;
  if (props.focused) {
    const selRow = lines.findIndex((l) => l.key === `c${props.selected}.${props.candidate}`);
    if (selRow >= props.rows) start = selRow - props.rows + 1;
  }
  return (
    <Box flexDirection="column" width={w} height={props.rows} overflow="hidden">
      {lines.slice(start, start + props.rows).map((l) => (
        <Box key={l.key}>{l.node}</Box>
      ))}
    </Box>
  );
}
