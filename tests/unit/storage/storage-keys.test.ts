import { describe, expect, it } from "vitest";
import { derivedFolderKey, derivedKey, originalKey, reportKey, stillKey } from "@/lib/storage/storage-keys";

const org = "0b0e1c5e-8f1a-4d8e-9a43-6f1f0c2b7a12";
const rec = "3f2a9c1e-5b7d-4e0f-8a6c-1d2e3f4a5b6c";
const other = "9a8b7c6d-5e4f-4a3b-8c2d-1e0f9a8b7c6d";

describe("storage keys: one module builds every key", () => {
  it("lays out originals, derived files, stills and reports by id", () => {
    expect(originalKey(org, rec)).toBe(`originals/${org}/3f/${rec}`);
    expect(derivedFolderKey(org, rec)).toBe(`derived/${org}/${rec}`);
    expect(derivedKey(org, rec, "playable.mp4")).toBe(`derived/${org}/${rec}/playable.mp4`);
    expect(stillKey(org, rec, other)).toBe(`stills/${org}/${rec}/${other}.jpg`);
    expect(reportKey(org, rec, other)).toBe(`reports/${org}/${rec}/${other}.pdf`);
  });

  it("keeps stills out of the derived folder that reprocessing replaces", () => {
    expect(stillKey(org, rec, other).startsWith(`${derivedFolderKey(org, rec)}/`)).toBe(false);
  });

  it.each([
    ["a path", () => originalKey(org, "../../etc/passwd")],
    ["an id with a slash", () => stillKey(org, rec, `${other}/x`)],
    ["upper-case hex", () => reportKey(org.toUpperCase(), rec, other)],
    ["36 characters that are not a UUID", () => derivedFolderKey(org, "-".repeat(36))],
    ["a derived file name that climbs", () => derivedKey(org, rec, "..")],
    ["a derived file name with a slash", () => derivedKey(org, rec, "a/b.mp4")],
  ])("refuses %s", (_label, build) => {
    expect(build).toThrow();
  });
});
