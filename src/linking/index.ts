/**
 * Entity linking: question text → catalog entities with calibrated confidences.
 * See README "How mentions are linked" for the confidence combination.
 */
export { Linker, linkQuestion, notFoundNote, parsePin, rankSpanCandidates, DEFAULTS as LINK_DEFAULTS } from "./linker.js";
export type { Pin, LinkedMention, UnlinkedSpan, LinkResult, LinkOptions, LinkerOptions, NotFound } from "./linker.js";
export { derivedTokens, labelRoot, wordRoots, DEFAULTS as DERIVATION_DEFAULTS } from "./derivation.js";
export type { DerivedToken } from "./derivation.js";
export { DEFAULTS as SCORING_DEFAULTS } from "./collective-disambiguation.js";
export type { ScoringOptions } from "./collective-disambiguation.js";
export { LexicalSnapshot } from "./lexical-snapshot.js";
export { LexicalBuilder } from "./lexical-builder.js";
export { questionTokens } from "./text-spans.js";
export type { QuestionToken } from "./text-spans.js";
export { jaroWinkler, jaro } from "./jaro-winkler.js";
export { milneWitten } from "./relatedness.js";
export { bm25, idf } from "./bm25.js";
export type { Bm25Stats } from "./bm25.js";
export { isStopWord, STOP_WORDS, QUESTION_WORDS } from "./stopwords.js";
