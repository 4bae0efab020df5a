/**
 * Function words that never start, end or form a mention on their own: English articles,
 * prepositions, pronouns, auxiliaries, conjunctions and question words. A short list of the
 * usual kind (common practice; written for tiepoint, in normalised form).
 */

/** Question words (also never mentions). */
export const QUESTION_WORDS: ReadonlySet<string> = new Set(
  "what which who whom whose where when why how".split(" "),
);

/** Stop words in normalised form (apostrophes already dropped: "dont", "its"). */
export const STOP_WORDS: ReadonlySet<string> = new Set(
  (
    "a an the and or nor but if then else so than that this these those there here " +
    "of in on at by for from to into onto upon with without within about above below over under " +
    "between among through during before after since until till via per against toward towards " +
    "across along around behind beside besides beyond near off out up down " +
    "is am are was were be been being do does did done doing have has had having " +
    "will would shall should can could may might must " +
    "i me my mine we us our ours you your yours he him his she her hers it its they them their theirs " +
    "not no yes also too very just only ever all any some each every both either neither " +
    "one ones other others another such same own more most much many few less least " +
    "whats whos wheres whens hows dont doesnt didnt isnt arent wasnt werent " +
    // contractions of a pronoun and an auxiliary, and negated auxiliaries (closed class; those
    // spelling another English word — "ill", "id", "well", "shell", "were" — are left out)
    "im ive youre youve youll youd hes shes theyre theyve theyll theyd weve thats theres cant wont " +
    "couldnt shouldnt wouldnt hasnt havent hadnt mustnt " +
    "please tell show give find list name named called known " +
    "s t"
  )
    .split(" ")
    .concat([...QUESTION_WORDS]),
);

/** True when the normalised token is a stop word or a question word. */
export function isStopWord(norm: string): boolean {
  return STOP_WORDS.has(norm);
}
