/**
 * General English paraphrases of relation words: question verbs against noun-style labels.
 *
 * Method: a hand-built paraphrase lexicon from question words to the words relation labels
 * commonly use for the same relation — "born" ~ "birth" (place of birth), "married" ~
 * "spouse", "studied" ~ "educated", "starred" ~ "cast" — as in the lexicon step of semantic
 * parsing over knowledge bases (Berant, Chou, Frostig & Liang 2013, "Semantic Parsing on
 * Freebase from Question-Answer Pairs", EMNLP: a lexicon maps phrases to predicates; theirs
 * is learned from text alignment, this one is a short general-English list, common
 * practice). Irregular verb forms ("wrote", "led", "taught") are listed because stemming
 * does not reach them. Both sides are Porter-stemmed (Porter 1980) at load, like the
 * question words and the relation surfaces they are compared with; a lexicon match counts
 * `LEXICON_CREDIT` of a direct one. No catalog names or words: the same list serves every
 * catalog.
 *
 * Also: a closed compound ("birthplace") matches a two-word surface whose stems it spells
 * ("birth place", "place of birth"), {@link compoundCovers}.
 */
import { stemToken, tokens } from "../catalog/index.js";
import { isFunctionWord } from "./words.js";

/** Credit of a lexicon match relative to a direct stem match. */
export const LEXICON_CREDIT = 0.9;

/**
 * Question words → phrases relation labels use for the same relation (general English). A
 * phrase of several words counts only where a label holds all of them ("cast member" from
 * "starred"), so its words never match alone ("member" is not "starred").
 */
const PARAPHRASES: readonly (readonly [readonly string[], readonly string[]])[] = [
  [["born", "birth", "birthplace", "birthday", "birthdate"], ["birth", "born", "place of birth", "birth place"]],
  [["die", "died", "dies", "death", "dead"], ["death", "died", "place of death", "death place"]],
  [["married", "marry", "marries", "wife", "husband", "wed", "wedded", "spouse"], ["spouse", "married", "marriage", "partner", "wife", "husband"]],
  [["study", "studied", "studies", "student", "graduated", "graduate", "alumnus", "alumna", "alumni", "attended", "educated"], ["educated", "education", "alma mater", "school", "student", "studied", "alumnus"]],
  [["star", "starred", "stars", "starring", "acted", "act", "acts", "actor", "actress", "appeared", "appears"], ["cast", "cast member", "starring", "actor", "performer", "appears"]],
  [["wrote", "write", "writes", "written", "writer"], ["author", "writer", "written", "wrote"]],
  [["work", "works", "worked", "employed", "employs", "employee"], ["employer", "employee", "employment", "works", "work", "affiliation"]],
  [["live", "lives", "lived", "reside", "resides", "resided", "resident"], ["residence", "resident", "lives", "place of residence"]],
  [["founded", "found", "founds", "founder", "established"], ["founder", "founded", "founding", "established"]],
  [["created", "create", "creates", "creator", "made", "make", "makes"], ["creator", "author", "maker", "manufacturer", "made"]],
  [["composed", "compose", "composer"], ["composer", "composed"]],
  [["produced", "produce", "produces", "producer"], ["producer", "produced", "production company"]],
  [["published", "publish", "publishes", "publisher"], ["publisher", "published", "publication"]],
  [["invented", "invent", "inventor"], ["inventor", "invented", "discoverer"]],
  [["taught", "teach", "teaches", "teacher"], ["teacher", "taught", "instructor", "advisor", "doctoral advisor", "supervisor"]],
  [["led", "lead", "leads", "leader", "headed", "heads", "head"], ["leader", "lead", "head", "chair", "director"]],
  [["owned", "own", "owns", "owner"], ["owner", "owned", "owned by", "ownership"]],
  [["located", "situated", "lies", "lie", "location"], ["location", "located", "situated"]],
  [["speak", "speaks", "spoken", "spoke"], ["language", "spoken", "languages spoken"]],
];

/** Content-word stems of a phrase (function words dropped, as in the relation surfaces). */
function phraseStems(phrase: string): string[] {
  const all = tokens(phrase);
  const content = all.filter((t) => !isFunctionWord(t));
  return (content.length > 0 ? content : all).map(stemToken);
}

const LEXICON: ReadonlyMap<string, readonly (readonly string[])[]> = (() => {
  const m = new Map<string, string[][]>();
  for (const [from, to] of PARAPHRASES) {
    const targets = to.map(phraseStems);
    for (const f of from) {
      const key = stemToken(f);
      const list = m.get(key) ?? [];
      for (const t of targets) {
        if (t.length === 1 && t[0] === key) continue;
        if (!list.some((x) => x.join(" ") === t.join(" "))) list.push(t);
      }
      m.set(key, list);
    }
  }
  return m;
})();

/** The label phrases (as stem lists) a question word's stem paraphrases (empty when none). */
export function paraphrasesOf(stem: string): readonly (readonly string[])[] {
  return LEXICON.get(stem) ?? [];
}

/**
 * Credit of surface stem `s` from a question word through the lexicon: a one-word phrase when
 * its stem is `s` exactly (no prefix credit: "director" must not reach "directs", nor "head"
 * "headquartered"), a longer phrase only when `surface` holds all of its stems and `s` is
 * one of them.
 */
export function lexiconCredit(s: string, surface: readonly string[], phrases: readonly (readonly string[])[]): number {
  for (const p of phrases) {
    if (p.length === 1 ? p[0] === s : p.includes(s) && p.every((x) => surface.includes(x))) return LEXICON_CREDIT;
  }
  return 0;
}

/**
 * True when the question word `norm` (normalised, unstemmed) is a closed compound of a
 * two-stem surface, in either order: "birthplace" covers ["place", "birth"].
 */
export function compoundCovers(norm: string, surface: readonly string[]): boolean {
  if (surface.length !== 2) return false;
  const [a, b] = surface as [string, string];
  return a.length >= 3 && b.length >= 3 && (norm.startsWith(a + b) || norm.startsWith(b + a)) && norm.length <= a.length + b.length + 3;
}
