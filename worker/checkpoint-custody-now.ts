// `npm run custody:checkpoint`: makes a custody checkpoint now for every organisation whose log grew
// since its last one (the same work as the worker's "custody-checkpoints" job), and prints the result.
import { closeDb } from "@/db/client";
import { makeDueCheckpoints } from "@/lib/custody/make-checkpoint";

makeDueCheckpoints()
  .then(async ({ made, failed }) => {
    console.log(`custody checkpoints made: ${made}`);
    for (const f of failed) console.error(`organisation ${f.organisationId}: ${f.error}`);
    await closeDb();
    process.exit(failed.length ? 1 : 0);
  })
  .catch(async (err) => {
    console.error(`custody checkpoints: ${(err as Error).message}`);
    await closeDb().catch(() => {});
    process.exit(1);
  });
