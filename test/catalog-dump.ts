/**
 * Test helper: a row-for-row dump of every table of a catalog file, for "unchanged" checks.
 */
import Database from "better-sqlite3";

/** Every table's rows, sorted, as one JSON string (meta included). */
export function dumpCatalog(path: string): string {
  const db = new Database(path, { readonly: true, fileMustExist: true });
  try {
    const tables = db.prepare("SELECT name FROM sqlite_master WHERE type = 'table' ORDER BY name").pluck().all() as string[];
    const out: Record<string, string[]> = {};
    for (const t of tables) out[t] = (db.prepare(`SELECT * FROM "${t}"`).raw(true).all() as unknown[][]).map((r) => JSON.stringify(r)).sort();
    return JSON.stringify(out);
  } finally {
    db.close();
  }
}

/** `PRAGMA integrity_check` of a catalog file ("ok" when sound). */
export function integrity(path: string): string {
  const db = new Database(path, { fileMustExist: true });
  try {
    return (db.pragma("integrity_check") as { integrity_check: string }[]).map((r) => r.integrity_check).join("; ");
  } finally {
    db.close();
  }
}
