// The failure reason people read when a job ends failed. BullMQ's own message for a job whose worker
// died too often is "job stalled more than allowable limit" (bullmq 5.81,
// dist/esm/scripts/moveStalledJobsToWait-9.js), raised as an UnrecoverableError.
import { describe, expect, it } from "vitest";
import { UnrecoverableError } from "bullmq";
import { finalFailureReason } from "@/worker/mark-recording-failed";

describe("finalFailureReason", () => {
  it("counts the attempts of an ordinary failure", () => {
    expect(finalFailureReason(new Error("timed out after 3 h\nstack..."), 3)).toBe("Processing failed after 3 attempts: timed out after 3 h");
    expect(finalFailureReason(new Error("disk full"), 1)).toBe("Processing failed: disk full");
  });

  it("keeps a refusal's words as they are", () => {
    expect(finalFailureReason(new UnrecoverableError("No video track: the file holds only audio"), 1)).toBe("No video track: the file holds only audio");
  });

  it("explains a job whose worker died more often than allowed", () => {
    expect(finalFailureReason(new UnrecoverableError("job stalled more than allowable limit"), 0)).toMatch(/worker stopped while processing this recording, more than once/);
  });
});
