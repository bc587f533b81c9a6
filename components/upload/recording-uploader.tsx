"use client";
// The uploader: Uppy's Dashboard over our tus endpoint. Whole folders can be dropped or chosen;
// each file goes in bounded chunks with retries, can be paused, resumed and retried, and after a
// page reload re-adding the same file continues where it stopped (tus fingerprints in
// localStorage). When a file completes, the server's outcome (stored with its hash, same bytes as
// an existing recording, or refused with the reason) is fetched and reported to the page.
// A refused file is taken off the widget (with a note in its message area) so the widget never
// offers "Retry" for a file the server will refuse again: the widget and the outcome list agree.
// Sizes: Uppy prints its own binary "KB"; Cairn writes decimal units everywhere (lib/uploads/format-bytes.ts),
// so the widget's per-file sizes and byte counts are hidden and the outcome list shows the size.
import Uppy, { type UppyFile } from "@uppy/core";
import Tus from "@uppy/tus";
import Dashboard from "@uppy/react/dashboard";
import { useEffect, useRef, useState } from "react";
import { CLIENT_METADATA_KEYS } from "@/lib/uploads/upload-metadata";
import { UPLOAD_CHUNK_BYTES, UPLOAD_RETRY_DELAYS_MS, UPLOAD_ROUTE_PATH } from "@/lib/uploads/upload-limits";
import type { UploadOutcome } from "@/lib/uploads/upload-outcome";
import { formatBytes } from "@/lib/uploads/format-bytes";
import { classifyUploadFailure } from "./upload-failure";
import { isTrackFileName, sendTrackFile } from "@/components/tracks/send-track-file";
import "./uppy-styles.css";

type Meta = {
  jobId?: string;
  flightId?: string;
  filename?: string;
  filetype?: string;
  relativePath?: string;
  lastModified?: string;
};
type Body = Record<string, never>;

export type FileReport = {
  fileId: string;
  name: string;
  relativePath: string | null;
  /** the file's size in bytes, when known */
  size?: number;
  /** every byte arrived; the server's outcome may still be on its way */
  received?: boolean;
  /** the server's outcome once known */
  outcome?: UploadOutcome;
  /** why the upload stopped, when it did not complete and retrying may help */
  error?: string;
  /** why the server refused the file, when it did: sending it again gets the same answer */
  refused?: string;
  /** a .gpx or .csv file dropped with the recordings, imported as the flight's track (components/tracks) */
  track?: { sha256: string; pointCount: number };
};

const STORING_POLL_MS = 2_000;
const STORING_POLLS = 90; // 3 min: a commit that has to re-hash a very large file from disk

async function fetchOutcome(uploadURL: string): Promise<UploadOutcome> {
  for (let i = 0; ; i++) {
    const res = await fetch(uploadURL, { headers: { Accept: "application/json" } });
    const body = await res.json().catch(() => null);
    if (!res.ok) throw new Error(body?.error?.message ?? `The server could not report on this file (${res.status})`);
    const outcome = body as UploadOutcome;
    if (outcome.state !== "storing" || i >= STORING_POLLS) return outcome;
    await new Promise((r) => setTimeout(r, STORING_POLL_MS));
  }
}

/** The server's message from a failed tus request (our JSON error body), if there is one. */
function serverMessageOf(response?: { status?: number; body?: { xhr?: XMLHttpRequest } }): string | null {
  const text = response?.body?.xhr?.responseText;
  if (!text) return null;
  try {
    const message = JSON.parse(text)?.error?.message;
    return typeof message === "string" ? message : null;
  } catch {
    return null; // not our JSON
  }
}

function fallbackReason(error: Error, response?: { status?: number }): string {
  if (!response?.status) return "The connection dropped. Press retry, or add the same file again later: it continues where it stopped.";
  return error.message;
}

export function RecordingUploader({ jobId, flightId, maxFileBytes, onReport }: { jobId: string; flightId: string; maxFileBytes: number; onReport: (r: FileReport) => void }) {
  const report = useRef(onReport);
  useEffect(() => {
    report.current = onReport;
  }, [onReport]);
  const [uppy] = useState(() =>
    new Uppy<Meta, Body>({
      id: "cairn-recordings",
      autoProceed: true,
      restrictions: { maxFileSize: maxFileBytes },
      // Uppy's own refusal of an oversize file, with the limit in Cairn's decimal units
      locale: { strings: { exceedsSize: `%{file} is larger than the ${formatBytes(maxFileBytes)} limit for one upload` } } as never,
      onBeforeFileAdded: (file, files) => {
        if (Object.hasOwn(files, file.id)) return false; // Uppy's default: the same file once
        const data = file.data as File;
        // names and folder paths travel as metadata; the server checks them and never uses them as paths
        file.meta = {
          ...file.meta,
          filename: file.name ?? data.name,
          filetype: file.type ?? "",
          relativePath: (file.meta.relativePath as string | null | undefined) || data.webkitRelativePath || undefined,
          lastModified: typeof data.lastModified === "number" ? String(data.lastModified) : "",
        };
        return file;
      },
    }).use(Tus, {
      endpoint: UPLOAD_ROUTE_PATH,
      chunkSize: UPLOAD_CHUNK_BYTES,
      retryDelays: UPLOAD_RETRY_DELAYS_MS,
      limit: 3,
      allowedMetaFields: [...CLIENT_METADATA_KEYS],
      // keep the fingerprint: re-adding a finished file then reports its outcome instead of uploading again
      removeFingerprintOnSuccess: false,
    }),
  );

  useEffect(() => {
    uppy.setMeta({ jobId, flightId });
  }, [uppy, jobId, flightId]);

  useEffect(() => {
    const base = (file: UppyFile<Meta, Body>) => ({
      fileId: file.id,
      name: file.name ?? "file",
      relativePath: (file.meta.relativePath as string | null) ?? null,
      size: typeof file.size === "number" ? file.size : undefined,
    });
    // Uppy keeps a widget-wide error ("Upload failed") after the failed file is gone, and sets it again
    // when the batch ends: cleared whenever no file left in the widget has an error
    const clearStaleError = () =>
      setTimeout(() => {
        if (uppy.getState().error && !uppy.getFiles().some((f) => f.error)) uppy.setState({ error: null });
      });
    // off the widget, with a word in its message area: the file cannot be accepted, so no "Retry"
    const takeOff = (file: UppyFile<Meta, Body>, reason: string) => {
      setTimeout(() => {
        if (uppy.getFile(file.id)) uppy.removeFile(file.id);
        uppy.info(`Refused: ${reason}`, "error", 8_000);
        clearStaleError();
      });
    };
    const onSuccess = (file: UppyFile<Meta, Body> | undefined, response: { uploadURL?: string }) => {
      if (!file || !response.uploadURL) return;
      report.current({ ...base(file), received: true });
      fetchOutcome(response.uploadURL).then(
        (outcome) => {
          if (outcome.state === "refused") {
            report.current({ ...base(file), outcome, refused: outcome.reason });
            takeOff(file, outcome.reason);
          } else report.current({ ...base(file), outcome });
        },
        (err: Error) => report.current({ ...base(file), error: err.message }),
      );
    };
    const onError = (file: UppyFile<Meta, Body> | undefined, error: Error, response?: { status?: number; body?: { xhr?: XMLHttpRequest } }) => {
      if (!file) return;
      const failure = classifyUploadFailure(response?.status, serverMessageOf(response), fallbackReason(error, response));
      if (failure.kind === "refused") {
        report.current({ ...base(file), refused: failure.reason });
        takeOff(file, failure.reason);
      } else report.current({ ...base(file), error: failure.reason });
    };
    const onAdded = (file: UppyFile<Meta, Body> | undefined) => {
      if (!file) return;
      // a track file dropped with the recordings goes to the flight's track import (components/tracks), not to tus:
      // taken off the widget before the upload starts (autoProceed waits a tick), reported in the list below
      if (isTrackFileName(file.name ?? "") && typeof file.meta.flightId === "string" && file.data instanceof File) {
        const flight = file.meta.flightId;
        const data = file.data;
        uppy.removeFile(file.id);
        const one = { ...base(file), relativePath: null };
        report.current(one);
        void sendTrackFile(flight, data).then((r) => report.current(r.ok ? { ...one, track: { sha256: r.sha256, pointCount: r.pointCount } } : { ...one, refused: r.problems.join(" ") }));
        return;
      }
      report.current({ ...base(file) });
    };
    const onRetryAll = () => uppy.getFiles().forEach((f) => f.error && report.current({ ...base(f) }));
    uppy.on("upload-success", onSuccess);
    uppy.on("upload-error", onError as never);
    uppy.on("file-added", onAdded);
    uppy.on("upload-retry", onAdded as never);
    uppy.on("retry-all", onRetryAll as never);
    uppy.on("complete", clearStaleError);
    uppy.on("error", clearStaleError);
    return () => {
      uppy.off("complete", clearStaleError);
      uppy.off("error", clearStaleError);
      uppy.off("upload-success", onSuccess);
      uppy.off("upload-error", onError as never);
      uppy.off("file-added", onAdded);
      uppy.off("upload-retry", onAdded as never);
      uppy.off("retry-all", onRetryAll as never);
    };
  }, [uppy]);

  // Leaving the page stops the uploads (they continue when the same files are added again); the
  // browser asks first while any is running. Not destroy(): StrictMode's trial unmount would kill the instance.
  useEffect(() => {
    const warn = (e: BeforeUnloadEvent) => {
      if (uppy.getFiles().some((f) => f.progress.uploadStarted && !f.progress.uploadComplete && !f.error)) e.preventDefault();
    };
    window.addEventListener("beforeunload", warn);
    return () => {
      window.removeEventListener("beforeunload", warn);
      uppy.pauseAll(); // pause, never cancel: cancelling would delete the partial upload on the server
    };
  }, [uppy]);

  return (
    <Dashboard
      uppy={uppy}
      width="100%"
      height={420}
      fileManagerSelectionType="both"
      proudlyDisplayPoweredByUppy={false}
      hideProgressDetails
      hideUploadButton
      showRemoveButtonAfterComplete={false}
      note={`Raw H.264 (.264, .h264, .avc or no extension), MP4, MOV and JPEG, up to ${formatBytes(maxFileBytes)} each. Drop the whole SD-card folder; files are checked by their bytes on arrival.`}
    />
  );
}
