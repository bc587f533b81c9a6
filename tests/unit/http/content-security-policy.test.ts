// The page policy (lib/http/build-content-security-policy.ts) read back with a parser written here
// from the grammar of W3C CSP Level 3 section 2.2 (policy = directives separated by ";", a name then
// space-separated values), and the nonce checked against CSP3's base64-value grammar.
import { describe, expect, it } from "vitest";
import { buildContentSecurityPolicy, makeNonce } from "@/lib/http/build-content-security-policy";

function parse(policy: string): Map<string, string[]> {
  const out = new Map<string, string[]>();
  for (const part of policy.split(";")) {
    const [name, ...values] = part.trim().split(/\s+/);
    if (!name) continue;
    expect(out.has(name), `directive ${name} twice`).toBe(false);
    out.set(name.toLowerCase(), values);
  }
  return out;
}

describe("content security policy", () => {
  it("lets only nonce'd scripts run and no other site frame the page", () => {
    const p = parse(buildContentSecurityPolicy("abc123=="));
    expect(p.get("script-src")).toEqual(["'self'", "'nonce-abc123=='", "'strict-dynamic'"]);
    expect(p.get("script-src")).not.toContain("'unsafe-inline'");
    expect(p.get("script-src")).not.toContain("'unsafe-eval'");
    expect(p.get("frame-ancestors")).toEqual(["'self'"]);
    expect(p.get("object-src")).toEqual(["'none'"]);
    expect(p.get("base-uri")).toEqual(["'self'"]);
    expect(p.get("connect-src")).toEqual(["'self'"]);
    expect(p.get("media-src")).toEqual(["'self'", "blob:"]);
    expect(p.get("img-src")).toEqual(["'self'", "data:", "blob:"]);
    expect(p.get("default-src")).toEqual(["'self'"]);
  });

  it("adds eval (React's dev tooling) and websockets (hot reload) only in development", () => {
    const p = parse(buildContentSecurityPolicy("n", { dev: true }));
    expect(p.get("script-src")).toContain("'unsafe-eval'");
    expect(p.get("connect-src")).toContain("ws:");
  });

  it("makes a fresh 128-bit nonce each time, in CSP's base64-value grammar", () => {
    const seen = new Set<string>();
    for (let i = 0; i < 200; i++) {
      const n = makeNonce();
      expect(n).toMatch(/^[A-Za-z0-9+/_-]+={0,2}$/); // CSP3 2.3.1 base64-value
      expect(Buffer.from(n, "base64")).toHaveLength(16);
      seen.add(n);
    }
    expect(seen.size).toBe(200);
  });
});
