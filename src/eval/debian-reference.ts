/**
 * The SQL reference for questions over the Debian package index: the Packages stanzas parsed
 * directly (its own line reader of Debian Policy §5.1 fields, not the converter's stanza parser
 * and not tiepoint's importer) into an in-memory SQLite database of plain tables, which
 * benchmark and test questions are answered against with ordinary SQL.
 *
 * Tables: `pkg(name PRIMARY KEY, size)` — `Installed-Size` in kibibytes, NULL when absent;
 * `rel(src, field, dst)` — one row per package named in a Depends / Pre-Depends / Recommends
 * / Suggests / Provides field (every alternative of `a | b`; version constraints and `:arch`
 * qualifiers dropped, Policy §7.1).
 */
import Database from "better-sqlite3";

/** The relationship fields kept (Debian Policy §7.2, §7.5). */
export const REFERENCE_FIELDS = ["Depends", "Pre-Depends", "Recommends", "Suggests", "Provides"] as const;

/** Builds the reference database from Packages text. */
export function debianReference(text: string): Database.Database {
  const db = new Database(":memory:");
  db.exec("CREATE TABLE pkg (name TEXT PRIMARY KEY, size INTEGER); CREATE TABLE rel (src TEXT NOT NULL, field TEXT NOT NULL, dst TEXT NOT NULL, PRIMARY KEY (src, field, dst)); CREATE INDEX rel_dst ON rel(field, dst);");
  const insPkg = db.prepare("INSERT OR IGNORE INTO pkg(name, size) VALUES (?, ?)");
  const insRel = db.prepare("INSERT OR IGNORE INTO rel(src, field, dst) VALUES (?, ?, ?)");
  db.transaction(() => {
    for (const block of text.split(/\n\s*\n/)) {
      // unfold continuation lines, then one "Field: value" per line
      const fields = new Map<string, string>();
      for (const line of block.replace(/\n[ \t]/g, " ").split("\n")) {
        const m = /^([A-Za-z0-9-]+):\s*(.*)$/.exec(line);
        if (m && !fields.has(m[1]!)) fields.set(m[1]!, m[2]!.trim());
      }
      const name = fields.get("Package");
      if (name === undefined) continue;
      const size = fields.get("Installed-Size");
      insPkg.run(name, size !== undefined && /^\d+$/.test(size) ? Number(size) : null);
      for (const f of REFERENCE_FIELDS) {
        const v = fields.get(f);
        if (v === undefined) continue;
        for (const alt of v.split(/[,|]/)) {
          const dst = alt.trim().split(/[\s(]/)[0]!.split(":")[0]!;
          if (dst !== "" && dst !== name) insRel.run(name, f, dst);
        }
      }
    }
  })();
  return db;
}
