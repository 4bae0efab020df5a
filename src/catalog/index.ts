export { Catalog, labelFromId } from "./store.js";
export type { OpenOptions, TypeInfo, PredicateInfo, AttributeInfo, NeighbourInfo, EntityInfo, AliasHit, CatalogCounts } from "./store.js";
export { CatalogWriter, literalNumber } from "./writer.js";
export { normalize, tokens, stemToken, stemKey } from "./normalize.js";
export { SCHEMA_VERSION } from "./schema.js";
