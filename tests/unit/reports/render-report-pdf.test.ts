// The report renderer on its own (no database): what it prints, read back with pdfjs-dist, an
// independent PDF reader. Hashes must survive whole (no hyphen, no break inside), markup in notes
// must print as the characters typed.
import { describe, expect, it } from "vitest";
import { createHash } from "node:crypto";
import { renderReportPdf } from "@/lib/reports/render-report-pdf";
import type { ReportData } from "@/lib/reports/report-data";
import { describeMoment } from "@/lib/findings/describe-moment";
import { SEVERITY_SCALE } from "@/lib/findings/severity-scale";
import { CAUTIONS } from "@/lib/geo/cautions";
import { PRESERVATION_STATEMENT } from "@/lib/reports/preservation-statement";
import { readPdfText } from "@/tests/support/read-pdf-text";

const sha = (s: string) => createHash("sha256").update(s).digest("hex");

const pdfText = async (bytes: Buffer) => (await readPdfText(bytes)).text;

const note = `Crack <b>widening</b> & "spalling" <script>x()</script>`;
const data: ReportData = {
  organisationName: "Test Survey Crew",
  reportId: "00000000-0000-4000-8000-000000000001",
  version: 4,
  builtAt: "2026-03-14 09:41 (Europe/London)",
  timeZone: "Europe/London",
  builtBy: "Test Reviewer",
  job: { title: "Unit report", scope: null, status: "In review", dueDate: "2026-03-20" },
  client: { name: "Test Client", contact: null },
  site: { name: "Test Site", address: null, coordinates: "54.412370, -2.619420", assetKind: "Bridge" },
  crew: [{ role: "Reviewer", name: "Test Reviewer" }],
  flights: [],
  recordings: [{ name: "A.264", sha256: sha("a"), size: "1.0 KiB (1,024 bytes)", duration: "00:00:02.000", signal: "Signal: 60 frame slots, at least 3 lost, 91.7 % intact; first degradation at 00:00:01.000 (frame 30); longest loss 0.100 s", flownOn: "2026-03-14", uploadedAt: "2026-03-14 10:00 (Europe/London)" }],
  counts: (["critical", "severe", "major", "moderate", "minor", "note"] as const).map((s) => ({ severity: s, label: SEVERITY_SCALE[s].label, nbiRating: SEVERITY_SCALE[s].nbiRating, nbiWord: SEVERITY_SCALE[s].nbiWord, count: s === "severe" ? 1 : 0 })),
  findings: [
    {
      number: 1,
      id: "00000000-0000-4000-8000-000000000002",
      severity: "severe",
      severityLabel: "Severe",
      severityMeaning: SEVERITY_SCALE.severe.meaning,
      nbiRating: 3,
      nbiWord: "Serious",
      category: "Cracking",
      note,
      recordingName: "A.264",
      recordingSha256: sha("a"),
      start: describeMoment(1800, { num: 30000, den: 1001 }),
      end: null,
      position: null,
      distances: null,
      box: null,
      still: null,
      stillMissing: "The still was not ready when this report was built.",
      markedBy: "Test Reviewer",
      version: 2,
    },
  ],
  cautions: CAUTIONS.slice(1, 2),
  preservation: PRESERVATION_STATEMENT,
  custodyHead: { seq: 1234, hash: sha("c"), occurredAt: "14 Mar 2026, 09:00" },
};

describe("renderReportPdf", () => {
  it("prints timecodes, severity with its condition rating, whole hashes and notes as typed", async () => {
    const pdf = await renderReportPdf(data);
    expect(pdf.subarray(0, 5).toString()).toBe("%PDF-");
    const text = await pdfText(pdf);
    expect(text).toContain("00:01:00;02"); // SMPTE ST 12-1 worked value: 29.97 DF frame 1800
    expect(text).toContain("frame 1800");
    expect(text).toContain("Severe (FHWA NBI condition rating 3, Serious)");
    expect(text).toContain(note);
    // the digest on one line, unbroken
    expect(text.split("\n").some((line) => line.includes(sha("a")))).toBe(true);
    expect(text).toContain("Unit report");
    // a lost count that is only a lower bound reads "at least" in the PDF too
    expect(text.replace(/\s+/g, " ")).toContain("at least 3 lost");
    expect(text).toContain(CAUTIONS[1].summary);
    expect(text).toContain("report version 4"); // the footer on every page
    expect(text).toMatch(/Page 1 of \d/);
    // the custody log's newest hash at build time, whole on one line with its entry number
    expect(text.split("\n").some((line) => line.includes("custody entry 1234 chain SHA-256") && line.includes(sha("c")))).toBe(true);
  }, 60_000);
});
