// Next's proxy.ts (formerly middleware.ts) buffers the bodies of the requests it matches and keeps
// only the first 10 MB (Next.js docs, proxyClientMaxBodySize; docs/library-notes.md). The uploader's
// PATCHes are larger than that (UPLOAD_CHUNK_BYTES), so the upload route must never be matched: this guards against a proxy
// added later without the exclusion.
import { existsSync, readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { UPLOAD_CHUNK_BYTES } from "@/lib/uploads/upload-limits";

const root = path.resolve(__dirname, "../../..");
const candidates = ["proxy.ts", "middleware.ts", "src/proxy.ts", "src/middleware.ts"].map((f) => path.join(root, f));

describe("request bodies reach /api/uploads whole", () => {
  it("any proxy.ts / middleware.ts has a matcher that leaves /api/uploads out", () => {
    for (const file of candidates.filter((f) => existsSync(f))) {
      const source = readFileSync(file, "utf8");
      const matcher = /matcher\s*:\s*(\[[^\]]*\]|"[^"]*"|'[^']*')/.exec(source);
      expect(matcher, `${path.relative(root, file)} has no matcher, so it matches /api/uploads`).not.toBeNull();
      // every pattern must exclude the upload route with a negative lookahead
      for (const pattern of matcher![1].match(/["'][^"']+["']/g) ?? []) expect(pattern, `${path.relative(root, file)}: ${pattern}`).toMatch(/\(\?!.*api\/uploads/);
    }
  });

  it("the uploader's PATCH is larger than what a matching proxy would keep, so the guard above matters", () => {
    expect(UPLOAD_CHUNK_BYTES).toBeGreaterThan(10 * 1000 * 1000);
  });
});
