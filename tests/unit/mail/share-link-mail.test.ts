// The share mail promises only what the link holds (issue: it promised "download the report" when
// no report was attached). Cairn's own wording; no outside source.
import { describe, expect, it } from "vitest";
import { composeShareLinkMail, describeShareContents } from "@/lib/mail/mail-share-link";

const base = {
  to: ["client@example.test"],
  url: "http://localhost/s/abc",
  expiresAt: new Date("2026-12-20T00:00:00Z"),
  organisationName: "Wrenfield Aerial",
  senderName: "Ada",
  jobTitle: "Tower survey",
  label: "North face",
  hasPasscode: false,
};

describe("share link mail", () => {
  it("does not promise a report when none is attached", () => {
    const mail = composeShareLinkMail({ ...base, contains: { recordings: 1, findings: 3, report: false } });
    expect(mail.text).toContain("You can watch the recording and jump between the findings.");
    expect(mail.text).not.toContain("report");
  });
  it("promises the report when one is attached, and only the report for a report link", () => {
    expect(describeShareContents({ recordings: 2, findings: 1, report: true })).toBe("You can watch the recordings, go to the finding and download the report.");
    expect(describeShareContents({ recordings: 0, findings: 0, report: true })).toBe("You can download the report.");
  });
  it("says plainly when the link holds nothing yet", () => {
    expect(describeShareContents({ recordings: 0, findings: 0, report: false })).toMatch(/nothing is attached/);
  });
});
