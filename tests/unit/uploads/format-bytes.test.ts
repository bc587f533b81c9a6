// One formatter for every size Cairn shows, in decimal SI units (1 kB = 1000 bytes). The unit
// symbols and the decimal multiples are those of the SI brochure (BIPM, 9th edition, 2019, table 7:
// kilo = 10^3, mega = 10^6, giga = 10^9; "k" lower case); IEC 80000-13 keeps KiB/MiB for 1024-based
// multiples, which Cairn does not use.
import { describe, expect, it } from "vitest";
import { formatBytes } from "@/lib/uploads/format-bytes";

describe("formatBytes", () => {
  it("writes decimal multiples with SI symbols", () => {
    expect(formatBytes(0)).toBe("0 bytes");
    expect(formatBytes(1)).toBe("1 byte");
    expect(formatBytes(999)).toBe("999 bytes");
    expect(formatBytes(1000)).toBe("1.0 kB");
    expect(formatBytes(397_312)).toBe("397 kB"); // 388 KiB, as Uppy printed it ("388 KB")
    expect(formatBytes(47_104)).toBe("47.1 kB"); // 46 KiB
    expect(formatBytes(1_500_000)).toBe("1.5 MB");
    expect(formatBytes(4_000_000_000)).toBe("4.0 GB");
  });
  it("never prints a binary unit", () => {
    for (const n of [1023, 1024, 1_048_576, 1_073_741_824]) expect(formatBytes(n)).not.toMatch(/KiB|MiB|GiB|KB/);
  });
  it("answers a dash for what is not a size", () => {
    expect(formatBytes(-1)).toBe("—");
    expect(formatBytes(Number.NaN)).toBe("—");
  });
});
