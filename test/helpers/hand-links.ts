/**
 * Hand-made link results for analysis tests: each given label, found in the question, is a
 * confident mention of the catalog entity with that label or id — so question analysis is
 * tested without the linker; and small in-memory catalogs written through CatalogWriter.
 */
import { Catalog as CatalogClass, CatalogWriter, type Catalog } from "../../src/catalog/index.js";
import type { LinkResult, LinkedMention } from "../../src/linking/index.js";

/** A link result with one mention (confidence 0.95, no alternatives) per label, at its first place in `question`. */
export function handLinks(cat: Catalog, question: string, labels: readonly string[]): LinkResult {
  const mentions: LinkedMention[] = labels.map((label) => {
    const start = question.indexOf(label);
    if (start < 0) throw new Error(`hand-links: "${label}" not in "${question}"`);
    const num = cat.byLabelOrId(label)[0]!;
    const ref = cat.ref(num);
    return { text: label, start, end: start + label.length, entity: { id: ref.id, label: ref.label }, confidence: 0.95, alternatives: [], num };
  });
  return { mentions, unlinked: [] };
}

/** A fresh in-memory catalog filled by `fill` through one CatalogWriter transaction. */
export function writtenCatalog(fill: (w: CatalogWriter) => void): Catalog {
  const cat = CatalogClass.open(":memory:", { create: true });
  const w = new CatalogWriter(cat);
  w.begin();
  fill(w);
  w.commit();
  return cat;
}
