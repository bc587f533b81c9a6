// The one decision behind every member media response (/api/media/**, the report download), taken
// again on every request (each range request of a seeking player included): the session's member,
// read fresh from the database (a removed member loses access at the next range request), whether the
// named file exists in that organisation, and whether the member's role and client scope may open it.
// Share links have their own route, /api/s/media (lib/sharing/serve-share-media.ts).
import { ApiError, notFound } from "@/lib/api/errors";
import { requireMember } from "@/lib/api/with-org";
import { can, type Permission } from "@/lib/auth/permissions";
import { inScope } from "@/lib/auth/client-scope";
import type { MediaFile, MediaPrincipal, MediaTarget } from "./media-file";
import { resolveMediaFile } from "./resolve-media-file";

export type MediaGrant = { organisationId: string; file: MediaFile; principal: MediaPrincipal };

const PERMISSION_FOR: Record<MediaFile["kind"], Permission> = {
  rendition: "recordings.read",
  still: "findings.read",
  report: "findings.read",
  evidence_package: "packages.download",
};

async function mayOpen(p: MediaPrincipal, file: MediaFile): Promise<boolean> {
  if (p.organisationId !== file.organisationId || !can(p.role, PERMISSION_FOR[file.kind])) return false;
  // a client account: only files of its own clients' jobs, and of reports only approved versions
  if (file.kind === "report") return inScope(p, "report", file.reportId ?? file.id);
  if (file.kind === "still") return inScope(p, "still", file.id);
  return inScope(p, "recording", file.recordingId!);
}

export async function authorizeMedia(req: Request, target: MediaTarget): Promise<MediaGrant> {
  const m = await requireMember(req);
  if (!can(m.role, "recordings.read")) throw new ApiError("forbidden", "Your role does not allow viewing media");
  const principal: MediaPrincipal = { organisationId: m.organisationId, userId: m.userId, role: m.role, clientIds: m.clientIds };
  const file = await resolveMediaFile(principal.organisationId, target);
  if (!file || !(await mayOpen(principal, file))) throw notFound("File not found");
  return { organisationId: principal.organisationId, file, principal };
}
