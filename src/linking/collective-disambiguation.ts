/**
 * Candidate scoring and collective disambiguation: one calibrated confidence per candidate.
 *
 * [Reference] Local evidence (prior + context) with global coherence as in J. Hoffart et al.,
 * "Robust disambiguation of named entities in text", EMNLP 2011; coherence by Milne & Witten
 * 2008 relatedness (relatedness.ts); context by BM25 (bm25.ts, Robertson & Zaragoza 2009).
 * Where Hoffart et al. solve a dense-subgraph problem, tiepoint iterates a mean-field update
 * over the few candidates (each candidate's coherence is its expected relatedness to the other
 * mentions under their current confidences), `iterations` rounds.
 *
 * The combination, per candidate c of a mention m (all features in [0, 1]; the prior's log is ≤ 0):
 *   z(c) = wPrior·ln prior(c) + wString·sim(c) + wContext·ctx(c) + wType·type(c) + wRelation·rel(c) + wModifier·mod(c) + wCoherence·coh(c)
 *   prior(c) = k(c)·(1 + ln(1 + degree(c)))^γ / Σ_{c'} k(c')·(1 + ln(1 + degree(c')))^γ   (k = 1 label, 0.85 alias)
 *   ctx(c)   = bm25(c) / (bm25(c) + ctxHalf)        (question words outside the mention vs c's document)
 *   type(c)  = [c has (a subtype of) a type named in the question];  rel(c) = [c has an edge of a relation named in it]
 *   mod(c)   = [the mention pre-modifies a type noun ("a Braskian port") and c has a neighbour of that type]
 *   coh(c)   = mean over other mentions m' of Σ_{c'∈m'} p(c')·rel(c, c')
 *   p(c)     = exp z(c) / (exp θ + Σ_{c'} exp z(c'))   — a softmax with a "none of these" option of
 *              logit θ, so one exact label match without other evidence gets 1/(1+e^(θ−wString)) ≈ 0.9
 *              and an ambiguous or fuzzy span gets correspondingly less. The weights are set by hand
 *              (no training data); the WordNet evaluation reports how well they are calibrated.
 */

/** Weights of the combination. */
export const DEFAULTS = {
  wPrior: 1,
  wString: 6,
  wContext: 3,
  wType: 1,
  wRelation: 2,
  /** Weight of mod(c): a name modifying a type noun names something joined to things of that type. */
  wModifier: 1.5,
  wCoherence: 3,
  /** BM25 score at which ctx = ½. */
  ctxHalf: 4,
  /** Logit of "none of these candidates". */
  theta: 3.8,
  /** Exponent γ on the prominence 1 + ln(1 + degree) in the prior. */
  prominenceExponent: 0.25,
  /** Weight of an alias (vs the label, 1) in the prior. */
  aliasWeight: 0.85,
  /** Mean-field rounds of the coherence update. */
  iterations: 2,
} as const;

/** Options of {@link disambiguate}: any weight of {@link DEFAULTS}. */
export type ScoringOptions = Partial<{ -readonly [K in keyof typeof DEFAULTS]: number }>;

/** Per-candidate evidence, filled by the linker. */
export interface CandidateEvidence {
  readonly num: number;
  readonly similarity: number;
  readonly kind: number;
  readonly degree: number;
  /** Raw BM25 score of the context (0 when not computed). */
  readonly bm25: number;
  /** 1 when the candidate has (a subtype of) a type named in the question, else 0. */
  readonly typeCompat: number;
  /** 1 when the candidate has an edge of a relation named in the question, else 0. */
  readonly relationCompat: number;
  /** 1 when the mention modifies a type noun and the candidate has a neighbour of that type, else 0. */
  readonly modifierCompat?: number;
}

/** A scored candidate. */
export interface ScoredCandidate {
  readonly num: number;
  readonly confidence: number;
  /** The features, for explanations and tests. */
  readonly features: { readonly prior: number; readonly similarity: number; readonly context: number; readonly typeCompat: number; readonly relationCompat: number; readonly coherence: number };
}

/**
 * Scores the candidates of every mention jointly. `related(a, b)` is the relatedness of two
 * entity nums (only asked between candidates of different mentions). Returns, per mention,
 * its candidates best first (ties by num).
 */
export function disambiguate(
  mentions: readonly (readonly CandidateEvidence[])[],
  related: ((a: number, b: number) => number) | undefined,
  options: ScoringOptions = {},
): ScoredCandidate[][] {
  const o = { ...DEFAULTS, ...options };
  const local = mentions.map((cands) => {
    const raw = cands.map((c) => (c.kind === 0 ? 1 : o.aliasWeight) * Math.pow(1 + Math.log(1 + c.degree), o.prominenceExponent));
    const total = raw.reduce((a, b) => a + b, 0) || 1;
    return cands.map((c, i) => {
      const prior = raw[i]! / total;
      const context = c.bm25 > 0 ? c.bm25 / (c.bm25 + o.ctxHalf) : 0;
      const z = o.wPrior * Math.log(prior) + o.wString * c.similarity + o.wContext * context + o.wType * c.typeCompat + o.wRelation * c.relationCompat + o.wModifier * (c.modifierCompat ?? 0);
      return { prior, context, z };
    });
  });
  const softmax = (zs: readonly number[]) => {
    const m = Math.max(o.theta, ...zs);
    const e = zs.map((z) => Math.exp(z - m));
    const d = Math.exp(o.theta - m) + e.reduce((a, b) => a + b, 0);
    return e.map((x) => x / d);
  };
  let probs = local.map((l) => softmax(l.map((x) => x.z)));
  let coh = mentions.map((c) => c.map(() => 0));
  const useCoherence = related !== undefined && mentions.length >= 2 && mentions.some((c) => c.length > 1);
  if (useCoherence) {
    const rel = new Map<string, number>();
    const r = (a: number, b: number) => {
      const key = a < b ? `${a} ${b}` : `${b} ${a}`;
      let v = rel.get(key);
      if (v === undefined) rel.set(key, (v = related!(a, b)));
      return v;
    };
    for (let it = 0; it < o.iterations; it++) {
      coh = mentions.map((cands, m) =>
        cands.map((c) => {
          let sum = 0;
          for (let m2 = 0; m2 < mentions.length; m2++) {
            if (m2 === m) continue;
            let s = 0;
            mentions[m2]!.forEach((c2, k) => (s += probs[m2]![k]! * r(c.num, c2.num)));
            sum += s;
          }
          return sum / (mentions.length - 1);
        }),
      );
      probs = local.map((l, m) => softmax(l.map((x, k) => x.z + o.wCoherence * coh[m]![k]!)));
    }
  }
  return mentions.map((cands, m) =>
    cands
      .map((c, k) => ({
        num: c.num,
        confidence: probs[m]![k]!,
        features: { prior: local[m]![k]!.prior, similarity: c.similarity, context: local[m]![k]!.context, typeCompat: c.typeCompat, relationCompat: c.relationCompat, coherence: coh[m]![k]! },
      }))
      .sort((a, b) => b.confidence - a.confidence || a.num - b.num),
  );
}
