// Input schemas live in one place per domain (lib/<domain>/*-input.ts or lib/validation/<domain>.ts,
// DEVELOPERS.md "Validation"); a route file imports its schemas and declares none of its own.
import { describe, expect, it } from "vitest";
import { readFileSync, readdirSync, statSync } from "node:fs";
import path from "node:path";

const root = path.resolve(__dirname, "../../..");
function routes(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const p = path.join(dir, name);
    if (statSync(p).isDirectory()) return routes(p);
    return name === "route.ts" ? [p] : [];
  });
}

describe("route files", () => {
  const files = routes(path.join(root, "app"));
  it("are found", () => expect(files.length).toBeGreaterThan(60));
  it("declare no zod schema of their own", () => {
    const declaring = files.filter((f) => /from "zod"/.test(readFileSync(f, "utf8"))).map((f) => path.relative(root, f));
    expect(declaring).toEqual([]);
  });
});
