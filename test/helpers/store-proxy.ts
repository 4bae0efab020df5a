/**
 * A loopback HTTP relay in front of a real SPARQL store, for the fault tests: it passes every
 * request to the store unchanged and can be told to fail the way a store or a network does —
 * an HTTP error status, a body that is not JSON, a slow answer, a connection closed midway —
 * or to require HTTP basic credentials (RFC 7617). It records every request body and header it saw.
 */
import { createServer, type IncomingMessage, type Server, type ServerResponse } from "node:http";

/** What the relay does with the next requests. */
export type RelayMode = "pass" | "http500" | "http404" | "garbage" | "slow" | "reset";

export interface StoreRelay {
  readonly url: string;
  /** Where requests go (a store's SPARQL endpoint); may be changed between requests. */
  upstream: string;
  mode: RelayMode;
  /** Milliseconds of delay in "slow" mode. */
  delayMs: number;
  /** Required `user:password`, or undefined for none. */
  credentials: string | undefined;
  /** Requests seen (passed or failed). */
  requests: number;
  /** Called with the request count before each request is handled. */
  onRequest: ((n: number) => void) | undefined;
  /** Every request body and Authorization header seen. */
  readonly seen: string[];
  close(): Promise<void>;
}

function body(req: IncomingMessage): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    const parts: Buffer[] = [];
    req.on("data", (c: Buffer) => parts.push(c));
    req.on("end", () => resolve(Buffer.concat(parts)));
    req.on("error", reject);
  });
}

/** Starts a relay on a free loopback port. */
export async function startRelay(upstream: string): Promise<StoreRelay> {
  let server: Server;
  const relay: StoreRelay = {
    url: "",
    upstream,
    mode: "pass",
    delayMs: 2000,
    credentials: undefined,
    requests: 0,
    onRequest: undefined,
    seen: [],
    close: () => new Promise((r) => server.close(() => r())),
  };
  const handle = async (req: IncomingMessage, res: ServerResponse) => {
    const data = await body(req);
    relay.requests++;
    relay.onRequest?.(relay.requests);
    relay.seen.push(data.toString("utf8"), String(req.headers.authorization ?? ""));
    if (relay.credentials !== undefined && req.headers.authorization !== `Basic ${Buffer.from(relay.credentials).toString("base64")}`) {
      res.writeHead(401, { "www-authenticate": 'Basic realm="store"', "content-type": "text/plain" });
      return void res.end("authentication required");
    }
    if (relay.mode === "http500") {
      res.writeHead(500, { "content-type": "text/plain" });
      return void res.end("Virtuoso 42000 Error: the relay was told to fail");
    }
    if (relay.mode === "http404") {
      res.writeHead(404, { "content-type": "text/plain" });
      return void res.end("no such service");
    }
    if (relay.mode === "reset") return void req.socket.destroy();
    if (relay.mode === "slow") await new Promise((r) => setTimeout(r, relay.delayMs));
    let up: Response;
    try {
      up = await fetch(relay.upstream, { method: "POST", body: data, headers: { "content-type": String(req.headers["content-type"] ?? ""), accept: String(req.headers.accept ?? "") } });
    } catch {
      return void req.socket.destroy(); // the store is gone: so is the connection
    }
    const text = await up.text();
    const headers: Record<string, string> = { "content-type": up.headers.get("content-type") ?? "application/json" };
    const maxRows = up.headers.get("x-sparql-maxrows");
    if (maxRows) headers["x-sparql-maxrows"] = maxRows;
    res.writeHead(up.status, headers);
    res.end(relay.mode === "garbage" ? text.slice(0, Math.floor(text.length / 2)) : text);
  };
  server = createServer((req, res) => void handle(req, res).catch(() => req.socket.destroy()));
  await new Promise<void>((r) => server.listen(0, "127.0.0.1", () => r()));
  const a = server.address();
  (relay as { url: string }).url = `http://127.0.0.1:${typeof a === "object" && a ? a.port : 0}/sparql`;
  return relay;
}
