// Removes the files of evidence packages past their keep date and marks them expired (run by the
// worker's retention sweep). The row stays, with its SHA-256, and so do its custody events.
import "server-only";
import { and, eq, lte } from "drizzle-orm";
import { db } from "@/db/client";
import { evidencePackages } from "@/db/schema";
import { removeKey } from "@/lib/storage/store";

export async function expirePackages(now: Date): Promise<string[]> {
  const gone = await db()
    .update(evidencePackages)
    .set({ state: "expired", updatedAt: now })
    .where(and(eq(evidencePackages.state, "ready"), lte(evidencePackages.expiresAt, now)))
    .returning({ id: evidencePackages.id, storageKey: evidencePackages.storageKey });
  for (const p of gone) if (p.storageKey) await removeKey(p.storageKey);
  return gone.map((p) => p.id);
}
