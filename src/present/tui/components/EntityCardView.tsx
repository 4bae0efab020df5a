/** An entity card: labels, aliases, types, description, attributes and neighbours. */
import { Box, Text } from "ink";
import { useContext, type ReactNode } from "react";
import { ThemeContext } from "./ThemeContext.js";
import type { EntityCard } from "../view-types.js";
import { fit, truncate } from "../text-width.js";

/** Props of {@link EntityCardView}. */
export interface EntityCardViewProps {
  /** The card; undefined while loading; null when the entity is unknown. */
  readonly card: EntityCard | null | undefined;
  /** The entity id (shown while loading). */
  readonly id: string;
  /** Selected neighbour row. */
  readonly cursor: number;
  /** Cards on the stack (this one included). */
  readonly depth: number;
  /** Rows available. */
  readonly rows: number;
  /** Width in columns. */
  readonly width: number;
}

/** The entity card. */
export function EntityCardView(props: EntityCardViewProps) {
  const theme = useContext(ThemeContext);
  const w = props.width;
  const head = (
    <Text wrap="truncate">
      <Text bold color={theme.accent}>{"» card "}</Text>
      <Text bold>{props.card ? props.card.label : props.id}</Text>
      <Text color={theme.muted}>{`  (${props.id})${props.depth > 1 ? `  · ${props.depth} cards deep` : ""}`}</Text>
    </Text>
  );
  if (props.card === undefined || props.card === null) {
    return (
      <Box flexDirection="column" width={w} height={props.rows}>
        {head}
        <Text>{props.card === null ? "  no such entity in the catalog" : "  loading…"}</Text>
      </Box>
    );
  }
  const c = props.card;
  const top: { key: string; node: ReactNode }[] = [];
  const field = (name: string, value: string) =>
    top.push({
      key: name,
      node: (
        <Text wrap="truncate">
          <Text color={theme.muted}>{fit(`  ${name}`, 14)}</Text>
          {truncate(value, Math.max(4, w - 14))}
        </Text>
      ),
    });
  field("types", c.types.length > 0 ? c.types.map((t) => t.label).join(", ") : "—");
  if (c.aliases.length > 0) field("also", c.aliases.join(" · "));
  if (c.description) field("about", c.description);
  const attrRoom = Math.max(1, Math.floor((props.rows - 4) / 3));
  for (const a of c.attributes.slice(0, attrRoom)) field(a.label, a.value);
  if (c.attributes.length > attrRoom) field("", `+${c.attributes.length - attrRoom} more attributes`);
  const listRows = Math.max(1, props.rows - 2 - top.length);
  const n = c.neighbours.length;
  const start = Math.max(0, Math.min(props.cursor - Math.floor(listRows / 2), n - listRows));
  const relW = Math.min(28, Math.max(12, Math.floor(w * 0.3)));
  return (
    <Box flexDirection="column" width={w} height={props.rows} overflow="hidden">
      {head}
      {top.map((t) => (
        <Box key={t.key}>{t.node}</Box>
      ))}
      <Text color={theme.muted} wrap="truncate">{`  neighbours (${n})${n > listRows ? `  ${start + 1}-${Math.min(n, start + listRows)}` : ""}`}</Text>
      {c.neighbours.slice(start, start + listRows).map((nb, k) => {
        const i = start + k;
        const sel = i === props.cursor;
        const arrow = nb.direction === "out" ? `—${nb.relationLabel}→` : `←${nb.relationLabel}—`;
        return (
          <Box key={`${i}`}>
            <Text wrap="truncate" inverse={sel} color={sel ? theme.accent : undefined}>
              {`${sel ? " >" : "  "} ${fit(arrow, relW)} ${nb.label}`}
            </Text>
          </Box>
        );
      })}
    </Box>
  );
}
