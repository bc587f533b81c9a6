// The ft/m choice is the person's, not the organisation's: it follows them into every workspace.
import "server-only";
import { eq } from "drizzle-orm";
import { db } from "@/db/client";
import { users } from "@/db/schema";
import type { DisplayUnits } from "@/lib/validation/range-checks";

export async function setPreferredUnits(userId: string, preferredUnits: DisplayUnits) {
  const [row] = await db()
    .update(users)
    .set({ preferredUnits, updatedAt: new Date() })
    .where(eq(users.id, userId))
    .returning({ preferredUnits: users.preferredUnits });
  return row;
}
