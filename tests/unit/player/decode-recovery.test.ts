import { describe, expect, it } from "vitest";
import { FIRST_SKIP_SEC, MAX_TRIES_IN_ONE_PLACE, MEDIA_ERR_DECODE, NO_RECOVERY_YET, planDecodeRecovery, type DecodeRecoveryState } from "@/components/player/decode-recovery";

const FRAME = 1 / 30;

describe("decode-error recovery plan", () => {
  it("acts only on MEDIA_ERR_DECODE (code 3 in the HTML standard's MediaError)", () => {
    // MEDIA_ERR_ABORTED 1, MEDIA_ERR_NETWORK 2, MEDIA_ERR_SRC_NOT_SUPPORTED 4: the page handles those
    for (const code of [1, 2, 4, undefined, null]) expect(planDecodeRecovery(code, 5, 12, FRAME, NO_RECOVERY_YET)).toEqual({ action: "none" });
    expect(MEDIA_ERR_DECODE).toBe(3);
  });

  it("resumes a little after the broken spot, and further each time it stops there again, then gives up", () => {
    let state: DecodeRecoveryState = NO_RECOVERY_YET;
    const resumes: number[] = [];
    let at = 5.0;
    for (let i = 0; i < MAX_TRIES_IN_ONE_PLACE; i++) {
      const plan = planDecodeRecovery(3, at, 12, FRAME, state);
      if (plan.action !== "resume") throw new Error(`try ${i}: ${plan.action}`);
      resumes.push(plan.resumeAtSec);
      state = plan.state;
      at = plan.resumeAtSec + 0.01; // stopped again just after the resume point
    }
    expect(resumes[0]).toBeCloseTo(5 + FIRST_SKIP_SEC, 9);
    for (let i = 1; i < resumes.length; i++) expect(resumes[i] - resumes[i - 1]).toBeGreaterThan(FIRST_SKIP_SEC * 2 ** (i - 1));
    expect(planDecodeRecovery(3, at, 12, FRAME, state).action).toBe("give-up");
  });

  it("a stop elsewhere, or a replay of the old spot, starts afresh with the small skip", () => {
    const first = planDecodeRecovery(3, 5, 12, FRAME, NO_RECOVERY_YET);
    if (first.action !== "resume") throw new Error("expected resume");
    const later = planDecodeRecovery(3, 9, 12, FRAME, first.state);
    expect(later).toMatchObject({ action: "resume", resumeAtSec: 9 + FIRST_SKIP_SEC, state: { tries: 1 } });
    const replay = planDecodeRecovery(3, 5, 12, FRAME, first.state);
    expect(replay).toMatchObject({ action: "resume", resumeAtSec: 5 + FIRST_SKIP_SEC, state: { tries: 1 } });
  });

  it("never resumes past the last frame", () => {
    const plan = planDecodeRecovery(3, 11.9, 12, FRAME, NO_RECOVERY_YET);
    expect(plan).toMatchObject({ action: "resume" });
    if (plan.action === "resume") {
      expect(plan.resumeAtSec).toBeLessThan(12);
      expect(plan.resumeAtSec).toBeGreaterThan(12 - FRAME);
    }
  });
});
