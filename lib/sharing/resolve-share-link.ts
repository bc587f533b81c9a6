// A token from a URL -> the link it opens, or a refusal. Unknown, malformed and guessed tokens all
// answer "unknown" the same way, so the answer says nothing about which links exist. Revoked and
// expired links answer "gone": only someone who once held a working link can see that.
import "server-only";
import { eq } from "drizzle-orm";
import { db } from "@/db/client";
import { organisations, shareLinks } from "@/db/schema";
import type { ShareLink } from "@/db/schema/types";
import { hashShareToken, looksLikeShareToken } from "./share-token";
import { shareLinkStatus } from "./share-link-status";

export type ResolvedShareLink = ShareLink & { organisationName: string };

export type ShareResolution =
  | { kind: "open"; link: ResolvedShareLink }
  | { kind: "gone"; reason: "expired" | "revoked"; link: ResolvedShareLink }
  | { kind: "unknown" };

async function loadBy(where: ReturnType<typeof eq>): Promise<ResolvedShareLink | null> {
  const [row] = await db()
    .select({ link: shareLinks, organisationName: organisations.name })
    .from(shareLinks)
    .innerJoin(organisations, eq(organisations.id, shareLinks.organisationId))
    .where(where);
  return row ? { ...row.link, organisationName: row.organisationName } : null;
}

function classify(link: ResolvedShareLink | null, now: Date): ShareResolution {
  if (!link) return { kind: "unknown" };
  const status = shareLinkStatus(link, now);
  return status === "active" ? { kind: "open", link } : { kind: "gone", reason: status, link };
}

export async function resolveShareLink(token: unknown, now: Date = new Date()): Promise<ShareResolution> {
  if (!looksLikeShareToken(token)) return { kind: "unknown" };
  return classify(await loadBy(eq(shareLinks.tokenHash, hashShareToken(token))), now);
}

/** For the media route: the grant names the link by id (never by token). */
export async function resolveShareLinkById(linkId: string, now: Date = new Date()): Promise<ShareResolution> {
  return classify(await loadBy(eq(shareLinks.id, linkId)), now);
}
