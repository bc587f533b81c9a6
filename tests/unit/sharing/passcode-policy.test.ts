import { describe, expect, it } from "vitest";
import { afterWrongPasscode, isPasscodeLocked, MAX_PASSCODE_TRIES, PASSCODE_LOCK_MS } from "@/lib/sharing/passcode-policy";
import { shareLinkStatus } from "@/lib/sharing/share-link-status";

const t0 = new Date(Date.UTC(2026, 2, 14, 9, 0, 0));
const at = (ms: number) => new Date(t0.getTime() + ms);

describe("wrong passcode limiting", () => {
  it("locks on the last allowed wrong try, for the lock period", () => {
    let state = { failedPasscodeAttempts: 0, lockedUntil: null as Date | null };
    for (let i = 1; i < MAX_PASSCODE_TRIES; i++) {
      state = afterWrongPasscode(state, at(i));
      expect(state).toEqual({ failedPasscodeAttempts: i, lockedUntil: null });
      expect(isPasscodeLocked(state, at(i))).toBe(false);
    }
    state = afterWrongPasscode(state, at(MAX_PASSCODE_TRIES));
    expect(state.failedPasscodeAttempts).toBe(MAX_PASSCODE_TRIES);
    expect(state.lockedUntil?.getTime()).toBe(at(MAX_PASSCODE_TRIES).getTime() + PASSCODE_LOCK_MS);
    expect(isPasscodeLocked(state, at(MAX_PASSCODE_TRIES + PASSCODE_LOCK_MS - 1))).toBe(true);
    expect(isPasscodeLocked(state, at(MAX_PASSCODE_TRIES + PASSCODE_LOCK_MS))).toBe(false);
  });

  it("starts a fresh count once a lock has run out", () => {
    const locked = { failedPasscodeAttempts: MAX_PASSCODE_TRIES, lockedUntil: at(1000) };
    expect(afterWrongPasscode(locked, at(1000))).toEqual({ failedPasscodeAttempts: 1, lockedUntil: null });
  });
});

describe("share link status", () => {
  it.each([
    [{ revokedAt: null, expiresAt: at(1) }, at(0), "active"],
    [{ revokedAt: null, expiresAt: at(0) }, at(0), "expired"],
    [{ revokedAt: null, expiresAt: at(-1) }, at(0), "expired"],
    [{ revokedAt: at(-5), expiresAt: at(1000) }, at(0), "revoked"],
    // revoked and expired: the sender's act is what the page reports
    [{ revokedAt: at(-5), expiresAt: at(-1) }, at(0), "revoked"],
  ] as const)("%o at %s is %s", (link, now, expected) => {
    expect(shareLinkStatus(link, now)).toBe(expected);
  });
});
