/** Talking to a SPARQL 1.1 store: terms written safely, the protocol client, the binding file. */
export { iriRef, stringLiteral, literal, ntTerm, nodeId, bnodeLabel, isWritableIri, csvNode, csvLiteral, csvTrue } from "./terms.js";
export type { ResultTerm } from "./terms.js";
export { SparqlClient, checkEndpoint, shownEndpoint, DEFAULTS as CLIENT_DEFAULTS } from "./client.js";
export type { ClientOptions, Row, SelectResult } from "./client.js";
export { bindingPath, readBinding, writeBinding, BINDING_FORMAT } from "./binding.js";
export type { StoreBinding, EndTableRows } from "./binding.js";
