// Runs async work one at a time per key, in the order it was asked for, within this process.
// The upload server is one process per staging folder (docs/library-notes.md, "tus"), so this is enough to
// make "check the quota, then reserve" a single step for each organisation.
export class OneAtATime {
  private readonly tails = new Map<string, Promise<unknown>>();

  run<T>(key: string, work: () => Promise<T>): Promise<T> {
    const before = this.tails.get(key) ?? Promise.resolve();
    const result = before.then(work, work);
    const tail = result.catch(() => undefined);
    this.tails.set(key, tail);
    void tail.then(() => {
      if (this.tails.get(key) === tail) this.tails.delete(key);
    });
    return result;
  }

  /** Keys with work queued or running (for tests). */
  get busyKeys(): number {
    return this.tails.size;
  }
}
