// Upload-Metadata as the uploader sends it: table of good and bad values, and what the server keeps.
import { describe, expect, it } from "vitest";
import { parseClientMetadata, toTusMetadata, fromTusMetadata } from "@/lib/uploads/upload-metadata";
import { fileNameProblem, normaliseRelativePath } from "@/lib/uploads/check-file-name";
import { recordingIdForUpload } from "@/lib/uploads/recording-id-for-upload";

const base = { jobId: "5b0f3c1e-7d7a-4c59-9a43-2f4f3f0f9a10", flightId: "8c2f6a8e-1c5b-4f0e-8a7d-3e0d6f1b2c33", filename: "clip.264" };

describe("file names and folder paths", () => {
  const bad: [string, string, RegExp][] = [
    ["path traversal", "../../etc/passwd.264", /path separator/],
    ["backslash", "..\\windows\\clip.264", /path separator/],
    ["NUL", "clip\u0000.264", /control characters/],
    ["newline", "clip\n.264", /control characters/],
    ["C1 control", "clip\u0085.264", /control characters/],
    ["right-to-left override", "clip\u202ekcp.264", /text-direction/],
    ["dot-dot", "..", /path step/],
    ["empty", "   ", /empty/],
    ["longer than 255 bytes in UTF-8", "é".repeat(128), /255 bytes/],
  ];
  it.each(bad)("%s is refused", (_l, name, reason) => {
    expect(fileNameProblem(name)).toMatch(reason);
  });
  it.each(["clip.264", "REC_0007", "vol 2 (copy).MP4", "Überflug Süd.mov", "飛行1.avc"])("%s is accepted", (name) => {
    expect(fileNameProblem(name)).toBeNull();
  });

  it("folder paths: a drop's leading slash goes, steps are checked one by one", () => {
    expect(normaliseRelativePath("/card/DCIM/100/clip.264")).toEqual({ path: "card/DCIM/100/clip.264" });
    expect(normaliseRelativePath("card/clip.264")).toEqual({ path: "card/clip.264" });
    expect(normaliseRelativePath("card/../../clip.264")).toEqual({ problem: "the folder path contains a “.” or “..” step" });
    expect(normaliseRelativePath("card//clip.264")).toEqual({ problem: "the folder path has an empty step (“//”)" });
    expect(normaliseRelativePath("card\\clip.264")).toEqual({ problem: "the folder path contains a backslash" });
    expect(normaliseRelativePath("card/a\u0007b/clip.264")).toEqual({ problem: "a folder name contains control characters" });
  });
});

describe("parseClientMetadata", () => {
  it("accepts what the uploader sends, treating Uppy's \"null\" as absent", () => {
    const r = parseClientMetadata({ ...base, relativePath: "null", lastModified: "1773480000000", filetype: "" });
    expect(r).toEqual({ ok: true, value: { ...base, relativePath: undefined, lastModified: 1773480000000, filetype: undefined } });
  });

  const bad: [string, Record<string, string>, string][] = [
    ["no job", { flightId: base.flightId, filename: "a.264" }, "jobId"],
    ["a job that is not an id", { ...base, jobId: "1; drop table jobs" }, "jobId"],
    ["no file name", { jobId: base.jobId, flightId: base.flightId }, "filename"],
    ["a traversal name", { ...base, filename: "../x.264" }, "filename"],
    ["a traversal folder", { ...base, relativePath: "/card/../../x.264" }, "relativePath"],
    ["a file time that is not a number", { ...base, lastModified: "yesterday" }, "lastModified"],
    ["a file time far in the future", { ...base, lastModified: String(Date.now() + 30 * 86_400_000) }, "lastModified"],
  ];
  it.each(bad)("%s is refused with the field named", (_l, raw, field) => {
    const r = parseClientMetadata(raw);
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(Object.keys(r.fields)).toContain(field);
      expect(r.message).toContain(field);
    }
  });

  it("server fields are written by the server only and read back unchanged", () => {
    const parsed = parseClientMetadata({ ...base, cairnOrg: "forged", relativePath: "card/clip.264", lastModified: "1773480000000" });
    expect(parsed.ok).toBe(true);
    if (!parsed.ok) return;
    expect(parsed.value).not.toHaveProperty("cairnOrg");
    const stored = toTusMetadata({ ...parsed.value, organisationId: "org-1", userId: "user-1" });
    expect(stored.cairnOrg).toBe("org-1");
    expect(fromTusMetadata(stored)).toEqual({ ...parsed.value, organisationId: "org-1", userId: "user-1", filetype: undefined });
  });
});

describe("recordingIdForUpload", () => {
  it("is a stable RFC 9562 version-8 UUID per upload id", () => {
    const a = recordingIdForUpload("0f1e2d3c4b5a69788796a5b4c3d2e1f0");
    expect(a).toBe(recordingIdForUpload("0f1e2d3c4b5a69788796a5b4c3d2e1f0"));
    expect(a).not.toBe(recordingIdForUpload("0f1e2d3c4b5a69788796a5b4c3d2e1f1"));
    // RFC 9562 sections 4.1 and 4.2: variant bits 10, version nibble 8
    expect(a).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-8[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/);
  });
});
