/**
 * A SPARQL 1.1 Protocol client (W3C Recommendation 2013, §2.1.2 "query via POST with
 * URL-encoded parameters"), reading SPARQL 1.1 Query Results JSON (W3C Recommendation 2013)
 * with Node's built-in fetch.
 *
 * Every failure is one line naming the endpoint (without credentials): not reachable, no
 * answer within the timeout, an HTTP error status, a body that is not a results document.
 *
 * A store may cut a result at its own row limit without an error (Virtuoso's
 * `ResultSetMaxRows`; it then sends `X-SPARQL-MaxRows`). {@link SparqlClient.paged} asks for
 * pages no larger than the limit it has learnt, and checks each pull against the number of
 * rows the store counted for it beforehand: a page with fewer rows than it should have means
 * a cut, so the page size drops to what came back and the pull goes on from there; a total
 * that still differs (the store changed in between, or reorders unsorted pages) is pulled
 * again with ORDER BY in a subquery, LIMIT/OFFSET outside it (the form a store with a sort
 * limit accepts).
 *
 * HTTP basic credentials (RFC 7617) come from the caller (an environment variable or a file),
 * are sent in the Authorization header only, and appear in no message.
 */
import { TiepointError } from "../../model/index.js";
import type { ResultTerm } from "./terms.js";

/** Options of a client; all optional. */
export const DEFAULTS = {
  /** Milliseconds one request may take (`--timeout`). */
  timeoutMs: 30_000,
  /** Rows asked per page (lowered to the store's limit once known). */
  pageSize: 100_000,
};

/** One result row: variable → term (unbound variables absent). */
export type Row = Readonly<Record<string, ResultTerm>>;

/** A parsed SELECT result. */
export interface SelectResult {
  readonly vars: readonly string[];
  readonly rows: readonly Row[];
  /** The store said it cut the result (Virtuoso's `X-SPARQL-MaxRows` header), with its limit. */
  readonly cutAt?: number;
}

/** Client options. */
export interface ClientOptions {
  readonly timeoutMs?: number;
  /** `user:password` for HTTP basic authentication. */
  readonly credentials?: string;
  /** Rows per page. */
  readonly pageSize?: number;
  /** Called after every request (for counting requests and rows). */
  readonly onRequest?: (rows: number, ms: number) => void;
}

/** The endpoint as shown in messages: no user info, no query string. */
export function shownEndpoint(url: string): string {
  try {
    const u = new URL(url);
    return `${u.protocol}//${u.host}${u.pathname}`;
  } catch {
    return "(not a URL)";
  }
}

/** Checks an endpoint URL (http or https, no credentials in it). */
export function checkEndpoint(url: string): string {
  let u: URL;
  try {
    u = new URL(url);
  } catch {
    throw new TiepointError("cli/usage", `not a URL: ${JSON.stringify(url.slice(0, 200))} (expected the store's SPARQL endpoint, e.g. http://host:8890/sparql)`);
  }
  if (u.protocol !== "http:" && u.protocol !== "https:") throw new TiepointError("cli/usage", `the SPARQL endpoint must be an http or https URL, got ${u.protocol}`);
  if (u.username !== "" || u.password !== "") {
    throw new TiepointError("cli/usage", "the endpoint URL carries credentials: give them in TIEPOINT_SPARQL_CREDENTIALS or a file named by --credentials-file instead (they are never stored)");
  }
  return u.href;
}

/** A client of one endpoint. */
export class SparqlClient {
  readonly endpoint: string;
  readonly timeoutMs: number;
  /** Rows per page; lowered when the store turns out to cut results. */
  pageSize: number;
  /** Requests made and rows received so far. */
  requests = 0;
  rows = 0;
  readonly #auth: string | undefined;
  private readonly onRequest: ((rows: number, ms: number) => void) | undefined;

  constructor(endpoint: string, options: ClientOptions = {}) {
    this.endpoint = checkEndpoint(endpoint);
    this.timeoutMs = options.timeoutMs ?? DEFAULTS.timeoutMs;
    this.pageSize = options.pageSize ?? DEFAULTS.pageSize;
    this.#auth = options.credentials !== undefined ? `Basic ${Buffer.from(options.credentials, "utf8").toString("base64")}` : undefined;
    this.onRequest = options.onRequest;
  }

  private fail(kind: string, what: string): never {
    throw new TiepointError(`store/${kind}`, `SPARQL endpoint ${shownEndpoint(this.endpoint)}: ${what}`);
  }

  /** Runs one SELECT query. */
  async select(query: string, retried = false): Promise<SelectResult> {
    const t0 = performance.now();
    const headers: Record<string, string> = { accept: "application/sparql-results+json", "content-type": "application/x-www-form-urlencoded" };
    if (this.#auth) headers.authorization = this.#auth;
    let res: Response;
    let text: string;
    try {
      res = await fetch(this.endpoint, { method: "POST", body: new URLSearchParams({ query }).toString(), headers, signal: AbortSignal.timeout(this.timeoutMs) });
      text = await res.text();
    } catch (e) {
      const err = e as { name?: string; cause?: { code?: string; message?: string }; message?: string };
      if (err.name === "TimeoutError" || err.name === "AbortError") this.fail("timeout", `no answer within ${this.timeoutMs} ms (--timeout)`);
      const code = err.cause?.code;
      // a kept-alive connection the store had closed meanwhile: a SELECT is safe to send once more on a new one
      if (!retried && (code === "ECONNRESET" || code === "UND_ERR_SOCKET")) return this.select(query, true);
      const why =
        code === "ECONNREFUSED"
          ? "connection refused (is the store running?)"
          : code === "ENOTFOUND"
            ? "host not found"
            : code === "ECONNRESET" || code === "UND_ERR_SOCKET"
              ? "the connection was closed before the answer was complete (store stopped?)"
              : (err.cause?.message ?? err.message ?? "request failed");
      this.fail("unreachable", `not reachable: ${why}`);
    }
    this.requests++;
    if (!res.ok) {
      const first = text.replace(/\s+/g, " ").trim().slice(0, 160);
      this.fail("http", `HTTP ${res.status}${res.statusText ? ` ${res.statusText}` : ""}${res.status === 401 || res.status === 403 ? " (check the credentials)" : ""}${first ? `: ${first}` : ""}`);
    }
    let doc: unknown;
    try {
      doc = JSON.parse(text);
    } catch (e) {
      this.fail("json", `the answer is not JSON (${(e as Error).message.slice(0, 80)}; expected SPARQL 1.1 Query Results JSON)`);
    }
    const d = doc as { head?: { vars?: unknown }; results?: { bindings?: unknown } };
    if (!d || typeof d !== "object" || !Array.isArray(d.head?.vars) || !Array.isArray(d.results?.bindings)) {
      this.fail("json", "the answer is JSON but not a SELECT result (expected head.vars and results.bindings, SPARQL 1.1 Query Results JSON)");
    }
    const rows = d.results!.bindings as Row[];
    for (const r of rows) {
      if (!r || typeof r !== "object") this.fail("json", "a result row is not an object");
      for (const k in r) {
        const t = r[k] as ResultTerm | undefined;
        if (!t || typeof t.value !== "string" || (t.type !== "uri" && t.type !== "literal" && t.type !== "bnode" && t.type !== "typed-literal")) this.fail("json", `a result term of ?${k} is malformed`);
      }
    }
    const maxRows = res.headers.get("x-sparql-maxrows");
    this.rows += rows.length;
    this.onRequest?.(rows.length, performance.now() - t0);
    return { vars: d.head!.vars as string[], rows, ...(maxRows !== null && Number(maxRows) > 0 && rows.length >= Number(maxRows) ? { cutAt: Number(maxRows) } : {}) };
  }

  /** A single-row numeric answer (`SELECT (COUNT(*) AS ?n) …`). */
  async count(query: string): Promise<number> {
    const r = await this.select(query);
    const v = r.rows[0]?.n?.value;
    const n = v === undefined ? NaN : Number(v);
    if (!Number.isInteger(n) || n < 0) this.fail("json", `a count query returned ${JSON.stringify(v ?? null)}, not a count`);
    return n;
  }

  /**
   * Pulls every row of `pattern` (a SELECT without LIMIT/OFFSET, `SELECT … WHERE { … }`), of
   * which the store counted `expected`, page by page, handing each page to `onPage` as it
   * arrives. Unsorted pages are checked: their total must be the count and no row may come
   * twice (a store that reorders between pages repeats some rows and drops others); otherwise
   * `onRestart` is called and the pull is made again in ORDER BY `order` (see the file header).
   */
  async paged(pattern: string, expected: number, order: string, onPage: (rows: readonly Row[]) => void, onRestart: () => void): Promise<void> {
    if (expected === 0) return;
    for (const sorted of [false, true]) {
      const seen = new Set<string>();
      let repeated = false;
      let offset = 0;
      while (offset < expected) {
        const want = Math.min(this.pageSize, expected - offset);
        const q = sorted ? `SELECT * WHERE { { ${pattern} ORDER BY ${order} } } LIMIT ${want} OFFSET ${offset}` : `${pattern} LIMIT ${want} OFFSET ${offset}`;
        const r = await this.select(q);
        if (r.rows.length === 0) break;
        // cut by the store's row limit: smaller pages from here on
        if (r.rows.length < want) this.pageSize = Math.max(1, r.cutAt ?? r.rows.length);
        if (!sorted) {
          for (const row of r.rows) {
            const key = rowKey(row);
            if (seen.has(key)) repeated = true;
            else seen.add(key);
          }
        }
        onPage(r.rows);
        offset += r.rows.length;
      }
      if (offset === expected && !repeated) return;
      if (sorted) this.fail("changed", `a pull returned ${offset} rows where the store counted ${expected} (did the store change during the pull?)`);
      onRestart();
    }
  }
}

/** A row as one string (for the repeat check). */
function rowKey(row: Row): string {
  let k = "";
  for (const v in row) {
    const t = row[v]!;
    k += `${v}\u0000${t.type}\u0000${t.value}\u0000${t["xml:lang"] ?? t.datatype ?? ""}\u0001`;
  }
  return k;
}
