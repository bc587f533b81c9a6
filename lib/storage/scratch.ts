// Scratch space for work on local files (ffmpeg's inputs and outputs, a package being written). It is
// never inside the store, and each process has a folder of its own, so two workers on one machine, or
// a worker and the web app, never share or clean up each other's files. SCRATCH_DIR sets the parent.
import "server-only";
import { mkdir, readdir, rm } from "node:fs/promises";
import { hostname } from "node:os";
import path from "node:path";
import { randomUUID } from "node:crypto";
import { env } from "@/lib/config/env";

const own = () => `${hostname()}-${process.pid}`;

/** This process's scratch folder (created on first use). */
export async function scratchDir(): Promise<string> {
  const dir = path.join(env().scratchDir, own());
  await mkdir(dir, { recursive: true });
  return dir;
}

/** A new, empty folder for one piece of work, inside this process's scratch folder. */
export async function scratchFolder(label: string): Promise<string> {
  const dir = path.join(await scratchDir(), `${label.replace(/[^a-z0-9-]/gi, "_")}-${randomUUID()}`);
  await mkdir(dir, { recursive: true });
  return dir;
}

/** A path for one scratch file (not created). */
export async function scratchFile(label: string): Promise<string> {
  return path.join(await scratchDir(), `${label.replace(/[^a-z0-9.-]/gi, "_")}-${randomUUID()}`);
}

function alive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (err) {
    return (err as NodeJS.ErrnoException).code === "EPERM";
  }
}

/** Removes the scratch folders of processes on this machine that are no longer running (a killed worker's leftovers). */
export async function removeDeadScratch(): Promise<number> {
  const base = env().scratchDir;
  const host = hostname();
  let removed = 0;
  for (const name of await readdir(base).catch(() => [] as string[])) {
    const m = /^(.*)-(\d+)$/.exec(name);
    if (!m || m[1] !== host || Number(m[2]) === process.pid || alive(Number(m[2]))) continue;
    await rm(path.join(base, name), { recursive: true, force: true });
    removed++;
  }
  return removed;
}
