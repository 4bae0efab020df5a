/** The help view: every key of every view, and what the marks mean. */
import { Box, Text } from "ink";
import { useContext } from "react";
import { ThemeContext } from "./ThemeContext.js";
import type { HintItem } from "../keymap.js";
import { displayWidth, fit } from "../text-width.js";
import { DISCLAIMER } from "../../../model/index.js";

/** Props of {@link HelpView}. */
export interface HelpViewProps {
  /** Sections to show. */
  readonly sections: readonly { readonly title: string; readonly keys: readonly HintItem[] }[];
  /** Rows available. */
  readonly rows: number;
  /** Width in columns. */
  readonly width: number;
}

/** The help view. */
export function HelpView(props: HelpViewProps) {
  const theme = useContext(ThemeContext);
  const lines: { key: string; title?: string; item?: HintItem }[] = [];
  for (const s of props.sections) {
    lines.push({ key: s.title, title: s.title });
    for (const k of s.keys) lines.push({ key: `${s.title}.${k.key}`, item: k });
  }
  const twoCols = props.width >= 150 && lines.length > props.rows - 1;
  const perCol = twoCols ? Math.ceil(lines.length / 2) : lines.length;
  const colW = twoCols ? Math.floor(props.width / 2) : props.width;
  // the key column is as wide as its widest key, plus the indent and a gap, so a key never runs into its text
  const widest = Math.max(0, ...lines.map((l) => (l.item ? displayWidth(l.item.key) : 0)));
  const keyW = Math.min(Math.max(8, Math.floor(colW / 2)), 2 + widest + 2);
  const render = (ls: typeof lines) =>
    ls.map((l) =>
      l.title ? (
        <Text key={l.key} bold color={theme.accent} wrap="truncate">{`» ${l.title}`}</Text>
      ) : (
        <Text key={l.key} wrap="truncate">
          <Text bold>{fit(`  ${l.item!.key}`, keyW - 1)}</Text>
          {` ${l.item!.what}`}
        </Text>
      ),
    );
  return (
    <Box flexDirection="column" width={props.width} height={props.rows} overflow="hidden">
      <Text bold wrap="wrap">{`help · ${DISCLAIMER}`}</Text>
      <Box flexDirection="row">
        <Box flexDirection="column" width={colW}>{render(lines.slice(0, perCol))}</Box>
        {twoCols ? <Box flexDirection="column" width={colW}>{render(lines.slice(perCol))}</Box> : null}
      </Box>
    </Box>
  );
}
