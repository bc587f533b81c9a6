// The carrier turns a private length header into Content-Length on a Node response written in
// several chunks, as Next writes a streamed body (RFC 9112 section 6: with Content-Length set, no
// chunked transfer coding), and the private name never goes out.
import { describe, expect, it } from "vitest";
import http from "node:http";
import type { AddressInfo } from "node:net";
import { installContentLengthCarrier, LENGTH_CARRIER, contentLengthHeaders } from "@/lib/http/content-length-carrier";

async function serve(handler: http.RequestListener, method = "GET") {
  const server = http.createServer(handler);
  await new Promise<void>((r) => server.listen(0, "127.0.0.1", r));
  try {
    const res = await fetch(`http://127.0.0.1:${(server.address() as AddressInfo).port}/`, { method });
    return { status: res.status, headers: res.headers, body: method === "HEAD" ? "" : await res.text() };
  } finally {
    server.close();
  }
}

describe("content-length carrier", () => {
  it("without it, a body written in chunks goes out chunked (what Next does with a handler's stream)", async () => {
    const out = await serve((_req, res) => {
      res.appendHeader(LENGTH_CARRIER, "11");
      res.write("hello ");
      res.end("world");
    });
    expect(out.headers.get("transfer-encoding")).toBe("chunked");
    expect(out.headers.get("content-length")).toBeNull();
  });

  it("with it, the private header becomes Content-Length, set or appended, and is not sent itself", async () => {
    installContentLengthCarrier();
    installContentLengthCarrier(); // twice is harmless
    for (const how of ["appendHeader", "setHeader"] as const) {
      const out = await serve((_req, res) => {
        res[how](LENGTH_CARRIER, "11");
        res.write("hello ");
        res.end("world");
      });
      expect(out.body).toBe("hello world");
      expect(out.headers.get("content-length")).toBe("11");
      expect(out.headers.get("transfer-encoding")).toBeNull();
      expect(out.headers.get(LENGTH_CARRIER)).toBeNull();
    }
    const head = await serve((_req, res) => {
      res.setHeader(LENGTH_CARRIER, "42");
      res.end();
    }, "HEAD");
    expect(head.headers.get("content-length")).toBe("42");
  });

  it("contentLengthHeaders gives both names the same value", () => {
    expect(contentLengthHeaders(7)).toEqual({ "Content-Length": "7", [LENGTH_CARRIER]: "7" });
  });
});
