// Shared by the ingest tests: tus-js-client (an independent tus implementation) driving our endpoint
// over real HTTP, raw protocol requests, and looks into the staging folder and the store.
import { createReadStream } from "node:fs";
import { open, readdir, stat } from "node:fs/promises";
import http from "node:http";
import path from "node:path";
import * as tus from "tus-js-client";
import { and, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { recordings } from "@/db/schema";
import { env } from "@/lib/config/env";
import { sessionCookie, type Actor } from "@/tests/support/session";

export type Target = { jobId: string; flightId: string };

export function metadataFor(target: Target, filename: string, extra: Record<string, string> = {}): Record<string, string> {
  return { jobId: target.jobId, flightId: target.flightId, filename, filetype: "", relativePath: "null", ...extra };
}

export async function cookieOf(actor: Actor): Promise<Record<string, string>> {
  return actor ? { cookie: await sessionCookie(actor) } : {};
}

export type TusRun = { url: string; headers: Record<string, string>; progress: number[] };

/**
 * Uploads a file (path) or a buffer with tus-js-client. `abortAfterBytes` aborts the upload once
 * tus-js-client reports that many bytes sent and resolves with what happened so far.
 */
export function tusUpload(opts: {
  endpoint: string;
  source: string | Buffer;
  metadata: Record<string, string>;
  headers: Record<string, string>;
  chunkSize?: number;
  uploadUrl?: string;
  retryDelays?: number[];
  abortAfterBytes?: number;
}): Promise<TusRun> {
  return new Promise((resolve, reject) => {
    const progress: number[] = [];
    let aborted = false;
    const input = typeof opts.source === "string" ? createReadStream(opts.source) : opts.source;
    const upload: tus.Upload = new tus.Upload(input as unknown as Buffer, {
      endpoint: `${opts.endpoint}/api/uploads`,
      uploadUrl: opts.uploadUrl ?? null,
      chunkSize: opts.chunkSize ?? 4 * 1024 * 1024,
      metadata: opts.metadata,
      headers: opts.headers,
      retryDelays: opts.retryDelays ?? [],
      storeFingerprintForResuming: false,
      onProgress: (sent) => {
        progress.push(sent);
        if (opts.abortAfterBytes !== undefined && !aborted && sent >= opts.abortAfterBytes) {
          aborted = true;
          void upload.abort().then(() => resolve({ url: upload.url!, headers: {}, progress }));
        }
      },
      onSuccess: ({ lastResponse }) => {
        const headers: Record<string, string> = {};
        for (const h of ["Cairn-Upload-Outcome", "Cairn-Recording-Id", "Cairn-Original-SHA256", "Cairn-Duplicate-Of", "Upload-Offset"]) {
          const v = lastResponse.getHeader(h);
          if (v) headers[h] = v;
        }
        resolve({ url: upload.url!, headers, progress });
      },
      onError: (err) => reject(err),
    });
    upload.start();
  });
}

/** A raw request to the endpoint with the tus version header. */
export async function tusRequest(
  base: string,
  method: string,
  urlPath: string,
  opts: { headers?: Record<string, string>; body?: Uint8Array | string; tus?: boolean } = {},
): Promise<Response> {
  const headers: Record<string, string> = { ...(opts.tus === false ? {} : { "Tus-Resumable": "1.0.0" }), ...opts.headers };
  return fetch(`${base}${urlPath}`, { method, headers, body: opts.body as BodyInit | undefined });
}

/** tus Upload-Metadata header value: key base64(value), comma-separated. */
export function encodeMetadata(m: Record<string, string>): string {
  return Object.entries(m)
    .map(([k, v]) => `${k} ${Buffer.from(v, "utf8").toString("base64")}`)
    .join(",");
}

export const uploadIdOf = (url: string) => url.split("/").pop()!;

/** Every file under a folder, relative paths. */
export async function listFiles(dir: string): Promise<string[]> {
  const out: string[] = [];
  async function walk(d: string) {
    let entries;
    try {
      entries = await readdir(d, { withFileTypes: true });
    } catch {
      return;
    }
    for (const e of entries) {
      const p = path.join(d, e.name);
      if (e.isDirectory()) await walk(p);
      else out.push(path.relative(dir, p));
    }
  }
  await walk(dir);
  return out.sort();
}

export const storeFiles = () => listFiles(env().storageDir);
export const stagingFiles = () => listFiles(env().uploadDir);
export const stagedDataSize = (uploadId: string) => stat(path.join(env().uploadDir, uploadId)).then((s) => s.size, () => null);

export async function recordingsOf(flightId: string) {
  return db().select().from(recordings).where(and(eq(recordings.flightId, flightId)));
}

/**
 * A link that drops in the middle of a PATCH: sends one PATCH announcing `announced` bytes at
 * offset 0, writes `sent` bytes of `source`, waits until the server has staged all but the last
 * 2 MiB of them, then destroys the socket. Resolves with the offset HEAD reports once it has stopped
 * moving (the server settles what arrived after the drop).
 */
export async function dropMidPatch(opts: { base: string; location: string; source: Buffer; announced: number; sent: number; headers: Record<string, string> }): Promise<number> {
  const { base, location, source, sent, headers } = opts;
  const uploadId = uploadIdOf(location);
  const { hostname, port } = new URL(base);
  const req = http.request({
    host: hostname,
    port,
    method: "PATCH",
    path: location,
    headers: { ...headers, "Tus-Resumable": "1.0.0", "Upload-Offset": "0", "Content-Type": "application/offset+octet-stream", "Content-Length": String(opts.announced) },
  });
  req.on("error", () => {}); // the socket is destroyed on purpose
  await new Promise<void>((resolve) => req.write(source.subarray(0, sent), () => resolve()));
  for (let i = 0; i < 200 && ((await stagedDataSize(uploadId)) ?? 0) < sent - 2 * 1024 * 1024; i++) await new Promise((r) => setTimeout(r, 25));
  req.destroy();

  let offset = -1;
  for (let i = 0; i < 100; i++) {
    const res = await tusRequest(base, "HEAD", location, { headers });
    const now = Number(res.headers.get("upload-offset"));
    if (now === offset) break;
    offset = now;
    await new Promise((r) => setTimeout(r, 50));
  }
  return offset;
}

/** The first `bytes` bytes of an upload's staged data. */
export async function stagedPrefix(uploadId: string, bytes: number): Promise<Buffer> {
  const fh = await open(path.join(env().uploadDir, uploadId), "r");
  try {
    const out = Buffer.alloc(bytes);
    await fh.read(out, 0, bytes, 0);
    return out;
  } finally {
    await fh.close();
  }
}
