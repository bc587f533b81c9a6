import { describe, expect, it } from "vitest";
import { shareGateResponse, type GateKind } from "@/lib/sharing/share-gate-page";

describe("share door pages", () => {
  it.each([
    ["unknown", 404],
    ["expired", 410],
    ["revoked", 410],
    ["passcode", 200],
    ["passcode-refused", 404],
  ] as [GateKind, number][])("%s answers %i with the share headers", async (kind, status) => {
    const res = shareGateResponse(kind, { organisationName: "Kestrelmoor Aerial Survey", endedAt: new Date(Date.UTC(2026, 2, 14)) });
    expect(res.status).toBe(status);
    expect(res.headers.get("referrer-policy")).toBe("no-referrer");
    expect(res.headers.get("cache-control")).toBe("no-store");
    expect(res.headers.get("x-robots-tag")).toContain("noindex");
    expect(res.headers.get("content-type")).toBe("text/html; charset=utf-8");
    const html = await res.text();
    expect(html).toContain(`data-gate="${kind}"`);
    expect(html).toContain('<meta name="referrer" content="no-referrer">');
  });

  it("the unknown page names no organisation, whatever it is given", async () => {
    const html = await shareGateResponse("unknown", { organisationName: "Kestrelmoor Aerial Survey" }).text();
    expect(html).not.toContain("Kestrelmoor");
  });

  it("escapes the organisation's name (it is text, never markup)", async () => {
    const html = await shareGateResponse("revoked", { organisationName: `<script>alert("x")</script> & Co` }).text();
    expect(html).not.toContain("<script>alert");
    expect(html).toContain("&lt;script&gt;alert(&quot;x&quot;)&lt;/script&gt; &amp; Co");
  });

  it("the passcode forms post back to the same address and never carry a token", async () => {
    for (const kind of ["passcode", "passcode-refused"] as const) {
      const html = await shareGateResponse(kind).text();
      expect(html).toMatch(/<form method="post" autocomplete="off">/);
      expect(html).toContain('name="passcode" type="password"');
      expect(html).not.toMatch(/action=/);
    }
  });
});
