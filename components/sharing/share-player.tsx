"use client";
// A plain, read-only video.js player for the client's page. Created in an effect and disposed on
// cleanup (video.js breaks under StrictMode's double mount otherwise: video.js issue #7746 and its
// React guide; docs/library-notes.md). A new source
// (another recording, or a fresh signed address after the old one expired) keeps the position.
import { forwardRef, useEffect, useImperativeHandle, useRef, useState } from "react";
import videojs from "video.js";
import "video.js/dist/video-js.css";
import { attachPlaybackAnalytics } from "@/components/player/attach-playback-analytics";
import { attachDecodeRecovery, type DecodeRecoveryNote } from "@/components/player/attach-decode-recovery";
import { DecodeRecoveryMessage } from "@/components/player/decode-recovery-message";
import { MEDIA_ERR_DECODE } from "@/components/player/decode-recovery";

type Player = ReturnType<typeof videojs>;

export type SharePlayerHandle = { seek: (seconds: number) => void };

type Props = {
  src: string;
  poster: string | null;
  thumbnails: string | null;
  label: string;
  /** where to start once the clip has loaded (a jump to a finding in another recording) */
  startAt?: number;
  onTime?: (seconds: number) => void;
  onDuration?: (seconds: number) => void;
  /** the source failed to load (an expired address, a revoked link): the page fetches fresh addresses */
  onSourceError?: () => void;
  /** counts this viewing for the share link in the recording's playback analytics */
  analytics?: { recordingId: string; title: string };
  /** one frame's length, seconds (the decode-error safety net never resumes past the last frame) */
  frameSec?: number;
};

/** The signed grant at the end of a share media address (/api/s/media/<grant>): the view's access token. */
function grantOf(src: string): string | undefined {
  return new URL(src, window.location.href).pathname.split("/").pop() || undefined;
}

export const SharePlayer = forwardRef<SharePlayerHandle, Props>(function SharePlayer({ src, poster, thumbnails, label, startAt, onTime, onDuration, onSourceError, analytics, frameSec }, ref) {
  const holder = useRef<HTMLDivElement>(null);
  const player = useRef<Player | null>(null);
  const callbacks = useRef({ onTime, onDuration, onSourceError });
  callbacks.current = { onTime, onDuration, onSourceError };
  const lastTime = useRef(0);
  const currentSrc = useRef(src);
  const [recoveryNote, setRecoveryNote] = useState<DecodeRecoveryNote | null>(null);

  useEffect(() => {
    const el = document.createElement("video-js");
    el.setAttribute("data-testid", "share-video");
    el.setAttribute("aria-label", label);
    holder.current?.appendChild(el);
    const p = videojs(el, {
      controls: true,
      fluid: true,
      preload: "auto",
      playsinline: true,
      playbackRates: [0.25, 0.5, 1, 1.5, 2],
      // the line under the player gives position and length in the same frame times as the findings;
      // video.js's remaining time ("-0:10") would be a second, rounder account of it
      controlBar: { remainingTimeDisplay: false },
      poster: poster ?? undefined,
      sources: [{ src: currentSrc.current, type: "video/mp4" }],
    });
    p.on("timeupdate", () => {
      const t = p.currentTime() ?? 0;
      lastTime.current = t;
      callbacks.current.onTime?.(t);
    });
    p.on("loadedmetadata", () => callbacks.current.onDuration?.(p.duration() ?? 0));
    if (startAt) p.one("loadedmetadata", () => p.currentTime(startAt));
    // a picture the browser cannot decode is handled by the safety net (reload, resume past it);
    // only a source that fails to load asks the page for fresh addresses
    attachDecodeRecovery(p, { currentSrc: () => currentSrc.current, frameSec: frameSec ?? 1 / 30, onNote: setRecoveryNote, onResumed: (t) => callbacks.current.onTime?.(t) });
    p.on("error", () => {
      const e = p.error();
      if (!e || e.code === MEDIA_ERR_DECODE) return;
      callbacks.current.onSourceError?.();
    });
    player.current = p;
    let disposed = false;
    if (analytics) attachPlaybackAnalytics(p, { ...analytics, playerName: "Cairn shared page", accessToken: grantOf(currentSrc.current) }, () => !disposed);
    return () => {
      disposed = true;
      p.dispose();
      player.current = null;
    };
    // the player is built once per mount; sources change through the effect below
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, []);

  useEffect(() => {
    const p = player.current;
    if (!p || src === currentSrc.current) return;
    // only a failed source is swapped mid-play; a fresh address for a working source waits
    if (!p.error()) {
      currentSrc.current = src;
      return;
    }
    currentSrc.current = src;
    const resumeAt = lastTime.current;
    p.error(null);
    p.src({ src, type: "video/mp4" });
    p.one("loadedmetadata", () => p.currentTime(resumeAt));
  }, [src]);

  useEffect(() => {
    const p = player.current;
    if (!p || !thumbnails) return;
    const track = p.addRemoteTextTrack({ kind: "metadata", label: "thumbnails", src: thumbnails }, false);
    return () => {
      if (player.current) p.removeRemoteTextTrack(track as unknown as TextTrack);
    };
  }, [thumbnails]);

  useImperativeHandle(ref, () => ({
    seek(seconds: number) {
      const p = player.current;
      if (!p) return;
      p.currentTime(seconds);
      lastTime.current = seconds;
      callbacks.current.onTime?.(seconds);
    },
  }));

  return (
    <div>
      <div ref={holder} data-vjs-player className="overflow-hidden rounded-md border border-line bg-black" />
      {recoveryNote && <DecodeRecoveryMessage note={recoveryNote} onDismiss={() => setRecoveryNote(null)} />}
    </div>
  );
});
