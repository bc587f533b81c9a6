// The free-disk refusal (its figures and its arithmetic) with the free space given in, and the package
// settings read from the environment.
import { describe, expect, it } from "vitest";
import { checkFreeSpace } from "@/lib/evidence-packages/check-free-space";
import { packageSettings } from "@/lib/evidence-packages/package-settings";

const free = (bytes: number) => async () => bytes;

describe("checkFreeSpace", () => {
  it("lets a package through that fits with the reserve left", async () => {
    await expect(checkFreeSpace("/", 700, 300, free(1000))).resolves.toEqual({ freeBytes: 1000, neededBytes: 700, reserveBytes: 300 });
  });
  it("refuses one byte over, naming both figures (decimal units, lib/uploads/format-bytes.ts)", async () => {
    await expect(checkFreeSpace("/", 2_000_000_001, 0, free(2_000_000_000))).rejects.toMatchObject({
      code: "conflict",
      message: expect.stringContaining("needs about 2.0 GB but the store's disk has 2.0 GB free"),
    });
    await expect(checkFreeSpace("/", 701, 300, free(1000))).rejects.toMatchObject({ message: expect.stringContaining("of which 300 bytes must stay free") });
  });
});

describe("packageSettings", () => {
  it("has local defaults: kept 14 days, 256 MiB left free", () => {
    expect(packageSettings({})).toEqual({ keepDays: 14, diskReserveBytes: 256 * 1024 ** 2 });
  });
  it("reads the environment and refuses nonsense", () => {
    expect(packageSettings({ EVIDENCE_PACKAGE_KEEP_DAYS: "30", EVIDENCE_PACKAGE_DISK_RESERVE_BYTES: "0" })).toEqual({ keepDays: 30, diskReserveBytes: 0 });
    expect(() => packageSettings({ EVIDENCE_PACKAGE_KEEP_DAYS: "0" })).toThrow();
    expect(() => packageSettings({ EVIDENCE_PACKAGE_KEEP_DAYS: "a week" })).toThrow();
  });
});
