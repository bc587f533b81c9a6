// npm run db:seed: the invented demo scenario (idempotent).
import { db, closeDb } from "./client";
import { seedDemo } from "./seed/seed-demo";
import { seedDemoRecordings } from "./seed/seed-demo-recordings";
import { closeQueues } from "@/lib/queue/jobs";
import { DEMO_PASSWORD, DEMO_USERS } from "./seed/demo-scenario";

seedDemo(db())
  .then(async ({ created, organisationId }) => {
    console.log(created ? "[cairn] demo scenario seeded" : "[cairn] demo scenario already present: nothing changed");
    const made = await seedDemoRecordings(db(), organisationId);
    if (made) console.log(`[cairn] ${made} demo recordings generated from test patterns and queued for processing`);
    await closeQueues();
    console.log(`[cairn] demo sign-ins (password ${DEMO_PASSWORD}): ${DEMO_USERS.map((u) => `${u.email} (${u.role})`).join(", ")}`);
    await closeDb();
  })
  .catch(async (err) => {
    console.error("[cairn] seeding failed:", err);
    await closeDb();
    process.exit(1);
  });
