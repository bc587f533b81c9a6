// Locks that hold across every web process sharing one staging folder, so an upload can move from one
// instance to another (a load balancer without affinity, an instance restarted) and two instances can
// never write the same upload at once. They are PostgreSQL transaction-level advisory locks
// (pg_try_advisory_xact_lock, PostgreSQL documentation "Advisory Locks"): held by an open transaction,
// released by its end (COMMIT, or the server itself when the connection or the process dies), so a
// transaction-mode pooling proxy in front of PostgreSQL cannot break them, and a crash never leaves
// an upload locked.
//
// 1. The tus locker (@tus/server's `locker` option; its Locker/Lock interface from @tus/utils): one
//    lock per upload id for each request that writes it. A holder in this process is asked to let go
//    when another request wants the lock, as @tus/server's MemoryLocker does (an interrupted client's
//    old request ends, its retry goes on); a holder in another process is waited for until the lock
//    timeout (its request ends when its client's connection does).
// 2. The commit of an upload (lib/uploads/with-ingest-lock.ts): one at a time, wherever it runs.
//
// Each lock holds a database connection of its own while it is held (one per upload request being
// written, and one per commit), so uploads waiting for a lock never take the app's pooled connections.
import "server-only";
import postgres from "postgres";
import { ERRORS, type Lock, type Locker, type RequestRelease } from "@tus/server";
import { env } from "@/lib/config/env";

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

/**
 * Takes the transaction-level advisory lock named `name` (waiting up to `timeoutMs`) and keeps it
 * while `whileHeld` runs; answers whether it was taken.
 */
async function holdLock(
  name: string,
  opts: { timeoutMs: number; signal?: AbortSignal; whileWaiting?: () => Promise<void> | void },
  whileHeld: () => Promise<void>,
): Promise<boolean> {
  const deadline = Date.now() + opts.timeoutMs;
  // A connection of its own for each lock, with its own BEGIN and COMMIT. Should the database go away
  // while the lock is held, nothing more may be sent on that connection: postgres.js 3.4 crashes the
  // process when a query is written to a connection whose socket has closed (reserved connections and
  // sql.begin() alike; found by tests/reliability/database-outage.test.ts). With one connection per
  // client, the client's `onclose` says exactly when that happened.
  let dead = false;
  const conn = postgres(env().DATABASE_URL, { max: 1, idle_timeout: 0, connect_timeout: 10, onnotice: () => {}, onclose: () => (dead = true) });
  let open = false;
  try {
    await conn`begin`;
    open = true;
    for (;;) {
      // checked right before each query: the connection may have closed during the wait below
      if (dead) throw new Error("the database connection closed while waiting for a lock");
      const [row] = await conn<{ locked: boolean }[]>`select pg_try_advisory_xact_lock(hashtextextended(${name}, 0)) as locked`;
      if (row.locked) break;
      await opts.whileWaiting?.();
      if (opts.signal?.aborted || Date.now() > deadline) return false;
      await sleep(50);
    }
    await whileHeld();
    return true;
  } finally {
    // the end of the transaction releases the lock (a closed connection has released it already)
    if (open && !dead) await conn`commit`.catch(() => {});
    await conn.end({ timeout: 1 }).catch(() => {});
  }
}

/** Tries `name` once: runs `work` if nobody holds it, answers { locked: false } if somebody does. */
export async function withSharedLockIfFree<T>(name: string, work: () => Promise<T>): Promise<{ locked: true; value: T } | { locked: false }> {
  let result: { value: T } | undefined;
  await holdLock(name, { timeoutMs: 0 }, async () => {
    result = { value: await work() };
  });
  return result ? { locked: true, value: result.value } : { locked: false };
}

/** @tus/server's locker, across processes (see the top of this file). */
export class SharedUploadLocker implements Locker {
  /** requestRelease of the locks this process holds, by upload id */
  readonly localHolders = new Map<string, RequestRelease>();
  constructor(readonly acquireTimeoutMs = 30_000) {}
  newLock(id: string): Lock {
    return new SharedUploadLock(id, this);
  }
}

class SharedUploadLock implements Lock {
  private release?: () => void;
  private ended?: Promise<unknown>;
  private requestRelease?: RequestRelease;

  constructor(
    private readonly id: string,
    private readonly locker: SharedUploadLocker,
  ) {}

  async lock(stopSignal: AbortSignal, requestRelease: RequestRelease): Promise<void> {
    let held!: () => void;
    let refused!: (err: unknown) => void;
    const acquired = new Promise<void>((resolve, reject) => {
      held = resolve;
      refused = reject;
    });
    this.ended = holdLock(
      `cairn-upload:${this.id}`,
      {
        timeoutMs: this.locker.acquireTimeoutMs,
        signal: stopSignal,
        // a request of this process holds it: ask it to let go, as MemoryLocker does
        whileWaiting: () => this.locker.localHolders.get(this.id)?.(),
      },
      async () => {
        this.requestRelease = requestRelease;
        this.locker.localHolders.set(this.id, requestRelease);
        held();
        await new Promise<void>((r) => (this.release = r));
      },
    ).then(
      (got) => {
        if (!got) refused(ERRORS.ERR_LOCK_TIMEOUT);
      },
      (err) => {
        // the database went away: before the lock was held, the request fails; after, the lock is gone
        refused(err);
        if (this.release) console.warn(`[uploads] the lock of upload ${this.id} ended with its database connection:`, (err as Error).message);
      },
    );
    await acquired;
  }

  async unlock(): Promise<void> {
    if (this.locker.localHolders.get(this.id) === this.requestRelease) this.locker.localHolders.delete(this.id);
    this.release?.();
    await this.ended;
  }
}
