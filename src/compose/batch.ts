/**
 * Batch composition: a file of intended answers, one per line (an entity id or label; blank
 * lines and lines starting with `#` skipped), each composed in turn. Every line is resolved
 * before any is composed: an unknown or ambiguous name is reported as `FILE:LINE: message`
 * (all of them, up to a limit) and nothing is composed.
 */
import { readFileSync } from "node:fs";
import { TiepointError } from "../model/index.js";
import { resolveTarget, type Composer, type ComposeOptions, type Composition } from "./compose.js";

/** Limits of {@link readAnswerFile}. */
export const DEFAULTS = Object.freeze({
  /** Bad lines reported before reading stops. */
  maxErrors: 50,
});

/** One intended answer of a batch file. */
export interface AnswerLine {
  readonly line: number;
  readonly name: string;
  readonly entity: number;
}

/** Reads and resolves a file of intended answers (throws a TiepointError naming FILE:LINE for every bad line). */
export function readAnswerFile(composer: Composer, file: string): AnswerLine[] {
  let text: string;
  try {
    text = readFileSync(file, "utf8");
  } catch (e) {
    throw new TiepointError("compose/batch", `cannot read the file: ${(e as NodeJS.ErrnoException).code ?? String(e)}`, { file });
  }
  const out: AnswerLine[] = [];
  const errors: TiepointError[] = [];
  text.split(/\r?\n/).forEach((raw, i) => {
    const name = raw.split("\t")[0]!.trim();
    if (name === "" || name.startsWith("#") || errors.length >= DEFAULTS.maxErrors) return;
    const nums = resolveTarget(composer.session.catalog, name);
    if (nums.length === 1) out.push({ line: i + 1, name, entity: nums[0]! });
    else if (nums.length === 0) errors.push(new TiepointError("compose/batch", `no entity with id or label ${JSON.stringify(name)}`, { file, line: i + 1 }));
    else errors.push(new TiepointError("compose/batch", `${JSON.stringify(name)} names ${nums.length} entities (${nums.slice(0, 5).map((n) => composer.session.ref(n).id).join(", ")}${nums.length > 5 ? ", …" : ""}); give an id`, { file, line: i + 1 }));
  });
  const [first, ...rest] = errors;
  if (first) throw new TiepointError(first.code, first.message, { file: first.file, line: first.line, more: rest });
  if (out.length === 0) throw new TiepointError("compose/batch", "no intended answer in the file (one entity id or label per line)", { file });
  return out;
}

/** Composes every line of a batch (progress through `onEach`). */
export async function composeBatch(composer: Composer, lines: readonly AnswerLine[], options: ComposeOptions = {}, onEach?: (done: number, total: number) => void): Promise<{ line: number; name: string; composition: Composition }[]> {
  const out: { line: number; name: string; composition: Composition }[] = [];
  for (const [i, l] of lines.entries()) {
    const composition = await composer.compose(l.entity, options);
    onEach?.(i + 1, lines.length);
    out.push({ line: l.line, name: l.name, composition });
  }
  return out;
}
