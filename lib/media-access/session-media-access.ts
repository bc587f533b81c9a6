// Media access for a signed-in member: the session cookie, the membership read fresh from the
// database on every request (a removed member loses access at the next range request), the role's
// permission for the kind of file.
import { ApiError } from "@/lib/api/errors";
import { requireMember } from "@/lib/api/with-org";
import { can, type Permission } from "@/lib/auth/permissions";
import { inScope } from "@/lib/auth/client-scope";
import type { MediaAccessMode } from "./media-access-mode";
import type { MediaFile, MediaPrincipal } from "./media-file";

const PERMISSION_FOR: Record<MediaFile["kind"], Permission> = {
  rendition: "recordings.read",
  still: "findings.read",
  report: "findings.read",
};

export const sessionMediaAccess: MediaAccessMode = {
  name: "session",
  applies: (c) => c.token === null,
  async principal(c): Promise<MediaPrincipal> {
    const m = await requireMember(c.req);
    if (!can(m.role, "recordings.read")) throw new ApiError("forbidden", "Your role does not allow viewing media");
    return { type: "member", organisationId: m.organisationId, userId: m.userId, role: m.role, clientIds: m.clientIds };
  },
  async mayOpen(p, file) {
    if (p.type !== "member" || p.organisationId !== file.organisationId || !can(p.role, PERMISSION_FOR[file.kind])) return false;
    // a client account: only files of its own clients' jobs, and of reports only approved versions
    if (file.kind === "report") return inScope(p, "report", file.reportId ?? file.id);
    if (file.kind === "still") return inScope(p, "still", file.id);
    return inScope(p, "recording", file.recordingId!);
  },
};
