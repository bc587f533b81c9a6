// One commit per upload at a time, across every process that can commit one (any web process on the
// client's last PATCH or HEAD, the purge in a worker). A PostgreSQL transaction-level advisory lock
// (lib/uploads/shared-upload-locks.ts): released when the work ends, and by the server itself if the
// process holding it dies, so a crash never leaves an upload locked, and a transaction-mode pooling
// proxy cannot break it.
import "server-only";
import { withSharedLockIfFree } from "./shared-upload-locks";

export type LockResult<T> = { locked: true; value: T } | { locked: false };

export function withIngestLock<T>(uploadId: string, work: () => Promise<T>): Promise<LockResult<T>> {
  return withSharedLockIfFree(`cairn-ingest:${uploadId}`, work);
}
