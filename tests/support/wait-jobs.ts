// Waits for background work before a test asserts (PeerTube's waitJobs): the queues are drained when
// no job is waiting, delayed, prioritized or running, twice in a row a moment apart (a finishing job
// can queue another). Repeatable schedules (purge-uploads) are left out by default: they are always
// "delayed".
import { inArray } from "drizzle-orm";
import { db } from "@/db/client";
import { recordings } from "@/db/schema";
import { queue, type JobName } from "@/lib/queue/jobs";

const POLL_MS = 150;
const BUSY_STATES = ["waiting", "active", "delayed", "prioritized", "paused", "waiting-children"] as const;

export async function pendingJobs(names: JobName[]): Promise<number> {
  let total = 0;
  for (const name of names) {
    const counts = await queue(name).getJobCounts(...BUSY_STATES);
    total += Object.values(counts).reduce((a, b) => a + b, 0);
  }
  return total;
}

export async function waitJobs(opts: { names?: JobName[]; timeoutMs?: number } = {}): Promise<void> {
  const names = opts.names ?? ["process-recording", "extract-still", "build-report"];
  const deadline = Date.now() + (opts.timeoutMs ?? 90_000);
  let idleChecks = 0;
  while (Date.now() < deadline) {
    idleChecks = (await pendingJobs(names)) === 0 ? idleChecks + 1 : 0;
    if (idleChecks >= 2) return;
    await new Promise((r) => setTimeout(r, POLL_MS));
  }
  throw new Error(`jobs still pending after ${opts.timeoutMs ?? 90_000} ms: ${await pendingJobs(names)}`);
}

/** Waits until every recording is in one of `states` (default: a final state). */
export async function waitForRecordings(ids: string[], opts: { states?: string[]; timeoutMs?: number } = {}) {
  const states = opts.states ?? ["ready", "failed"];
  const deadline = Date.now() + (opts.timeoutMs ?? 90_000);
  for (;;) {
    const rows = await db().select({ id: recordings.id, state: recordings.state }).from(recordings).where(inArray(recordings.id, ids));
    if (rows.length === ids.length && rows.every((r) => states.includes(r.state))) return rows;
    if (Date.now() > deadline) throw new Error(`recordings not ${states.join("/")} in time: ${JSON.stringify(rows)}`);
    await new Promise((r) => setTimeout(r, POLL_MS));
  }
}
