// The one decision behind every media response, taken again on every request (each range request of
// a seeking player included): which mode's credentials apply, who they stand for, whether the named
// file exists in that organisation, and whether this principal may open it.
import { ApiError, notFound } from "@/lib/api/errors";
import type { MediaAccessMode, MediaCredentials } from "./media-access-mode";
import { MEDIA_ACCESS_MODES } from "./media-access-modes";
import type { MediaFile, MediaPrincipal, MediaTarget } from "./media-file";
import { resolveMediaFile } from "./resolve-media-file";

export type MediaGrant = { organisationId: string; file: MediaFile; principal: MediaPrincipal; mode: MediaAccessMode; credentials: MediaCredentials };

export async function authorizeMedia(req: Request, target: MediaTarget, token: string | null = null, modes: MediaAccessMode[] = MEDIA_ACCESS_MODES): Promise<MediaGrant> {
  const credentials: MediaCredentials = { req, token: token ?? new URL(req.url).searchParams.get("token") };
  const mode = modes.find((m) => m.applies(credentials));
  if (!mode) throw new ApiError("unauthenticated", "Sign in or use a valid share link to view this file");
  const principal = await mode.principal(credentials);
  const file = await resolveMediaFile(principal.organisationId, target);
  if (!file || !(await mode.mayOpen(principal, file))) throw notFound("File not found");
  return { organisationId: principal.organisationId, file, principal, mode, credentials };
}
