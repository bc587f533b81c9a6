// Every module that reaches the database, the file system or the installation's secrets is marked
// `import "server-only"`, so a Client Component that imports one (directly or through another
// module) fails the Next.js build instead of shipping server code to the browser. Next.js resolves
// `server-only` to its own built-in copy (next/dist/build/create-compiler-aliases.js; the Turbopack
// import map likewise); plain Node (the worker, scripts) loads the empty
// scripts/server-only-outside-next package.
import { describe, expect, it } from "vitest";
import { readFileSync, readdirSync, statSync } from "node:fs";
import path from "node:path";

const root = path.resolve(__dirname, "../../..");
const TOUCHES = [
  /from "@\/db\/client"/,
  /from "node:fs(\/promises)?"/,
  /from "@\/lib\/config\/env"/,
  /from "@\/lib\/config\/installation-secrets"/,
  /from "\.\/(env|installation-secrets)"/,
  /from "(\.\/)?client"/, // db/*.ts importing the client beside it
];

function sources(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const p = path.join(dir, name);
    if (statSync(p).isDirectory()) return sources(p);
    return /\.tsx?$/.test(name) ? [p] : [];
  });
}

describe("server-only marks", () => {
  const files = [...sources(path.join(root, "lib")), path.join(root, "db/client.ts")];
  const touching = files.filter((f) => TOUCHES.some((re) => re.test(readFileSync(f, "utf8"))));

  it("finds the modules that touch the database, files or secrets", () => {
    // a floor, so a broken pattern cannot pass by finding nothing
    expect(touching.length).toBeGreaterThan(100);
    expect(touching.map((f) => path.relative(root, f))).toContain("db/client.ts");
  });

  it("marks each of them server-only", () => {
    const unmarked = touching.filter((f) => !/^import "server-only";$/m.test(readFileSync(f, "utf8"))).map((f) => path.relative(root, f));
    expect(unmarked).toEqual([]);
  });

  it("no client module is marked (it would fail the build)", () => {
    const clientMarked = files.filter((f) => {
      const text = readFileSync(f, "utf8");
      return /^"use client";/m.test(text) && /^import "server-only";$/m.test(text);
    });
    expect(clientMarked).toEqual([]);
  });
});
