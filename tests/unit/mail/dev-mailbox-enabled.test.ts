// The development mailbox shows every mail the app sent, sign-in links included: a production server
// must answer 404 for it unless it is a local run (`npm start` sets CAIRN_LOCAL=1).
import { afterEach, describe, expect, it, vi } from "vitest";
import { devMailboxEnabled } from "@/app/dev/mailbox/dev-mailbox-enabled";

afterEach(() => {
  vi.unstubAllEnvs();
});

describe("devMailboxEnabled", () => {
  it("is off on a production server", () => {
    vi.stubEnv("NODE_ENV", "production");
    vi.stubEnv("CAIRN_LOCAL", "");
    expect(devMailboxEnabled()).toBe(false);
    vi.stubEnv("CAIRN_LOCAL", "true"); // only the exact value the start script sets counts
    expect(devMailboxEnabled()).toBe(false);
  });

  it("is on for a local production build (npm start) and in development", () => {
    vi.stubEnv("NODE_ENV", "production");
    vi.stubEnv("CAIRN_LOCAL", "1");
    expect(devMailboxEnabled()).toBe(true);
    vi.stubEnv("NODE_ENV", "development");
    vi.stubEnv("CAIRN_LOCAL", "");
    expect(devMailboxEnabled()).toBe(true);
  });
});
