/** The one-line key hint of the current view: `key what · key what · …`, cut to fit. */
import { Box, Text } from "ink";
import { useContext } from "react";
import { ThemeContext } from "./ThemeContext.js";
import type { HintItem } from "../keymap.js";
import { displayWidth } from "../text-width.js";

/** Props of {@link KeyHint}. */
export interface KeyHintProps {
  readonly items: readonly HintItem[];
  /** Width in columns. */
  readonly width: number;
}

/** The items that fit in `width` columns, whole items only. */
export function hintThatFits(items: readonly HintItem[], width: number): HintItem[] {
  const out: HintItem[] = [];
  let used = 0;
  for (const it of items) {
    const w = displayWidth(it.key) + 1 + displayWidth(it.what) + (out.length > 0 ? 3 : 0);
    if (used + w > width) break;
    out.push(it);
    used += w;
  }
  return out;
}

/** The key hint line. */
export function KeyHint(props: KeyHintProps) {
  const theme = useContext(ThemeContext);
  const items = hintThatFits(props.items, props.width - 1);
  return (
    <Box width={props.width}>
      <Text wrap="truncate">
        {items.map((it, i) => (
          <Text key={it.key}>
            {i > 0 ? <Text color={theme.muted}>{" · "}</Text> : null}
            <Text bold inverse>{it.key}</Text>
            <Text>{" " + it.what}</Text>
          </Text>
        ))}
      </Text>
    </Box>
  );
}
