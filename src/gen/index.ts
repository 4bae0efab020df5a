/**
 * Tools that write catalogs: the synthetic large-catalog generator (and its vocabulary).
 */
export { generateCatalog, DEFAULTS as GENERATE_DEFAULTS, IRI as GENERATED_IRI } from "./synthetic.js";
export type { GenerateOptions, GenerateResult } from "./synthetic.js";
export { Rng, hash32 } from "./random.js";
