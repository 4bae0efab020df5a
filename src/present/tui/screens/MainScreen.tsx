/**
 * The whole screen for one state: title, question line, then either the results (marked
 * question, links, the reading and the words it ignores, verdict, answers, detail), an entity card, or help; then the status line
 * and the key hint. Pure composition of components; no state of its own.
 */
import { Box, Text } from "ink";
import { useContext } from "react";
import { AnswerList } from "../components/AnswerList.js";
import { DetailPane } from "../components/DetailPane.js";
import { ComposeViewPane } from "../components/ComposeViewPane.js";
import { EntityCardView } from "../components/EntityCardView.js";
import { HelpView } from "../components/HelpView.js";
import { KeyHint } from "../components/KeyHint.js";
import { MarkedQuestion, markedWidth } from "../components/MarkedQuestion.js";
import { MentionList } from "../components/MentionList.js";
import { QuestionLine } from "../components/QuestionLine.js";
import { ReadingLine, readingRows } from "../components/ReadingLine.js";
import { StatusLine } from "../components/StatusLine.js";
import { ThemeContext } from "../components/ThemeContext.js";
import { TitleBar } from "../components/TitleBar.js";
import { VerdictLine } from "../components/VerdictLine.js";
import { HELP, keyHint } from "../keymap.js";
import { layoutFor } from "../layout.js";
import { focusedEntity, type TuiState } from "../state.js";

/** The status-line form of the model's DISCLAIMER (the help view shows it in full). */
export const SHORT_DISCLAIMER = "ranked suggestions from the catalog, not facts: check the paths";

/** Props of {@link MainScreen}. */
export interface MainScreenProps {
  readonly state: TuiState;
  /** Terminal width. */
  readonly columns: number;
  /** Terminal height. */
  readonly rows: number;
}

/** The screen. */
export function MainScreen(props: MainScreenProps) {
  const theme = useContext(ThemeContext);
  const s = props.state;
  const v = s.view;
  const mentionsFocused = s.pane === "mentions" && s.cards.length === 0 && !s.help;
  const selMention = v?.result.mentions[s.mention];
  const questionRows = v && markedWidth(v.result.question, v.result.mentions) > props.columns ? 2 : 1;
  const layout = layoutFor(props.columns, props.rows, {
    mentions: v?.result.mentions.length ?? 0,
    candidates: mentionsFocused && selMention ? 1 + selMention.alternatives.length : 0,
    answers: v?.result.answers.length ?? 0,
    questionRows,
    readingRows: readingRows(v?.result.reading),
  });
  const W = layout.columns;
  const status = s.engine === "opening" ? "opening…" : s.engine === "failed" ? "failed" : s.request ? "asking…" : "ready";
  const top = s.cards[s.cards.length - 1];
  const cursorId = focusedEntity(s);
  const message = s.message ?? (v ? `${v.result.answers.length} answer${v.result.answers.length === 1 ? "" : "s"} in ${Math.round(v.millis)} ms · ${v.notes[0] ?? SHORT_DISCLAIMER}` : s.engine === "ready" ? "type a question and press enter" : undefined);

  let body;
  if (s.help) {
    body = <HelpView sections={HELP} rows={layout.bodyRows - 1} width={W} />;
  } else if (s.compose) {
    body = <ComposeViewPane view={s.compose.view} id={s.compose.id} cursor={s.compose.cursor} rows={layout.bodyRows - 1} width={W} />;
  } else if (top) {
    body = <EntityCardView card={top.card} id={top.id} cursor={top.cursor} depth={s.cards.length} rows={layout.bodyRows - 1} width={W} />;
  } else if (!v) {
    body = (
      <Box flexDirection="column" height={layout.bodyRows - 1}>
        <Text color={theme.muted}>{"  Ask about the catalog in plain English, e.g. which X did the Y of Z …"}</Text>
        <Text color={theme.muted}>{"  Answers are ranked suggestions drawn from the catalog, not facts."}</Text>
      </Box>
    );
  } else {
    const answers = (
      <AnswerList
        answers={v.result.answers}
        labels={v.labels}
        selected={s.answer}
        focused={s.pane === "answers"}
        tied={v.result.verdict.status === "tied" ? v.result.verdict.tiedWith : []}
        rows={layout.answerRows}
        width={layout.answersWidth}
      />
    );
    const detail = (
      <DetailPane
        view={v}
        answer={s.answer}
        tab={s.tab}
        {...(s.pane === "detail" && cursorId !== undefined ? { cursorId } : {})}
        focused={s.pane === "detail"}
        rows={layout.detailRows}
        width={layout.detailWidth}
      />
    );
    body = (
      <Box flexDirection="column" height={layout.bodyRows - 1} overflow="hidden">
        <MarkedQuestion question={v.result.question} mentions={v.result.mentions} selected={mentionsFocused ? s.mention : -1} width={W} rows={questionRows} />
        {layout.mentionRows > 0 ? (
          <MentionList mentions={v.result.mentions} selected={s.mention} candidate={s.alternative} focused={mentionsFocused} rows={layout.mentionRows} width={W} />
        ) : null}
        {v.result.reading ? <ReadingLine reading={v.result.reading} width={W} /> : null}
        <VerdictLine verdict={v.result.verdict} labels={v.labels} width={W} />
        {layout.sideBySide ? (
          <Box flexDirection="row">
            {answers}
            <Box width={1} />
            {detail}
          </Box>
        ) : (
          <Box flexDirection="column">
            {answers}
            {detail}
          </Box>
        )}
      </Box>
    );
  }
  return (
    <Box flexDirection="column" width={W} height={layout.rows} overflow="hidden">
      <TitleBar title={s.title} status={status} width={W} />
      <QuestionLine text={s.line.text} cursor={s.line.cursor} focused={s.pane === "question" && s.cards.length === 0 && !s.help} width={W} placeholder={v ? "(type a new question)" : "type a question…"} />
      {body}
      <StatusLine {...(s.progress ? { progress: s.progress } : {})} {...(message !== undefined ? { message } : {})} width={W} />
      <KeyHint items={keyHint(s)} width={W} />
    </Box>
  );
}
