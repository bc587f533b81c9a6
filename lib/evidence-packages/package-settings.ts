// Settings of evidence packages, from the environment with local defaults (.env.example lists them).
import { z } from "zod";

const schema = z.object({
  // how long a built package is kept before its file is removed, in days
  EVIDENCE_PACKAGE_KEEP_DAYS: z.coerce.number().int().min(1).max(3650).default(14),
  // free space a build must leave on the store's disk besides the package itself, in bytes
  EVIDENCE_PACKAGE_DISK_RESERVE_BYTES: z.coerce.number().int().min(0).default(256 * 1024 ** 2), // 256 MiB
});

export type PackageSettings = { keepDays: number; diskReserveBytes: number };

export function packageSettings(e: Record<string, string | undefined> = process.env): PackageSettings {
  const p = schema.parse(Object.fromEntries(Object.entries(e).filter(([k, v]) => k.startsWith("EVIDENCE_PACKAGE_") && v !== undefined && v !== "")));
  return { keepDays: p.EVIDENCE_PACKAGE_KEEP_DAYS, diskReserveBytes: p.EVIDENCE_PACKAGE_DISK_RESERVE_BYTES };
}

export const DAY_MS = 86_400_000;
