// The text a bag is made of, checked against RFC 8493 (BagIt 1.0): manifest lines (2.1.3: checksum,
// whitespace, path; CR, LF and % in a path percent-encoded), tag lines (2.2.2: "Label: value", one line),
// and the names the package gives its files and itself.
import { describe, expect, it } from "vitest";
import { manifestLine, tagLine } from "@/lib/evidence-packages/write-bag-zip";
import { bagName, cleanFileName, recordingFolder } from "@/lib/evidence-packages/package-layout";

const SHA = "e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855"; // SHA-256 of no bytes (FIPS 180-4 test vector, widely published)

describe("manifest lines (RFC 8493 2.1.3)", () => {
  it("are checksum, whitespace, path, newline, as sha256sum -c reads them", () => {
    expect(manifestLine(SHA, "data/recordings/01-x/original/CARD0001.264")).toBe(`${SHA}  data/recordings/01-x/original/CARD0001.264\n`);
  });
  it("percent-encode CR, LF and % in a path", () => {
    expect(manifestLine(SHA, "data/a%b\r\nc")).toBe(`${SHA}  data/a%25b%0D%0Ac\n`);
  });
});

describe("tag lines (RFC 8493 2.2.2)", () => {
  it("are 'Label: value' on one line, line breaks in a value folded to spaces", () => {
    expect(tagLine("Source-Organization", "Kestrelmoor Aerial Survey")).toBe("Source-Organization: Kestrelmoor Aerial Survey\n");
    expect(tagLine("External-Description", "two\r\nlines")).toBe("External-Description: two lines\n");
  });
});

describe("names inside the package", () => {
  it.each([
    ["CARD0001.264", "CARD0001.264"],
    ["../../etc/passwd", "passwd"],
    ["C:\\DCIM\\flight 1 (copy).264", "flight_1__copy_.264"],
    [".hidden", "_hidden"],
    ["", "original"],
    ["ünïcødé.264", "_n_c_d_.264"],
    ["\u0000", "original"],
  ])("%j becomes %j", (input, out) => {
    expect(cleanFileName(input)).toBe(out);
  });

  it("keeps at most the last 120 characters", () => {
    expect(cleanFileName(`${"a".repeat(200)}.264`)).toHaveLength(120);
    expect(cleanFileName(`${"a".repeat(200)}.264`).endsWith(".264")).toBe(true);
  });

  it("numbers recording folders from 01 and names the bag after the job, the date and the package", () => {
    expect(recordingFolder(0, "abc")).toBe("recordings/01-abc");
    expect(recordingFolder(49, "abc")).toBe("recordings/50-abc");
    expect(bagName("Valve tower: annual inspection!", "0f6e7a00-0000-4000-8000-000000000000", new Date("2026-03-14T10:00:00Z"))).toBe("cairn-evidence-valve-tower-annual-inspection-2026-03-14-0f6e7a00");
    expect(bagName("%%%", "0f6e7a00-0000-4000-8000-000000000000", new Date("2026-03-14T10:00:00Z"))).toBe("cairn-evidence-job-2026-03-14-0f6e7a00");
  });
});
