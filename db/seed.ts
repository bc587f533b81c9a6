// npm run db:seed: the invented demo scenario (idempotent). Every connection it opens (PostgreSQL,
// the queues' Redis) is closed at the end, on success and on failure, so the script exits on its
// own (tests/integration/scripts/scripts-exit.test.ts).
import { db, closeDb } from "./client";
import { seedDemo } from "./seed/seed-demo";
import { seedDemoRecordings } from "./seed/seed-demo-recordings";
import { seedDemoTrack } from "./seed/seed-demo-track";
import { closeQueues } from "@/lib/queue/jobs";
import { closeRedis } from "@/lib/queue/redis";
import { DEMO_PASSWORD, DEMO_USERS } from "./seed/demo-scenario";

async function main() {
  const { created, organisationId } = await seedDemo(db());
  console.log(created ? "[cairn] demo scenario seeded" : "[cairn] demo scenario already present: nothing changed");
  const made = await seedDemoRecordings(db(), organisationId);
  if (made) console.log(`[cairn] ${made} demo recordings generated from test patterns and queued for processing`);
  if (await seedDemoTrack(db(), organisationId)) console.log("[cairn] demo flight track imported (invented points)");
  console.log(`[cairn] demo sign-ins (password ${DEMO_PASSWORD}): ${DEMO_USERS.map((u) => `${u.email} (${u.role})`).join(", ")}`);
}

main()
  .catch((err) => {
    console.error("[cairn] seeding failed:", err);
    process.exitCode = 1;
  })
  .finally(async () => {
    await closeQueues();
    await closeRedis();
    await closeDb();
  });
