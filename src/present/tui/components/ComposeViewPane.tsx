/** Questions composed for an intended answer: each question, verified or not, its facts and its proof. */
import { Box, Text } from "ink";
import { useContext, type ReactNode } from "react";
import { ThemeContext } from "./ThemeContext.js";
import type { ComposeView } from "../view-types.js";
import { truncate } from "../text-width.js";

/** Props of {@link ComposeViewPane}. */
export interface ComposeViewPaneProps {
  /** The composition; undefined while composing; null when the entity is unknown. */
  readonly view: ComposeView | null | undefined;
  /** The intended answer's id (shown while composing). */
  readonly id: string;
  /** Selected proposal. */
  readonly cursor: number;
  /** Rows available. */
  readonly rows: number;
  /** Width in columns. */
  readonly width: number;
}

/** The compose pane. */
export function ComposeViewPane(props: ComposeViewPaneProps) {
  const theme = useContext(ThemeContext);
  const w = props.width;
  const v = props.view;
  const head = (
    <Text wrap="truncate">
      <Text bold color={theme.accent}>{"» compose "}</Text>
      <Text bold>{v ? v.target.label : props.id}</Text>
      <Text color={theme.muted}>{`  questions whose only answer is ${v ? v.target.id : props.id}${v ? ` · ${Math.round(v.millis)} ms` : ""}`}</Text>
    </Text>
  );
  if (!v) {
    return (
      <Box flexDirection="column" width={w} height={props.rows}>
        {head}
        <Text>{v === null ? "  no such entity in the catalog" : "  composing and asking each question back…"}</Text>
      </Box>
    );
  }
  const lines: { key: string; node: ReactNode }[] = [];
  v.proposals.forEach((p, i) => {
    const sel = i === props.cursor;
    lines.push({
      key: `q${i}`,
      node: (
        <Text wrap="truncate" bold={sel}>
          <Text color={theme.accent}>{sel ? "> " : "  "}</Text>
          <Text color={p.verified ? theme.accent : theme.muted}>{p.verified ? "[verified] " : "[NOT verified] "}</Text>
          {truncate(p.question, Math.max(8, w - 18))}
        </Text>
      ),
    });
    if (!p.verified && p.reason) lines.push({ key: `r${i}`, node: <Text wrap="truncate" color={theme.muted}>{`      ${truncate(p.reason, Math.max(8, w - 6))}`}</Text> });
    for (const [k, f] of p.facts.entries()) lines.push({ key: `f${i}.${k}`, node: <Text wrap="truncate" color={theme.muted}>{`      fact: ${truncate(f, Math.max(8, w - 12))}`}</Text> });
    lines.push({ key: `p${i}`, node: <Text wrap="truncate" color={theme.muted}>{`      proof: ${truncate(p.proof, Math.max(8, w - 13))}`}</Text> });
  });
  if (v.proposals.length === 0) lines.push({ key: "none", node: <Text>{"  no question singles it out"}</Text> });
  for (const [k, n] of v.notes.entries()) lines.push({ key: `n${k}`, node: <Text wrap="truncate" color={theme.muted}>{`  note: ${truncate(n, Math.max(8, w - 8))}`}</Text> });
  return (
    <Box flexDirection="column" width={w} height={props.rows} overflow="hidden">
      {head}
      {lines.slice(0, Math.max(1, props.rows - 1)).map((l) => (
        <Box key={l.key}>{l.node}</Box>
      ))}
    </Box>
  );
}
