// Sends one track file to the flight's track import (the flight page's drop zone and the uploader, when a
// .gpx or .csv file comes with the recordings). The size is checked here first, naming the file; the exact
// bytes travel as base64 inside JSON (the API takes JSON bodies only: lib/api/refuse-cross-site.ts).
import { MAX_TRACK_BYTES } from "@/lib/tracks/track-types";

export const isTrackFileName = (name: string) => /\.(gpx|csv)$/i.test(name.trim());

export type TrackSendResult = { ok: true; id: string; sha256: string; pointCount: number } | { ok: false; problems: string[] };

function toBase64(bytes: Uint8Array): string {
  let s = "";
  const CHUNK = 0x8000;
  for (let i = 0; i < bytes.length; i += CHUNK) s += String.fromCharCode(...bytes.subarray(i, i + CHUNK));
  return btoa(s);
}

export async function sendTrackFile(flightId: string, file: File): Promise<TrackSendResult> {
  if (file.size > MAX_TRACK_BYTES) {
    return { ok: false, problems: [`${file.name}: the file is ${(file.size / 1048576).toFixed(1)} MiB; a track may be at most ${(MAX_TRACK_BYTES / 1048576).toFixed(1)} MiB. Nothing was saved.`] };
  }
  try {
    const bytes = new Uint8Array(await file.arrayBuffer());
    const res = await fetch(`/api/flights/${flightId}/track?name=${encodeURIComponent(file.name)}`, {
      method: "POST",
      headers: { "content-type": "application/json" },
      body: JSON.stringify({ fileName: file.name, contentBase64: toBase64(bytes) }),
    });
    const body = await res.json().catch(() => null);
    if (res.ok) return { ok: true, id: body.id, sha256: body.sha256, pointCount: body.pointCount };
    const err = body?.error;
    return { ok: false, problems: err?.fields?.file ?? [err?.message ?? `${file.name}: the import failed (HTTP ${res.status}). Nothing was saved.`] };
  } catch {
    return { ok: false, problems: [`${file.name}: the connection failed before the server answered. Nothing was saved; try again.`] };
  }
}
