// Paths of the signed media route. The path carries the grant only: never the share token.
import "server-only";
import { env } from "@/lib/config/env";
import { grantExpiry, signMediaGrant, type MediaGrantKind } from "./media-grant";

export const shareMediaPath = (grant: string) => `/api/s/media/${grant}`;

export function signedShareMediaPath(linkId: string, kind: MediaGrantKind, resourceId: string, nowMs = Date.now()): string {
  return shareMediaPath(signMediaGrant({ linkId, kind, resourceId, expiresAt: grantExpiry(nowMs) }, env().MEDIA_SIGNING_KEY));
}
