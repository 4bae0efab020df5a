/**
 * The last step of a load, inside its transaction: an IRI that is used as a predicate and
 * also carries labels (`P rdfs:label "x"`, in any order relative to its use) gives those
 * labels to the relation, and when it takes no part in the graph (no edge, not a type) its
 * entity row is removed, so predicate IRIs do not linger as linkable entities.
 */
import type { CatalogWriter } from "../writer.js";

const RDFS = "http://www.w3.org/2000/01/rdf-schema#";
const OWL = "http://www.w3.org/2002/07/owl#";
/** Predicates that describe a property (RDF Schema 1.1 section 6, OWL 2 property axioms). */
const PROPERTY_SCHEMA = [`${RDFS}domain`, `${RDFS}range`, `${RDFS}subPropertyOf`, `${RDFS}isDefinedBy`, `${OWL}inverseOf`, `${OWL}equivalentProperty`];

/** Runs the end-of-load fix-ups. */
export function finishLoad(writer: CatalogWriter, options: { rdf: boolean }): void {
  if (!options.rdf) return;
  writer.flush();
  const db = writer.catalog.db;
  const pairs = db.prepare("SELECT e.num AS e, p.id AS pid FROM predicate p JOIN entity e ON e.id = p.id").all() as { e: number; pid: string }[];
  if (pairs.length === 0) return;
  const labels = db.prepare("SELECT text, kind FROM alias WHERE entity = ? ORDER BY kind, text");
  const label = db.prepare("SELECT label FROM entity WHERE num = ?").pluck();
  // edges that only describe the property itself (domain, range, …) do not make it a node
  const schemaRels = (db.prepare(`SELECT num FROM predicate WHERE id IN (${PROPERTY_SCHEMA.map(() => "?").join(", ")})`).pluck().all(...PROPERTY_SCHEMA) as number[]).join(", ") || "-1";
  const used = db.prepare(
    `SELECT EXISTS(SELECT 1 FROM edge WHERE src = @e AND rel NOT IN (${schemaRels})) OR EXISTS(SELECT 1 FROM edge WHERE dst = @e AND rel NOT IN (${schemaRels})) OR EXISTS(SELECT 1 FROM entity_type WHERE type = @e) OR EXISTS(SELECT 1 FROM subclass WHERE sub = @e OR sup = @e)`,
  ).pluck();
  const delEdges = db.prepare("DELETE FROM edge WHERE src = @e OR dst = @e");
  const ends = db.prepare("SELECT dst FROM edge WHERE src = @e UNION SELECT src FROM edge WHERE dst = @e").pluck();
  const typesOf = db.prepare("SELECT type FROM entity_type WHERE entity = ?").pluck();
  const orphan = db.prepare(
    "SELECT NOT (EXISTS(SELECT 1 FROM alias WHERE entity = @e) OR EXISTS(SELECT 1 FROM edge WHERE src = @e) OR EXISTS(SELECT 1 FROM edge WHERE dst = @e) OR EXISTS(SELECT 1 FROM entity_type WHERE entity = @e OR type = @e) OR EXISTS(SELECT 1 FROM subclass WHERE sub = @e OR sup = @e) OR EXISTS(SELECT 1 FROM attribute WHERE entity = @e) OR EXISTS(SELECT 1 FROM entity WHERE num = @e AND description IS NOT NULL))",
  ).pluck();
  const dels = ["DELETE FROM alias WHERE entity = ?", "DELETE FROM entity_type WHERE entity = ?", "DELETE FROM attribute WHERE entity = ?", "DELETE FROM entity WHERE num = ?"].map((s) => db.prepare(s));
  for (const { e, pid } of pairs) {
    const main = label.get(e) as string | null;
    if (main !== null) writer.predicateLabel(pid, main);
    for (const a of labels.all(e) as { text: string; kind: number }[]) if (a.text !== main) writer.predicateAlias(pid, a.text);
    if (used.get({ e })) continue;
    const around = [...(typesOf.all(e) as number[]), ...(ends.all({ e }) as number[])];
    delEdges.run({ e });
    for (const d of dels) d.run(e);
    writer.removedEntity(e);
    // what only this property mentioned (rdf:Property, an unlabelled domain class) goes too
    for (const t of new Set(around)) {
      if (t !== e && orphan.get({ e: t })) {
        dels[3]!.run(t);
        writer.removedEntity(t);
      }
    }
  }
}
