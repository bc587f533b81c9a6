// Cookie headers as browsers send them (RFC 6265 section 4.2.1: "cookie-pair *( ";" SP cookie-pair )"),
// including values another app on the same host may set that are not valid percent-encoding.
import { describe, expect, it } from "vitest";
import { parseCookies } from "@/lib/auth/read-session";

describe("parseCookies", () => {
  it("reads each cookie of a header, decoding percent-escapes", () => {
    const c = parseCookies("a=1; next-auth.session-token=abc.def; name=caf%C3%A9");
    expect(c.get("a")).toBe("1");
    expect(c.get("next-auth.session-token")).toBe("abc.def");
    expect(c.get("name")).toBe("café");
  });

  it("keeps a value with a bare % as it is instead of throwing", () => {
    const c = parseCookies("theme=50%; next-auth.session-token=tok");
    expect(c.get("theme")).toBe("50%");
    expect(c.get("next-auth.session-token")).toBe("tok");
  });

  it("ignores pairs without a name or '=', and an empty or missing header", () => {
    expect(parseCookies(null).size).toBe(0);
    expect(parseCookies("").size).toBe(0);
    expect(parseCookies("justtext; x=%E0%A4%A").get("x")).toBe("%E0%A4%A");
  });
});
