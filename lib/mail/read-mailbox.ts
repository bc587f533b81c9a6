// Reads the local fake mail server's stored messages (development page and tests only).
import "server-only";
import { readdir, readFile } from "node:fs/promises";
import path from "node:path";
import { env } from "@/lib/config/env";

export type StoredMail = { id: string; receivedAt: string; from: string; to: string[]; subject: string; text: string; html: string };

export async function readMailbox(opts: { to?: string; limit?: number } = {}): Promise<StoredMail[]> {
  const dir = env().mailDir;
  let names: string[] = [];
  try {
    names = (await readdir(dir)).filter((n) => n.endsWith(".json"));
  } catch {
    return [];
  }
  names.sort().reverse(); // names start with the arrival time in ms: newest first
  const out: StoredMail[] = [];
  for (const n of names) {
    const mail = JSON.parse(await readFile(path.join(dir, n), "utf8")) as StoredMail;
    if (opts.to && !mail.to.includes(opts.to.toLowerCase())) continue;
    out.push(mail);
    if (out.length >= (opts.limit ?? 50)) break;
  }
  return out;
}
