// The rows and notices the members page passes between its parts.
import type { Role } from "@/db/schema/types";

export type MemberRow = { userId: string; name: string; email: string; role: Role; joinedAt: string };
export type InvitationRow = { id: string; email: string; role: Role; invitedByName: string | null; expiresAt: string; createdAt: string; state: "pending" | "expired" };
/** the one line above the page saying what was just done, or why not */
export type Notice = { kind: "ok" | "problem"; text: string } | null;
