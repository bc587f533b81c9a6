// The player's analytics run the mux-embed that package.json names: videojs-mux pins its own copy,
// and package.json's `overrides` replaces it with the project's, so the SDK whose beacons the other
// playback tests read (mux-embed-source.ts loads the project's copy) is the one the player sends with.
import { describe, expect, it } from "vitest";
import { createRequire } from "node:module";
import { readFileSync } from "node:fs";
import path from "node:path";
import semver from "semver";

const root = path.resolve(__dirname, "../../..");
const fromProject = createRequire(path.join(root, "package.json"));
const fromPlugin = createRequire(fromProject.resolve("videojs-mux"));

describe("mux-embed in the player", () => {
  it("videojs-mux loads the project's own mux-embed, at the version package.json names", () => {
    expect(fromPlugin.resolve("mux-embed")).toBe(fromProject.resolve("mux-embed"));
    const declared = JSON.parse(readFileSync(path.join(root, "package.json"), "utf8")).dependencies["mux-embed"] as string;
    const installed = JSON.parse(readFileSync(path.join(root, "node_modules/mux-embed/package.json"), "utf8")).version as string;
    expect(fromProject.resolve("mux-embed").startsWith(path.join(root, "node_modules/mux-embed/"))).toBe(true);
    expect(semver.satisfies(installed, declared)).toBe(true);
  });
});
