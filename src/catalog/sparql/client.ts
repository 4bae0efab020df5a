/**
 * A SPARQL 1.1 Protocol client (W3C Recommendation 2013, §2.1.2 "query via POST with
 * URL-encoded parameters") with Node's built-in fetch. Small answers (counts, the reading's
 * matches) are read as SPARQL 1.1 Query Results JSON; row pulls as SPARQL 1.1 Query Results
 * CSV, parsed as the answer streams in (csv.ts): a store writes and a client reads CSV several
 * times faster than JSON (Virtuoso 7.2: a 10,000-row page of labels 0.1–0.25 s as CSV, 0.9 s
 * as JSON, same machine), and no page is held as text. At most `parallel` requests are in
 * flight; the rest wait for a slot.
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
import { CsvRecords } from "./csv.js";

/** Options of a client; all optional. */
export const DEFAULTS = {
  /** Milliseconds one request may take (`--timeout`). */
  timeoutMs: 30_000,
  /** Rows asked per page (lowered to the store's limit once known). */
  pageSize: 100_000,
  /** Requests in flight at once (a store serves a few HTTP threads: Virtuoso's `[HTTPServer] ServerThreads`). */
  parallel: 4,
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
  /** Requests in flight at once. */
  readonly parallel?: number;
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
  /** Requests in flight at most. */
  readonly parallel: number;
  readonly #auth: string | undefined;
  #inFlight = 0;
  readonly #waiting: (() => void)[] = [];
  private readonly onRequest: ((rows: number, ms: number) => void) | undefined;

  constructor(endpoint: string, options: ClientOptions = {}) {
    this.endpoint = checkEndpoint(endpoint);
    this.timeoutMs = options.timeoutMs ?? DEFAULTS.timeoutMs;
    this.pageSize = options.pageSize ?? DEFAULTS.pageSize;
    this.parallel = Math.max(1, options.parallel ?? DEFAULTS.parallel);
    this.#auth = options.credentials !== undefined ? `Basic ${Buffer.from(options.credentials, "utf8").toString("base64")}` : undefined;
    this.onRequest = options.onRequest;
  }

  private fail(kind: string, what: string): never {
    throw new TiepointError(`store/${kind}`, `SPARQL endpoint ${shownEndpoint(this.endpoint)}: ${what}`);
  }

  /** Waits for a free request slot (at most `parallel` requests in flight). */
  private async acquire(): Promise<void> {
    if (this.#inFlight < this.parallel) {
      this.#inFlight++;
      return;
    }
    await new Promise<void>((r) => this.#waiting.push(r));
  }

  private release(): void {
    const next = this.#waiting.shift();
    if (next) next();
    else this.#inFlight--;
  }

  /** The failure of a request or of reading its answer, as one line (never returns). */
  private failRequest(e: unknown): never {
    if (e instanceof TiepointError) throw e;
    const err = e as { name?: string; cause?: { code?: string; message?: string }; message?: string };
    if (err.name === "TimeoutError" || err.name === "AbortError") this.fail("timeout", `no answer within ${this.timeoutMs} ms (--timeout)`);
    const code = err.cause?.code;
    const why =
      code === "ECONNREFUSED"
        ? "connection refused (is the store running?)"
        : code === "ENOTFOUND"
          ? "host not found"
          : code === "ECONNRESET" || code === "UND_ERR_SOCKET" || err.message === "terminated"
            ? "the connection was closed before the answer was complete (store stopped?)"
            : (err.cause?.message ?? err.message ?? "request failed");
    this.fail("unreachable", `not reachable: ${why}`);
  }

  /** True for a kept-alive connection the store had closed meanwhile (a SELECT is safe to send once more on a new one). */
  private static stale(e: unknown): boolean {
    const code = (e as { cause?: { code?: string } }).cause?.code;
    return code === "ECONNRESET" || code === "UND_ERR_SOCKET";
  }

  /** Sends one query (SPARQL 1.1 Protocol, POST form) asking for `accept`; an error status is a failure. */
  private async post(query: string, accept: string, signal: AbortSignal, retried = false): Promise<Response> {
    const headers: Record<string, string> = { accept, "content-type": "application/x-www-form-urlencoded" };
    if (this.#auth) headers.authorization = this.#auth;
    let res: Response;
    try {
      res = await fetch(this.endpoint, { method: "POST", body: new URLSearchParams({ query }).toString(), headers, signal });
    } catch (e) {
      if (!retried && SparqlClient.stale(e)) return this.post(query, accept, signal, true);
      this.failRequest(e);
    }
    this.requests++;
    if (!res.ok) {
      let text = "";
      try {
        text = await res.text();
      } catch {
        /* the status says enough */
      }
      const first = text.replace(/\s+/g, " ").trim().slice(0, 160);
      this.fail("http", `HTTP ${res.status}${res.statusText ? ` ${res.statusText}` : ""}${res.status === 401 || res.status === 403 ? " (check the credentials)" : ""}${first ? `: ${first}` : ""}`);
    }
    return res;
  }

  /** Runs one SELECT query, its answer read as SPARQL 1.1 Query Results JSON (small answers: counts, the reading's matches). */
  async select(query: string): Promise<SelectResult> {
    const t0 = performance.now();
    await this.acquire();
    let res: Response;
    let text: string;
    try {
      const signal = AbortSignal.timeout(this.timeoutMs);
      res = await this.post(query, "application/sparql-results+json", signal);
      try {
        text = await res.text();
      } catch (e) {
        this.failRequest(e);
      }
    } finally {
      this.release();
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

  /**
   * Runs one SELECT query whose answer is read as SPARQL 1.1 Query Results CSV (csv.ts) as
   * it streams in: each solution is handed to `onRow` as its fields, in the order of `vars`
   * (the header must name exactly these). The format is plain text per term (see csv.ts), so
   * the query projects whatever tells its terms apart. Returns the number of rows and the
   * store's cut signal, like {@link select}.
   */
  async selectCsv(query: string, vars: readonly string[], onRow: (fields: string[]) => void): Promise<{ rows: number; cutAt?: number }> {
    const t0 = performance.now();
    await this.acquire();
    let rows = 0;
    let maxRows: string | null;
    try {
      const signal = AbortSignal.timeout(this.timeoutMs);
      const res = await this.post(query, "text/csv", signal);
      maxRows = res.headers.get("x-sparql-maxrows");
      let header: string[] | undefined;
      let bad: string | undefined;
      const parser = new CsvRecords((fields) => {
        if (bad !== undefined) return;
        if (header === undefined) {
          header = fields;
          if (fields.length !== vars.length || fields.some((f, i) => f !== vars[i])) bad = `its header is ${JSON.stringify(fields.join(",").slice(0, 60))}, not the query's variables`;
          return;
        }
        if (fields.length !== vars.length) {
          bad = `a row has ${fields.length} fields, not ${vars.length}`;
          return;
        }
        rows++;
        onRow(fields);
      });
      let last = "";
      try {
        const decoder = new TextDecoder("utf-8", { fatal: true });
        for await (const chunk of res.body ?? []) {
          const text = decoder.decode(chunk as Uint8Array, { stream: true });
          if (text.length > 0) last = text;
          parser.feed(text);
          if (bad !== undefined) break;
        }
        const tail = decoder.decode();
        if (tail.length > 0) last = tail;
        parser.feed(tail);
      } catch (e) {
        if (e instanceof TypeError && /decode|encoded/i.test(e.message)) bad = "it is not UTF-8 text";
        else this.failRequest(e);
      }
      if (bad === undefined && header === undefined) bad = "it is empty";
      if (bad === undefined && (!parser.end() || !/[\r\n]$/.test(last))) bad = "it ends inside a row (cut short?)";
      if (bad !== undefined) this.fail("format", `the answer is not a SPARQL 1.1 results document (CSV): ${bad}`);
    } finally {
      this.release();
    }
    this.rows += rows;
    this.onRequest?.(rows, performance.now() - t0);
    return { rows, ...(maxRows !== null && Number(maxRows) > 0 && rows >= Number(maxRows) ? { cutAt: Number(maxRows) } : {}) };
  }

  /** A single-row numeric answer (`SELECT (COUNT(*) AS ?n) …`). */
  async count(query: string): Promise<number> {
    const r = await this.select(query);
    const v = r.rows[0]?.n?.value;
    const n = v === undefined ? NaN : Number(v);
    if (!Number.isInteger(n) || n < 0) this.fail("json", `a count query returned ${JSON.stringify(v ?? null)}, not a count`);
    return n;
  }

  /** {@link selectCsv} with the rows collected (a page). */
  async csvRows(query: string, vars: readonly string[]): Promise<{ rows: string[][]; cutAt?: number }> {
    const rows: string[][] = [];
    const r = await this.selectCsv(query, vars, (f) => rows.push(f));
    return { rows, ...(r.cutAt !== undefined ? { cutAt: r.cutAt } : {}) };
  }

  /**
   * Runs one CONSTRUCT query whose answer is read as RDF 1.1 N-Triples (W3C Recommendation
   * 2014): one triple per line, every term in its exact form (language tags, datatypes, blank
   * nodes), so it goes to the importer as it came. Returns the triple lines (each ending with
   * its line end) and the store's cut signal, like {@link select}; an answer that does not end
   * with a complete line is a failure (cut short).
   */
  async constructLines(query: string): Promise<{ rows: string[]; cutAt?: number }> {
    const t0 = performance.now();
    await this.acquire();
    const rows: string[] = [];
    let maxRows: string | null;
    try {
      const signal = AbortSignal.timeout(this.timeoutMs);
      const res = await this.post(query, "application/n-triples", signal);
      maxRows = res.headers.get("x-sparql-maxrows");
      let text: string;
      try {
        text = await res.text();
      } catch (e) {
        this.failRequest(e);
      }
      const type = res.headers.get("content-type") ?? "";
      if (!/^(application\/n-triples|text\/plain)\b/i.test(type)) this.fail("format", `the answer is ${JSON.stringify(type.slice(0, 60))}, not N-Triples (application/n-triples)`);
      if (text.length > 0 && !text.endsWith("\n")) this.fail("format", "the answer is not complete N-Triples: it ends inside a line (cut short?)");
      let from = 0;
      while (from < text.length) {
        const to = text.indexOf("\n", from) + 1;
        const line = text.slice(from, to);
        from = to;
        const t = line.trim();
        if (t === "" || t.startsWith("#")) continue;
        if (!t.endsWith(".")) this.fail("format", `the answer is not N-Triples: a line does not end a triple (${JSON.stringify(t.slice(0, 60))})`);
        rows.push(line);
      }
    } finally {
      this.release();
    }
    this.rows += rows.length;
    this.onRequest?.(rows.length, performance.now() - t0);
    return { rows, ...(maxRows !== null && Number(maxRows) > 0 && rows.length >= Number(maxRows) ? { cutAt: Number(maxRows) } : {}) };
  }

  /**
   * Pulls every row of `pattern` (a SELECT or CONSTRUCT without LIMIT/OFFSET), of which the
   * store counted `expected`, page by page, each page read by `read` (a SELECT as CSV rows,
   * {@link selectCsv}; a CONSTRUCT as N-Triples lines, {@link constructLines}) and handed to
   * `onPage` in page order. The first page learns whether the store cuts (then the page size
   * drops to the cut); the remaining pages are asked at once, as many in flight as the client
   * allows. Unsorted pages are checked: their total must be the count and no row may come
   * twice (a store that reorders between pages repeats some rows and drops others); otherwise
   * `onRestart` is called and the pull is made again in ORDER BY `order` (see the file header).
   */
  async paged<R>(pattern: string, read: (query: string) => Promise<{ rows: R[]; cutAt?: number }>, key: (row: R) => string, expected: number, order: string, onPage: (rows: R[]) => void, onRestart: () => void): Promise<void> {
    if (expected === 0) return;
    const construct = /^\s*CONSTRUCT\b/i.test(pattern);
    for (const sorted of [false, true]) {
      const seen = new Set<string>();
      let repeated = false;
      let total = 0;
      const page = async (offset: number, want: number): Promise<{ rows: R[]; cutAt: number | undefined }> => {
        // a sorted page: ORDER BY inside a subquery, LIMIT/OFFSET outside it (the form a store with a sort limit accepts)
        const q = !sorted
          ? `${pattern} LIMIT ${want} OFFSET ${offset}`
          : construct
            ? pattern.replace(/\bWHERE\s*\{([\s\S]*)\}\s*$/, (_, body: string) => `WHERE { { SELECT * WHERE { ${body} } ORDER BY ${order} } } LIMIT ${want} OFFSET ${offset}`)
            : `SELECT * WHERE { { ${pattern} ORDER BY ${order} } } LIMIT ${want} OFFSET ${offset}`;
        const r = await read(q);
        return { rows: r.rows, cutAt: r.cutAt };
      };
      const take = (rows: R[]) => {
        if (!sorted) {
          for (const row of rows) {
            const k = key(row);
            if (seen.has(k)) repeated = true;
            else seen.add(k);
          }
        }
        total += rows.length;
        onPage(rows);
      };
      // the first page: does the store cut?
      const want0 = Math.min(this.pageSize, expected);
      const first = await page(0, want0);
      if (first.rows.length < want0) this.pageSize = Math.max(1, first.cutAt ?? first.rows.length);
      take(first.rows);
      let offset = first.rows.length;
      if (first.rows.length > 0 && offset < expected) {
        // the rest at once, as many in flight as the client allows, handed on in page order
        const size = this.pageSize;
        const offsets: number[] = [];
        for (let o = offset; o < expected; o += size) offsets.push(o);
        const pending = offsets.map((o) => page(o, Math.min(size, expected - o)));
        pending.forEach((p) => p.catch(() => undefined)); // each is awaited below; the first failure is reported
        let short = false;
        for (let k = 0; k < pending.length; k++) {
          const r = await pending[k]!;
          if (short) continue;
          take(r.rows);
          offset += r.rows.length;
          if (r.rows.length < Math.min(size, expected - offsets[k]!)) {
            // cut below the page size learnt (or the store changed): the rest one page at a time from here
            short = true;
            if (r.rows.length > 0) this.pageSize = Math.max(1, r.cutAt ?? r.rows.length);
          }
        }
        while (short && offset < expected) {
          const want = Math.min(this.pageSize, expected - offset);
          const r = await page(offset, want);
          if (r.rows.length === 0) break;
          if (r.rows.length < want) this.pageSize = Math.max(1, r.cutAt ?? r.rows.length);
          take(r.rows);
          offset += r.rows.length;
        }
      }
      if (total === expected && !repeated) return;
      if (sorted) this.fail("changed", `a pull returned ${total} rows where the store counted ${expected} (did the store change during the pull?)`);
      onRestart();
    }
  }
}
