// One commit per upload at a time, across every process that can commit one (the web server on
// the client's last PATCH or HEAD, the purge in the worker). A PostgreSQL session advisory lock on
// a reserved connection: it is released when the work ends, and by the server itself if the
// process holding it dies, so a crash never leaves an upload locked.
import "server-only";
import { sqlClient } from "@/db/client";

export type LockResult<T> = { locked: true; value: T } | { locked: false };

export async function withIngestLock<T>(uploadId: string, work: () => Promise<T>): Promise<LockResult<T>> {
  const key = `cairn-ingest:${uploadId}`;
  const conn = await sqlClient().reserve();
  try {
    const [row] = await conn<{ locked: boolean }[]>`select pg_try_advisory_lock(hashtextextended(${key}, 0)) as locked`;
    if (!row.locked) return { locked: false };
    try {
      return { locked: true, value: await work() };
    } finally {
      await conn`select pg_advisory_unlock(hashtextextended(${key}, 0))`.catch(() => {});
    }
  } finally {
    conn.release();
  }
}
