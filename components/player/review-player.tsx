"use client";
// The review room's player: video.js 8, created in an effect and disposed on cleanup (StrictMode
// mounts twice in development; video.js must not be initialised twice on one element), reporting
// the frame on screen exactly (requestVideoFrameCallback's media time where the browser has it),
// with scrub-thumbnail previews, an overlay area matching the picture, and playback analytics sent
// to the app's own collector through videojs-mux.
import { forwardRef, useEffect, useImperativeHandle, useRef, useState } from "react";
import videojs from "video.js";
import "video.js/dist/video-js.css";
import type { FrameRate } from "@/lib/timecode/frame-rate";
import { attachPlaybackAnalytics } from "./attach-playback-analytics";
import { frameOnScreen, seekTimeForFrame } from "./frame-seek";
import { ThumbnailPreview } from "./thumbnail-preview";
import { attachDecodeRecovery, type DecodeRecoveryNote } from "./attach-decode-recovery";
import { DecodeRecoveryMessage } from "./decode-recovery-message";
import { PLAYBACK_RATES } from "./review-shortcuts";

export type Player = ReturnType<typeof videojs>;
export type PictureRect = { left: number; top: number; width: number; height: number };

export type ReviewPlayerHandle = {
  seekToFrame(frame: number): void;
  stepFrames(delta: number): void;
  seekBySeconds(delta: number): void;
  togglePlay(): void;
  pause(): void;
  changeRate(direction: 1 | -1): void;
  setRate(rate: number): void;
  frame(): number;
};

type Props = {
  src: string;
  poster: string | null;
  thumbnailsUrl: string | null;
  rate: FrameRate;
  frameCount: number;
  durationSec: number;
  title: string;
  analytics: { recordingId: string; viewerUserId: string } | null;
  startFrame?: number;
  onFrame(frame: number): void;
  onPlaying?(playing: boolean): void;
  onRate?(rate: number): void;
  renderOverlay?: (rect: PictureRect) => React.ReactNode;
};

type FrameCallbackVideo = HTMLVideoElement & {
  requestVideoFrameCallback?: (cb: (now: number, meta: { mediaTime: number }) => void) => number;
  cancelVideoFrameCallback?: (id: number) => void;
};

export const ReviewPlayer = forwardRef<ReviewPlayerHandle, Props>(function ReviewPlayer(props, ref) {
  const { src, poster, thumbnailsUrl, rate, frameCount, durationSec, title, analytics, startFrame } = props;
  const wrapper = useRef<HTMLDivElement>(null);
  const holder = useRef<HTMLDivElement>(null);
  const playerRef = useRef<Player | null>(null);
  const [player, setPlayer] = useState<Player | null>(null);
  const [rect, setRect] = useState<PictureRect | null>(null);
  const [recoveryNote, setRecoveryNote] = useState<DecodeRecoveryNote | null>(null);
  const frameRef = useRef(startFrame ?? 0);
  const callbacks = useRef(props);
  callbacks.current = props;

  useEffect(() => {
    const el = document.createElement("video-js");
    el.setAttribute("data-testid", "review-video");
    el.setAttribute("aria-label", `Recording ${title}`);
    holder.current!.appendChild(el);
    const p = videojs(el, {
      controls: true,
      fluid: true,
      preload: "auto",
      playsinline: true,
      playbackRates: PLAYBACK_RATES,
      poster: poster ?? undefined,
      sources: [{ src, type: "video/mp4" }],
      // our own shortcuts handle the keyboard (video.js would also take arrows and space)
      userActions: { hotkeys: false },
      // the readout under the player gives time and length on the recorder's clock; video.js's own
      // displays (whole seconds, remaining time as "-0:10") would be a second, rounder account of it
      controlBar: { pictureInPictureToggle: false, currentTimeDisplay: false, timeDivider: false, durationDisplay: false, remainingTimeDisplay: false },
      // a reviewer works paused most of the time: the controls never fade out
      inactivityTimeout: 0,
    });
    playerRef.current = p;
    let disposed = false;
    let frameCallback: number | null = null;

    const report = (seconds: number) => {
      const f = frameOnScreen(seconds, rate, frameCount);
      if (f !== frameRef.current) {
        frameRef.current = f;
        callbacks.current.onFrame(f);
      }
    };
    const video = () => p.tech(true)?.el() as FrameCallbackVideo | undefined;
    const watchFrames = () => {
      const v = video();
      if (!v?.requestVideoFrameCallback || disposed) return;
      const tick = (_now: number, meta: { mediaTime: number }) => {
        if (disposed) return;
        // while playing, the painted frame's own media time is exact; while paused, frames painted
        // late for an older seek must not overwrite the newer target, so currentTime decides
        if (!v.seeking && !v.paused) report(meta.mediaTime);
        frameCallback = v.requestVideoFrameCallback!(tick);
      };
      frameCallback = v.requestVideoFrameCallback(tick);
    };
    p.on("timeupdate", () => {
      if (!p.seeking()) report(p.currentTime() ?? 0);
    });
    p.on("seeked", () => report(p.currentTime() ?? 0));
    p.on("play", () => callbacks.current.onPlaying?.(true));
    p.on("pause", () => {
      report(p.currentTime() ?? 0);
      callbacks.current.onPlaying?.(false);
    });
    p.on("ratechange", () => callbacks.current.onRate?.(p.playbackRate() ?? 1));
    p.one("loadedmetadata", () => {
      // video.js keeps the poster over the picture and hides the controls until playback starts;
      // a reviewer who only steps frames must see each frame, so the player counts as started
      p.hasStarted(true);
      if (startFrame) p.currentTime(seekTimeForFrame(startFrame, rate, frameCount));
      watchFrames();
      measure();
    });

    // the picture's box inside the player (letterboxed when the aspect ratios differ)
    const measure = () => {
      const box = wrapper.current?.getBoundingClientRect();
      const v = video();
      if (!box || !v) return;
      const vw = v.videoWidth || 16;
      const vh = v.videoHeight || 9;
      const pe = p.el().getBoundingClientRect();
      const scale = Math.min(pe.width / vw, pe.height / vh);
      const width = vw * scale;
      const height = vh * scale;
      setRect({ left: pe.left - box.left + (pe.width - width) / 2, top: pe.top - box.top + (pe.height - height) / 2, width, height });
    };
    const ro = new ResizeObserver(measure);
    ro.observe(p.el());

    attachDecodeRecovery(p, {
      currentSrc: () => src,
      frameSec: rate.den / rate.num,
      onNote: setRecoveryNote,
      onResumed: (sec) => report(sec),
    });
    if (analytics) {
      attachPlaybackAnalytics(p, { recordingId: analytics.recordingId, title, playerName: "Cairn review room", viewerUserId: analytics.viewerUserId }, () => !disposed);
    }
    setPlayer(p);
    return () => {
      disposed = true;
      ro.disconnect();
      const v = video();
      if (frameCallback !== null) v?.cancelVideoFrameCallback?.(frameCallback);
      p.dispose();
      playerRef.current = null;
      setPlayer(null);
    };
    // one player per mount and source; the other props are read through refs
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [src]);

  useImperativeHandle(ref, () => ({
    seekToFrame(frame) {
      const p = playerRef.current;
      if (!p) return;
      p.currentTime(seekTimeForFrame(frame, rate, frameCount));
    },
    stepFrames(delta) {
      const p = playerRef.current;
      if (!p) return;
      p.pause();
      const target = Math.min(Math.max(0, frameRef.current + delta), frameCount - 1);
      p.currentTime(seekTimeForFrame(target, rate, frameCount));
      // report at once: the readout must not wait for the seek to finish to show the new frame
      frameRef.current = target;
      callbacks.current.onFrame(target);
    },
    seekBySeconds(delta) {
      const p = playerRef.current;
      if (!p) return;
      const t = Math.min(Math.max(0, (p.currentTime() ?? 0) + delta), durationSec);
      const f = frameOnScreen(t, rate, frameCount);
      p.currentTime(seekTimeForFrame(f, rate, frameCount));
    },
    togglePlay() {
      const p = playerRef.current;
      if (!p) return;
      if (p.paused()) void p.play();
      else p.pause();
    },
    pause() {
      playerRef.current?.pause();
    },
    changeRate(direction) {
      const p = playerRef.current;
      if (!p) return;
      const current = p.playbackRate() ?? 1;
      const i = PLAYBACK_RATES.findIndex((r) => r >= current - 1e-9);
      const next = PLAYBACK_RATES[Math.min(Math.max(0, (i < 0 ? PLAYBACK_RATES.length - 1 : i) + direction), PLAYBACK_RATES.length - 1)];
      p.playbackRate(next);
    },
    setRate(r) {
      playerRef.current?.playbackRate(r);
    },
    frame: () => frameRef.current,
  }));

  return (
    <div ref={wrapper} className="relative">
      <div ref={holder} data-vjs-player className="overflow-hidden rounded-md border border-line bg-black" />
      {rect && props.renderOverlay && (
        <div className="pointer-events-none absolute" style={{ left: rect.left, top: rect.top, width: rect.width, height: rect.height }}>
          {props.renderOverlay(rect)}
        </div>
      )}
      {recoveryNote && <DecodeRecoveryMessage note={recoveryNote} onDismiss={() => setRecoveryNote(null)} />}
      {player && thumbnailsUrl && <ThumbnailPreview player={player} trackUrl={thumbnailsUrl} durationSec={durationSec} container={wrapper} />}
    </div>
  );
});
