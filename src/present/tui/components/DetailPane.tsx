/**
 * The detail area of the selected answer, one tab at a time: its paths per clue, the
 * clue-coverage table, clue ablation, and suggested clues. The entity under the cursor is
 * marked `[like this]`.
 */
import { Box, Text } from "ink";
import { useContext, type ReactNode } from "react";
import { ThemeContext } from "./ThemeContext.js";
import type { TuiResult } from "../view-types.js";
import { DETAIL_TABS, type DetailTab } from "../state.js";
import { pathSegments } from "../path-text.js";
import { fit, truncate } from "../text-width.js";
import { scoreBar } from "../score-bar.js";

/** Props of {@link DetailPane}. */
export interface DetailPaneProps {
  readonly view: TuiResult;
  /** Selected answer. */
  readonly answer: number;
  readonly tab: DetailTab;
  /** Id of the entity under the cursor (marked), if any. */
  readonly cursorId?: string;
  /** True when the area has the keyboard. */
  readonly focused: boolean;
  /** Rows available, the tab bar included. */
  readonly rows: number;
  /** Width in columns. */
  readonly width: number;
}

const TAB_TITLE: Readonly<Record<DetailTab, string>> = { paths: "paths", coverage: "coverage", ablation: "ablation", suggestions: "suggested clues" };

/** One rendered line with a key. */
interface Line {
  readonly key: string;
  readonly node: ReactNode;
  /** Entity ids shown on the line (to keep the cursor in view). */
  readonly ids?: readonly string[];
}

function pathLines(p: DetailPaneProps): Line[] {
  const v = p.view;
  const a = v.result.answers[p.answer];
  if (!a) return [];
  if (a.paths.length === 0) return [{ key: "none", node: <Text>  no paths for this answer</Text> }];
  const lines: Line[] = [];
  const byClue = new Map<string, typeof a.paths[number][]>();
  for (const path of a.paths) byClue.set(path.from, [...(byClue.get(path.from) ?? []), path]);
  for (const [clue, paths] of byClue) {
    lines.push({ key: `h${clue}`, node: <Text bold>{truncate(`from clue ${v.labels[clue] ?? clue}:`, p.width)}</Text> });
    paths.forEach((path, k) => {
      const segs = pathSegments(path, v.labels);
      lines.push({
        key: `p${clue}.${k}`,
        ids: segs.flatMap((s) => (s.kind === "entity" ? [s.id] : [])),
        node: (
          <Text wrap="truncate">
            {"  "}
            {segs.map((s, j) =>
              s.kind === "edge" ? (
                <Text key={j}>{s.text}</Text>
              ) : s.id === p.cursorId && p.focused ? (
                <Text key={j} inverse bold>[{s.text}]</Text>
              ) : (
                <Text key={j} bold={s.id === a.id}>{s.text}</Text>
              ),
            )}
            <Text> ({path.steps.length} hop{path.steps.length === 1 ? "" : "s"})</Text>
          </Text>
        ),
      });
    });
  }
  return lines;
}

function coverageLines(p: DetailPaneProps): Line[] {
  const v = p.view;
  if (v.clues.length === 0 || v.coverage.length === 0) return [{ key: "none", node: <Text>  no clues to compare</Text> }];
  const labelW = Math.min(24, Math.max(10, Math.floor(p.width * 0.28)));
  const cellW = Math.max(8, Math.floor((p.width - labelW - 4) / v.clues.length) - 1);
  const lines: Line[] = [
    {
      key: "head",
      node: (
        <Text wrap="truncate" bold>
          {"  "}{fit("answer \\ clue", labelW)}{v.clues.map((c) => " " + fit(c.label, cellW)).join("")}
        </Text>
      ),
    },
  ];
  v.coverage.forEach((row, i) => {
    const marked = row.id === p.cursorId && p.focused;
    const sel = i === p.answer;
    lines.push({
      key: `r${row.id}`,
      ids: [row.id],
      node: (
        <Text wrap="truncate">
          <Text>{sel ? "> " : "  "}</Text>
          <Text inverse={marked} bold={sel}>{fit(marked ? `[${row.label}]` : row.label, labelW)}</Text>
          {row.cells.map((c, j) => {
            const bar = c.strength !== undefined && c.reached ? scoreBar(c.strength, 1, 3) + " " : "";
            const text = c.reached ? `${bar}${c.text}` : `-- ${c.text}`;
            return <Text key={j}>{" " + fit(text, cellW)}</Text>;
          })}
        </Text>
      ),
    });
  });
  return lines;
}

function ablationLines(p: DetailPaneProps): Line[] {
  const v = p.view;
  if (v.ablation.length === 0) return [{ key: "none", node: <Text>  {v.clues.length <= 1 ? "one clue only: nothing to drop" : "no ablation for this question"}</Text> }];
  return v.ablation.map((r) => {
    const marked = r.clue === p.cursorId && p.focused;
    return {
      key: `a${r.clue}`,
      ids: [r.clue],
      node: (
        <Text wrap="truncate">
          {"  without "}
          <Text inverse={marked} bold>{marked ? `[${r.label}]` : r.label}</Text>
          {`: ${r.effect.toUpperCase()} · ${r.text}`}
        </Text>
      ),
    };
  });
}

function suggestionLines(p: DetailPaneProps): Line[] {
  const v = p.view;
  if (v.suggestions.length === 0) {
    const st = v.result.verdict.status;
    return [{ key: "none", node: <Text>  {st === "unique" ? "the answer is unique: no clue needed" : "no suggested clues"}</Text> }];
  }
  return v.suggestions.map((s, i) => {
    const marked = s.entity !== undefined && s.entity === p.cursorId && p.focused;
    const extra = [s.rulesOut !== undefined ? `rules out ${s.rulesOut}` : "", s.fact ?? ""].filter((x) => x).join(" · ");
    return {
      key: `s${i}`,
      ids: s.entity !== undefined ? [s.entity] : [],
      node: (
        <Text wrap="truncate">
          {"  + "}
          <Text bold inverse={marked}>{marked ? `[${s.text}]` : s.text}</Text>
          {extra ? `  (${extra})` : ""}
        </Text>
      ),
    };
  });
}

/** The detail area. */
export function DetailPane(props: DetailPaneProps) {
  const theme = useContext(ThemeContext);
  const a = props.view.result.answers[props.answer];
  const lines =
    props.tab === "paths" ? pathLines(props) : props.tab === "coverage" ? coverageLines(props) : props.tab === "ablation" ? ablationLines(props) : suggestionLines(props);
  const body = Math.max(0, props.rows - 1);
  // keep the cursor's line in view
  let start = 0;
  if (props.cursorId) {
    const hit = lines.findIndex((l) => l.ids?.includes(props.cursorId!) ?? false);
    if (hit >= body) start = hit - body + 1;
  }
  const more = lines.length - start - body;
  return (
    <Box flexDirection="column" width={props.width} height={props.rows} overflow="hidden">
      <Box>
        <Text wrap="truncate">
          <Text bold={props.focused} color={props.focused ? theme.accent : undefined}>{props.focused ? "» " : "  "}</Text>
          {DETAIL_TABS.map((t, i) => (
            <Text key={t} bold={t === props.tab} color={t === props.tab ? theme.accent : theme.muted}>
              {t === props.tab ? `[${i + 1} ${TAB_TITLE[t]}]` : ` ${i + 1} ${TAB_TITLE[t]} `}
            </Text>
          ))}
          <Text color={theme.muted}>{a ? `  · ${truncate(a.label, 24)}` : ""}{more > 0 ? ` · +${more} more` : ""}</Text>
        </Text>
      </Box>
      {lines.slice(start, start + body).map((l) => (
        <Box key={l.key}>{l.node}</Box>
      ))}
    </Box>
  );
}
