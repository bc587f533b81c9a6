// What a player does when the browser cannot decode part of a rendition (MediaError code 3,
// MEDIA_ERR_DECODE, HTML Living Standard "media elements"). A media element in that state stays stopped
// until its source is loaded again, so the player reloads the same source and resumes a little after the
// broken spot. Browsers restart decoding at the keyframe before a seek target, so a second error near the
// same place skips further each time (0.25 s, 0.5 s, 1 s, 2 s, 4 s: a group of pictures is rarely longer);
// after that many tries in one place the player gives up there and says so instead of looping.
// Processing re-encodes damaged streams, so this is a safety net, not the main path.

export const MEDIA_ERR_DECODE = 3;
export const FIRST_SKIP_SEC = 0.25;
export const MAX_TRIES_IN_ONE_PLACE = 5;

export type DecodeRecoveryState = {
  /** Where the last recovery resumed, seconds; a new error before resumeAt + its skip is the same place. */
  lastResumeSec: number | null;
  /** Tries in the current place. */
  tries: number;
};

export const NO_RECOVERY_YET: DecodeRecoveryState = { lastResumeSec: null, tries: 0 };

export type DecodeRecoveryPlan =
  | { action: "resume"; resumeAtSec: number; failedAtSec: number; state: DecodeRecoveryState }
  | { action: "give-up"; failedAtSec: number; state: DecodeRecoveryState }
  | { action: "none" };

/**
 * @param errorCode the MediaError code the browser raised
 * @param failedAtSec the player's time when it stopped
 * @param durationSec the rendition's duration (resuming never goes past its last moment)
 * @param frameSec one frame's length, so a resume at the end still lands on the last frame
 */
export function planDecodeRecovery(errorCode: number | undefined | null, failedAtSec: number, durationSec: number, frameSec: number, state: DecodeRecoveryState): DecodeRecoveryPlan {
  if (errorCode !== MEDIA_ERR_DECODE) return { action: "none" };
  const at = Number.isFinite(failedAtSec) && failedAtSec > 0 ? failedAtSec : 0;
  // the same place: stopped again at or shortly after where the last recovery resumed (a viewer who
  // seeks back and meets the old spot again starts afresh)
  const samePlace = state.lastResumeSec !== null && at >= state.lastResumeSec - frameSec && at <= state.lastResumeSec + FIRST_SKIP_SEC * 2 ** state.tries;
  const tries = samePlace ? state.tries + 1 : 1;
  if (tries > MAX_TRIES_IN_ONE_PLACE) return { action: "give-up", failedAtSec: at, state: { lastResumeSec: state.lastResumeSec, tries } };
  const skip = FIRST_SKIP_SEC * 2 ** (tries - 1);
  const lastMoment = Math.max(0, durationSec - frameSec / 2);
  const from = samePlace ? Math.max(at, state.lastResumeSec ?? 0) : at;
  const resumeAtSec = Math.min(from + skip, lastMoment);
  return { action: "resume", resumeAtSec, failedAtSec: at, state: { lastResumeSec: resumeAtSec, tries } };
}
