// The decode-error safety net on a video.js player (the plan is in decode-recovery.ts): on
// MEDIA_ERR_DECODE, clear the error, load the same source again, seek past the broken spot and keep
// playing if it was playing; report a short note for the page to show. Other errors are left to the page.
import type videojs from "video.js";
import { MEDIA_ERR_DECODE, NO_RECOVERY_YET, planDecodeRecovery, type DecodeRecoveryState } from "./decode-recovery";

type Player = ReturnType<typeof videojs>;

export type DecodeRecoveryNote = { failedAtSec: number; resumedAtSec: number | null };

/** Returns a function that says whether the error now on the player is one this net handles. */
export function attachDecodeRecovery(
  player: Player,
  options: { currentSrc: () => string; frameSec: number; onNote: (note: DecodeRecoveryNote) => void; onResumed?: (sec: number) => void },
): () => boolean {
  let state: DecodeRecoveryState = NO_RECOVERY_YET;
  let wasPlaying = false;
  let lastTime = 0;
  player.on("play", () => (wasPlaying = true));
  player.on("pause", () => {
    // a pause the browser makes for the error itself does not count as the viewer's
    if (!player.error()) wasPlaying = false;
  });
  player.on("timeupdate", () => {
    const t = player.currentTime();
    if (typeof t === "number" && Number.isFinite(t)) lastTime = t;
  });
  player.on("error", () => {
    const err = player.error();
    const duration = player.duration();
    const at = Math.max(lastTime, player.currentTime() ?? 0);
    const plan = planDecodeRecovery(err?.code, at, typeof duration === "number" && Number.isFinite(duration) ? duration : at + 10, options.frameSec, state);
    if (plan.action === "none") return;
    state = plan.state;
    // either way the error is cleared and the source loaded again, so seeking works at once; after
    // too many tries in one place the player waits there, paused, for the viewer to seek past it
    const resumeAt = plan.action === "resume" ? plan.resumeAtSec : (state.lastResumeSec ?? plan.failedAtSec);
    const resumePlaying = plan.action === "resume" && wasPlaying;
    player.error(null);
    player.src({ src: options.currentSrc(), type: "video/mp4" });
    player.one("loadedmetadata", () => {
      player.hasStarted(true);
      player.currentTime(resumeAt);
      lastTime = resumeAt;
      options.onResumed?.(resumeAt);
      if (resumePlaying) void player.play()?.catch(() => undefined);
    });
    options.onNote({ failedAtSec: plan.failedAtSec, resumedAtSec: plan.action === "resume" ? resumeAt : null });
  });
  return () => player.error()?.code === MEDIA_ERR_DECODE;
}
