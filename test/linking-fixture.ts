/**
 * A tiny invented catalog for the linking tests (people, a lab, two things named "Aurora").
 * Built with the real CatalogWriter into a real SQLite catalog (in memory or on disk).
 */
import { Catalog, CatalogWriter } from "../src/catalog/index.js";

/** Shorthands for writing a small catalog: a type, a relation, an entity. */
export function catalogShorthands(w: CatalogWriter) {
  return {
    type(id: string, label: string, aliases: string[] = [], sup?: string): void {
      w.label(id, label);
      for (const a of aliases) w.alias(id, a);
      if (sup) w.subclass(id, sup);
    },
    rel(id: string, label: string, aliases: string[] = []): void {
      w.predicateLabel(id, label);
      for (const a of aliases) w.predicateAlias(id, a);
    },
    ent(id: string, label: string, types: string[], description?: string, aliases: string[] = []): void {
      w.label(id, label);
      for (const a of aliases) w.alias(id, a);
      for (const t of types) w.type(id, t);
      if (description) w.description(id, description);
    },
  };
}

/** Writes the fixture into `cat` (one committed transaction). */
export function writeLinkingFixture(cat: Catalog): void {
  const w = new CatalogWriter(cat);
  w.begin();
  const { type, rel, ent } = catalogShorthands(w);
  type("t:Person", "person", ["people"]);
  type("t:Researcher", "researcher", ["scientist"], "t:Person");
  type("t:Lab", "laboratory", ["lab"]);
  type("t:Ship", "ship", ["vessel"]);
  type("t:Town", "town");
  rel("r:memberOf", "member of", ["works in", "belongs to"]);
  rel("r:locatedIn", "located in");
  rel("r:captainOf", "captain of", ["commands"]);
  rel("r:homePort", "home port");
  ent("p:ada", "Ada Quell", ["t:Researcher"], "A researcher who studies tidal engines.", ["A. Quell"]);
  ent("p:morrow", "Ada Morrow", ["t:Person"], "A glass blower from the valley.");
  ent("p:jon", "Jon Varga", ["t:Person"], "A sailor and harbour pilot.");
  ent("p:zoe", "Zoë Ñandú", ["t:Researcher"], "A chemist.");
  ent("o:lab1", "Tidewater Lab", ["t:Lab"], "A laboratory for tidal power.");
  ent("town:brill", "Brill", ["t:Town"], "A harbour town.");
  ent("s:aurora", "Aurora", ["t:Ship"], "A cargo vessel that carries timber.");
  ent("town:aurora", "Aurora", ["t:Town"], "A mountain town with a ski lodge and a cable car.");
  ent("o:lodge", "Pinecrest Lodge", [], "A ski lodge.");
  w.edge("p:ada", "r:memberOf", "o:lab1");
  w.edge("p:zoe", "r:memberOf", "o:lab1");
  w.edge("o:lab1", "r:locatedIn", "town:brill");
  w.edge("p:jon", "r:captainOf", "s:aurora");
  w.edge("s:aurora", "r:homePort", "town:brill");
  w.edge("o:lodge", "r:locatedIn", "town:aurora");
  w.commit();
}

/** A fresh in-memory catalog holding the fixture. */
export function linkingFixture(): Catalog {
  const cat = Catalog.open(":memory:", { create: true });
  writeLinkingFixture(cat);
  return cat;
}
