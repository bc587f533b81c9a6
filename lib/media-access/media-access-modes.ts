// The ways media may be opened, tried in order: a share link's signed address when the URL carries a
// token (lib/sharing/share-link-media-access.ts), else a signed-in member's session.
import type { MediaAccessMode } from "./media-access-mode";
import { sessionMediaAccess } from "./session-media-access";
import { shareLinkMediaAccess } from "@/lib/sharing/share-link-media-access";

export const MEDIA_ACCESS_MODES: MediaAccessMode[] = [shareLinkMediaAccess, sessionMediaAccess];
