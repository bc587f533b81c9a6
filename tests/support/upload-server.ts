// A plain Node http server in front of the very route module Next serves at /api/uploads
// (app/api/uploads/[[...path]]/route.ts): tests drive it with tus-js-client over real HTTP, and
// the crash test runs it as a separate process it can SIGKILL (tests/support/run-upload-server.ts).
import http from "node:http";
import type { AddressInfo } from "node:net";
import { Readable } from "node:stream";
import * as route from "@/app/api/uploads/[[...path]]/route";

type Handler = (req: Request) => Promise<Response>;
const HANDLERS: Record<string, Handler | undefined> = {
  GET: route.GET,
  HEAD: route.HEAD,
  POST: route.POST,
  PATCH: route.PATCH,
  DELETE: route.DELETE,
  OPTIONS: route.OPTIONS,
};

function toRequest(req: http.IncomingMessage): Request {
  const headers = new Headers();
  for (const [k, v] of Object.entries(req.headers)) {
    if (Array.isArray(v)) v.forEach((x) => headers.append(k, x));
    else if (v !== undefined) headers.set(k, v);
  }
  const method = req.method ?? "GET";
  const body = method === "GET" || method === "HEAD" ? undefined : (Readable.toWeb(req) as ReadableStream<Uint8Array>);
  return new Request(`http://${req.headers.host ?? "localhost"}${req.url ?? "/"}`, { method, headers, body, duplex: "half" } as RequestInit);
}

export async function startUploadServer(port = 0, host = "127.0.0.1"): Promise<{ server: http.Server; url: string; close: () => Promise<void> }> {
  const server = http.createServer(async (req, res) => {
    try {
      const handler = HANDLERS[req.method ?? ""];
      if (!req.url?.startsWith("/api/uploads")) {
        res.writeHead(404).end();
        return;
      }
      if (!handler) {
        res.writeHead(405).end();
        return;
      }
      const response = await handler(toRequest(req));
      const headers: Record<string, string> = {};
      response.headers.forEach((v, k) => (headers[k] = v));
      res.writeHead(response.status, headers);
      if (response.body && req.method !== "HEAD") Readable.fromWeb(response.body as import("node:stream/web").ReadableStream).pipe(res);
      else res.end();
    } catch (err) {
      console.error("[upload-server]", err);
      if (!res.headersSent) res.writeHead(500);
      res.end();
    }
  });
  server.keepAliveTimeout = 5_000;
  await new Promise<void>((resolve) => server.listen(port, host, resolve));
  const { port: bound } = server.address() as AddressInfo;
  return {
    server,
    url: `http://${host}:${bound}`,
    close: () =>
      new Promise<void>((resolve) => {
        server.closeAllConnections();
        server.close(() => resolve());
      }),
  };
}
