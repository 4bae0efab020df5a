/**
 * The catalog's SQLite schema, version 1.
 *
 * Entities, predicates (relations and attribute names alike), aliases with normalised and
 * stemmed forms, types and the subtype hierarchy, relation edges, literal attributes, and a
 * `meta` table holding the schema version, a catalog uid (new per file) and a generation
 * counter (bumped by every committed load, so derived files can tell they are stale).
 */

/** The schema version this build writes and reads. */
export const SCHEMA_VERSION = 1;

/** DDL, idempotent. */
export const SCHEMA_SQL = `
CREATE TABLE IF NOT EXISTS meta (key TEXT PRIMARY KEY, value TEXT NOT NULL);
CREATE TABLE IF NOT EXISTS entity (
  num INTEGER PRIMARY KEY,
  id TEXT NOT NULL UNIQUE,
  label TEXT,
  description TEXT
);
CREATE TABLE IF NOT EXISTS predicate (
  num INTEGER PRIMARY KEY,
  id TEXT NOT NULL UNIQUE,
  label TEXT
);
-- kind 0 = label, 1 = alias
CREATE TABLE IF NOT EXISTS alias (
  entity INTEGER NOT NULL,
  text TEXT NOT NULL,
  norm TEXT NOT NULL,
  stem TEXT NOT NULL,
  kind INTEGER NOT NULL,
  PRIMARY KEY (entity, text)
) WITHOUT ROWID;
CREATE INDEX IF NOT EXISTS alias_norm ON alias(norm);
CREATE INDEX IF NOT EXISTS alias_stem ON alias(stem);
CREATE TABLE IF NOT EXISTS predicate_alias (
  predicate INTEGER NOT NULL,
  text TEXT NOT NULL,
  norm TEXT NOT NULL,
  stem TEXT NOT NULL,
  PRIMARY KEY (predicate, text)
) WITHOUT ROWID;
CREATE TABLE IF NOT EXISTS entity_type (
  entity INTEGER NOT NULL,
  type INTEGER NOT NULL,
  PRIMARY KEY (entity, type)
) WITHOUT ROWID;
CREATE INDEX IF NOT EXISTS entity_type_by_type ON entity_type(type);
CREATE TABLE IF NOT EXISTS subclass (
  sub INTEGER NOT NULL,
  sup INTEGER NOT NULL,
  PRIMARY KEY (sub, sup)
) WITHOUT ROWID;
CREATE TABLE IF NOT EXISTS edge (
  src INTEGER NOT NULL,
  rel INTEGER NOT NULL,
  dst INTEGER NOT NULL,
  PRIMARY KEY (src, rel, dst)
) WITHOUT ROWID;
CREATE INDEX IF NOT EXISTS edge_by_dst ON edge(dst, rel);
CREATE TABLE IF NOT EXISTS attribute (
  entity INTEGER NOT NULL,
  predicate INTEGER NOT NULL,
  value TEXT NOT NULL,
  datatype TEXT,
  lang TEXT,
  num REAL,
  PRIMARY KEY (entity, predicate, value)
) WITHOUT ROWID;
CREATE INDEX IF NOT EXISTS attribute_by_predicate ON attribute(predicate, num);
`;
