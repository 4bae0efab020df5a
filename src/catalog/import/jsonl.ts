/**
 * JSON Lines importer (https://jsonlines.org/: one JSON value per line, UTF-8) in the
 * project's own layout: each line one object of kind entity, type, relation, attribute or
 * edge (the kind may be left out: `subject`+`relation`+`object` means an edge, an `id` an
 * entity). Documented in README.md, "Import formats".
 */
import type { LoadContext } from "./context.js";
import { readBlocks } from "./lines.js";

type Json = null | boolean | number | string | Json[] | { [k: string]: Json };
type Obj = { [k: string]: Json };

const FIELDS: Record<string, readonly string[]> = {
  entity: ["kind", "id", "label", "aliases", "types", "description", "attributes", "relations", "subClassOf"],
  type: ["kind", "id", "label", "aliases", "types", "description", "attributes", "relations", "subClassOf"],
  relation: ["kind", "id", "label", "aliases", "description"],
  attribute: ["kind", "id", "label", "aliases", "description", "unit"],
  edge: ["kind", "subject", "relation", "object"],
};

/** A record-level problem; the importer turns it into a `FILE:LINE:` error. */
class Bad extends Error {}

function str(o: Obj, key: string, required: boolean): string | undefined {
  const v = o[key];
  if (v === undefined || v === null) {
    if (required) throw new Bad(`missing field "${key}"`);
    return undefined;
  }
  if (typeof v !== "string") throw new Bad(`field "${key}" must be a string, got ${typeName(v)}`);
  if (required && v.trim() === "") throw new Bad(`field "${key}" is empty`);
  return v;
}

function strList(o: Obj, key: string): string[] {
  const v = o[key];
  if (v === undefined || v === null) return [];
  const list = Array.isArray(v) ? v : [v];
  return list.map((x, i) => {
    if (typeof x !== "string") throw new Bad(`field "${key}" must be a string or a list of strings (item ${i + 1} is ${typeName(x)})`);
    if (x.trim() === "") throw new Bad(`field "${key}" has an empty item`);
    return x;
  });
}

function label(o: Obj): string | undefined {
  const l = str(o, "label", false);
  if (l !== undefined && l.trim() === "") throw new Bad(`empty label (give a non-empty "label" or leave the field out)`);
  return l;
}

function typeName(v: Json): string {
  return v === null ? "null" : Array.isArray(v) ? "a list" : typeof v === "object" ? "an object" : `a ${typeof v}`;
}

function inferKind(o: Obj): string {
  const k = o.kind;
  if (k !== undefined) {
    if (typeof k !== "string" || !(k in FIELDS)) throw new Bad(`unknown kind ${JSON.stringify(k)} (expected entity, type, relation, attribute or edge)`);
    return k;
  }
  if ("subject" in o || "relation" in o || "object" in o) return "edge";
  if ("id" in o) return "entity";
  throw new Bad(`record has neither "id" (an entity) nor "subject", "relation", "object" (an edge)`);
}

function checkFields(o: Obj, kind: string): void {
  const allowed = FIELDS[kind]!;
  for (const k of Object.keys(o)) {
    if (!allowed.includes(k)) throw new Bad(`unknown field "${k}" in ${/^[aeiou]/.test(kind) ? "an" : "a"} ${kind} record (expected ${allowed.filter((f) => f !== "kind").join(", ")})`);
  }
}

function literal(v: Json, where: string): { value: string; datatype: string | null } {
  if (typeof v === "string") return { value: v, datatype: null };
  if (typeof v === "number") return { value: String(v), datatype: Number.isInteger(v) ? "http://www.w3.org/2001/XMLSchema#integer" : "http://www.w3.org/2001/XMLSchema#decimal" };
  if (typeof v === "boolean") return { value: String(v), datatype: "http://www.w3.org/2001/XMLSchema#boolean" };
  throw new Bad(`${where} must be a string, number or boolean (or a list of them), got ${typeName(v)}`);
}

function record(ctx: LoadContext, file: string, line: number, o: Obj): void {
  const w = ctx.writer;
  const kind = inferKind(o);
  checkFields(o, kind);
  if (kind === "edge") {
    const s = str(o, "subject", true)!;
    const r = str(o, "relation", true)!;
    const t = str(o, "object", true)!;
    ctx.requireEntities(file, line, [s, t]);
    w.edge(s, r, t);
    return;
  }
  const id = str(o, "id", true)!;
  const l = label(o);
  const aliases = strList(o, "aliases");
  const description = str(o, "description", false);
  if (kind === "relation" || kind === "attribute") {
    const unit = str(o, "unit", false);
    w.predicate(id);
    ctx.declaredPredicates.add(id);
    if (kind === "attribute" && unit !== undefined && unit.trim() !== "") w.predicateUnit(id, unit.trim());
    if (l !== undefined) w.predicateLabel(id, l);
    for (const a of aliases) w.predicateAlias(id, a);
    return;
  }
  // entity or type
  const types = strList(o, "types");
  const supers = strList(o, "subClassOf");
  const attrs = o.attributes;
  if (attrs !== undefined && (attrs === null || typeof attrs !== "object" || Array.isArray(attrs))) throw new Bad(`field "attributes" must be an object of name: value`);
  const rels = o.relations;
  if (rels !== undefined && (rels === null || typeof rels !== "object" || Array.isArray(rels))) throw new Bad(`field "relations" must be an object of relation: entity id(s)`);
  const attrList: [string, { value: string; datatype: string | null }][] = [];
  for (const [name, v] of Object.entries((attrs ?? {}) as Obj)) {
    if (name.trim() === "") throw new Bad(`an attribute has an empty name`);
    for (const x of Array.isArray(v) ? v : [v]) attrList.push([name, literal(x, `attribute "${name}"`)]);
  }
  const relList: [string, string][] = [];
  for (const [rel, v] of Object.entries((rels ?? {}) as Obj)) {
    if (rel.trim() === "") throw new Bad(`a relation has an empty name`);
    for (const x of Array.isArray(v) ? v : [v]) {
      if (typeof x !== "string" || x.trim() === "") throw new Bad(`relation "${rel}" must name entity ids (strings), got ${typeName(x)}`);
      relList.push([rel, x]);
    }
  }
  w.entity(id);
  ctx.declare(id);
  if (l !== undefined) w.label(id, l);
  for (const a of aliases) w.alias(id, a);
  if (description !== undefined && description.trim() !== "") w.description(id, description);
  for (const t of types) w.type(id, t);
  for (const s of supers) w.subclass(id, s);
  for (const [name, lit] of attrList) w.attribute(id, name, lit.value, lit.datatype, null);
  if (relList.length > 0) ctx.requireEntities(file, line, relList.map((r) => r[1]));
  for (const [rel, target] of relList) w.edge(id, rel, target);
}

/** Imports one JSON Lines file into the load's transaction. */
export function importJsonl(ctx: LoadContext, file: string): void {
  readBlocks(
    file,
    (block) => {
      const lines = block.text.split("\n");
      const n = block.lineCount;
      for (let i = 0; i < n; i++) {
        const text = lines[i]!;
        const lineNo = block.firstLine + i;
        if (text.trim() === "") continue;
        let o: Json;
        try {
          o = JSON.parse(text) as Json;
        } catch (e) {
          ctx.error(file, lineNo, `invalid JSON: ${(e as Error).message.replace(/^JSON\.parse: /, "")} (expected one JSON object per line)`);
          continue;
        }
        if (o === null || typeof o !== "object" || Array.isArray(o)) {
          ctx.error(file, lineNo, `expected a JSON object, got ${typeName(o)}`);
          continue;
        }
        try {
          ctx.line = lineNo;
          record(ctx, file, lineNo, o);
        } catch (e) {
          if (e instanceof Bad) ctx.error(file, lineNo, e.message);
          else throw e;
        }
        ctx.tick(block.bytesRead);
      }
    },
    (line, kind, detail) => ctx.error(file, line, kind === "utf8" ? `not valid UTF-8: ${detail}` : detail, "catalog/encoding"),
  );
}
