// `npm ci` on Node 20 warns (EBADENGINE) about packages whose declared engines exclude it. Such a
// warning is harmless only for code that never runs in Node: this test finds every locked package
// whose `engines.node` excludes the running Node version (the semver package evaluates the ranges,
// as npm does) and checks that each is reachable only through the uploader (@uppy/*), which runs in
// the browser bundle alone: no server module imports it, only files marked "use client".
import { describe, expect, it } from "vitest";
import { readFileSync, readdirSync, statSync } from "node:fs";
import path from "node:path";
import semver from "semver";

const root = path.resolve(__dirname, "../../..");
type LockEntry = { version?: string; engines?: { node?: string } | string[]; dependencies?: Record<string, string>; optionalDependencies?: Record<string, string>; peerDependencies?: Record<string, string>; dev?: boolean };
const lock = JSON.parse(readFileSync(path.join(root, "package-lock.json"), "utf8")) as { packages: Record<string, LockEntry> };
const packages = lock.packages;

const nameOf = (p: string) => p.slice(p.lastIndexOf("node_modules/") + "node_modules/".length);
const BROWSER_ONLY = (name: string) => name.startsWith("@uppy/");

/** Where `name`, required from the package at lock path `from`, resolves (Node's lookup up the folders). */
function resolve(from: string, name: string): string | undefined {
  let dir = from;
  for (;;) {
    const candidate = dir ? `${dir}/node_modules/${name}` : `node_modules/${name}`;
    if (packages[candidate]) return candidate;
    if (!dir) return undefined;
    const i = dir.lastIndexOf("/node_modules/");
    dir = i < 0 ? "" : dir.slice(0, i);
  }
}

/** Lock paths of the packages (and "" for the project) that depend on `target`. */
function dependents(target: string): string[] {
  const out: string[] = [];
  for (const [p, e] of Object.entries(packages)) {
    const names = Object.keys({ ...e.dependencies, ...e.optionalDependencies, ...e.peerDependencies });
    if (names.some((n) => resolve(p, n) === target)) out.push(p);
  }
  return out;
}

function excludesThisNode(e: LockEntry): boolean {
  const range = !Array.isArray(e.engines) ? e.engines?.node : undefined;
  return Boolean(range && !semver.satisfies(process.versions.node, range, { includePrerelease: true }));
}

function sourceFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((n) => {
    const p = path.join(dir, n);
    return statSync(p).isDirectory() ? sourceFiles(p) : /\.(ts|tsx)$/.test(n) ? [p] : [];
  });
}

describe("packages whose engines exclude this Node version", () => {
  const offending = Object.entries(packages).filter(([p, e]) => p && !e.dev && excludesThisNode(e)).map(([p]) => p);

  it("are reached only through the browser-only uploader packages", () => {
    const problems: string[] = [];
    for (const p of offending) {
      // walk up the dependents until a browser-only package stops the walk; reaching the project
      // itself by another way means server code could load the package
      const seen = new Set<string>();
      const queue = [p];
      while (queue.length) {
        const cur = queue.pop()!;
        if (seen.has(cur)) continue;
        seen.add(cur);
        for (const d of dependents(cur)) {
          if (d === "") problems.push(`${nameOf(p)}: the project depends on ${nameOf(cur)} directly`);
          else if (!BROWSER_ONLY(nameOf(d))) queue.push(d);
        }
      }
    }
    expect(problems).toEqual([]);
  });

  it("the uploader packages are imported only by client components", () => {
    const importers = ["app", "components", "lib", "worker", "db"].flatMap((d) => sourceFiles(path.join(root, d))).filter((f) => /from\s+["']@uppy\//.test(readFileSync(f, "utf8")));
    expect(importers.length).toBeGreaterThan(0);
    for (const f of importers) expect(readFileSync(f, "utf8").trimStart().startsWith('"use client"'), path.relative(root, f)).toBe(true);
  });

  it("are the ones DEVELOPERS.md names", () => {
    const doc = readFileSync(path.join(root, "DEVELOPERS.md"), "utf8");
    for (const p of offending) expect(doc, `DEVELOPERS.md does not name ${nameOf(p)}`).toContain(`\`${nameOf(p)}\``);
  });
});
