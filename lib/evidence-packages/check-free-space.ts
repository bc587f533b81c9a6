// Refuses a package that would not fit on the store's disk, before anything is written: the free
// space is what fs.statfs reports as available to this (unprivileged) process, bavail x bsize
// (Node.js fs.statfs documentation; statfs(2)), less the reserve the settings keep free.
import "server-only";
import { statfs } from "node:fs/promises";
import { ApiError } from "@/lib/api/errors";
import { formatBytes } from "@/lib/uploads/format-bytes";

export type DiskFigures = { freeBytes: number; neededBytes: number; reserveBytes: number };

export async function freeBytesAt(dir: string): Promise<number> {
  const s = await statfs(dir);
  return Number(s.bavail) * Number(s.bsize);
}

export async function checkFreeSpace(dir: string, neededBytes: number, reserveBytes: number, free: (dir: string) => Promise<number> = freeBytesAt): Promise<DiskFigures> {
  const freeBytes = await free(dir);
  const figures = { freeBytes, neededBytes, reserveBytes };
  if (neededBytes + reserveBytes > freeBytes) {
    throw new ApiError(
      "conflict",
      `The package needs about ${formatBytes(neededBytes)} but the store's disk has ${formatBytes(freeBytes)} free` +
        (reserveBytes > 0 ? ` (of which ${formatBytes(reserveBytes)} must stay free)` : "") +
        ". Free some space or package fewer recordings.",
    );
  }
  return figures;
}
