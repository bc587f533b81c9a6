// The client address: the socket address our server stamps on each request, and X-Forwarded-For only
// through trusted proxy hops. Expected values follow RFC 7239 section 7.4 / the X-Forwarded-For
// convention that each proxy appends the address it received the request from (rightmost is nearest).
import { describe, expect, it } from "vitest";
import { clientAddress, PEER_HEADER, UNKNOWN_ADDRESS } from "@/lib/http/client-address";

const h = (o: Record<string, string>) => new Headers(o);

describe("clientAddress", () => {
  it("with no trusted proxy, X-Forwarded-For is ignored: the socket address counts", () => {
    for (const forged of ["203.0.113.9", "10.0.0.1, 203.0.113.9", "garbage"]) {
      expect(clientAddress(h({ [PEER_HEADER]: "198.51.100.4", "x-forwarded-for": forged }), 0)).toBe("198.51.100.4");
    }
  });

  it("behind one trusted proxy, the entry that proxy appended; anything the client wrote further left is ignored", () => {
    // client 203.0.113.9 -> our proxy 10.0.0.2 (appends 203.0.113.9) -> app
    expect(clientAddress(h({ [PEER_HEADER]: "10.0.0.2", "x-forwarded-for": "203.0.113.9" }), 1)).toBe("203.0.113.9");
    // the client forged "1.2.3.4" in front; the proxy appended the real address after it
    expect(clientAddress(h({ [PEER_HEADER]: "10.0.0.2", "x-forwarded-for": "1.2.3.4, 203.0.113.9" }), 1)).toBe("203.0.113.9");
  });

  it("behind two trusted proxies, the second entry from the right of [...X-Forwarded-For, socket]", () => {
    expect(clientAddress(h({ [PEER_HEADER]: "10.0.0.3", "x-forwarded-for": "1.2.3.4, 203.0.113.9, 10.0.0.2" }), 2)).toBe("203.0.113.9");
  });

  it("more hops configured than entries present: the leftmost entry, never out of range", () => {
    expect(clientAddress(h({ [PEER_HEADER]: "10.0.0.2" }), 3)).toBe("10.0.0.2");
  });

  it("IPv4-mapped IPv6 socket addresses read as IPv4 (RFC 4291 section 2.5.5.2)", () => {
    expect(clientAddress(h({ [PEER_HEADER]: "::ffff:198.51.100.4" }), 0)).toBe("198.51.100.4");
    expect(clientAddress(h({ [PEER_HEADER]: "2001:DB8::1" }), 0)).toBe("2001:db8::1");
  });

  it("a request that did not pass our socket hook has no provable address", () => {
    expect(clientAddress(h({ "x-forwarded-for": "203.0.113.9" }), 0)).toBe(UNKNOWN_ADDRESS);
    expect(clientAddress(undefined, 0)).toBe(UNKNOWN_ADDRESS);
    // next-auth hands authorize() a plain object of headers
    expect(clientAddress({ [PEER_HEADER]: "198.51.100.4", "x-forwarded-for": "1.1.1.1" }, 0)).toBe("198.51.100.4");
  });
});

describe("installPeerAddress", () => {
  it("stamps the real socket address on every request, replacing a value the client sent under that name", async () => {
    const http = await import("node:http");
    const { installPeerAddress } = await import("@/lib/http/install-peer-address");
    installPeerAddress();
    const seen: (string | undefined)[] = [];
    const server = http.createServer((req, res) => {
      seen.push(req.headers[PEER_HEADER] as string | undefined);
      res.end("ok");
    });
    await new Promise<void>((r) => server.listen(0, "127.0.0.1", r));
    const port = (server.address() as { port: number }).port;
    try {
      await (await fetch(`http://127.0.0.1:${port}/`, { headers: { [PEER_HEADER]: "203.0.113.66", "x-forwarded-for": "203.0.113.66" } })).text();
      await (await fetch(`http://127.0.0.1:${port}/`)).text();
    } finally {
      server.close();
    }
    // Node's socket.remoteAddress is the loopback address the test connected from
    expect(seen).toEqual(["127.0.0.1", "127.0.0.1"]);
  });
});
