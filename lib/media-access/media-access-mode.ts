// One way of proving the right to open media. Every media request goes through exactly one mode:
// the first that applies to the request's credentials. Today: a signed-in member's session.
// A share link's signed URL is a second mode (sharing adds it to MEDIA_ACCESS_MODES): it applies when
// the URL carries a token, answers 401 for a bad or expired one, and lets the link open only what it
// shares (anything else: 404).
import type { MediaFile, MediaPrincipal } from "./media-file";

export type MediaCredentials = {
  req: Request;
  /** a capability token carried in the URL (path segment or ?token=), if any */
  token: string | null;
};

export interface MediaAccessMode {
  readonly name: string;
  applies(c: MediaCredentials): boolean;
  /** Who the credentials stand for; throws ApiError 401 (no or bad credentials) or 403 (role may not view media). */
  principal(c: MediaCredentials): Promise<MediaPrincipal>;
  /** Whether this principal may open this file (already known to be in its organisation); false answers 404. */
  mayOpen(principal: MediaPrincipal, file: MediaFile): Promise<boolean> | boolean;
  /** Called once per served response (not a 416), e.g. to log a share link's media event. Must not throw. */
  onServed?(principal: MediaPrincipal, file: MediaFile, c: MediaCredentials, res: Response): Promise<void>;
}
