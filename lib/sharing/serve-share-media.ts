// Serves one file behind a share link from its signed address. Every request, each Range request
// included, re-checks the whole chain: the signature and its expiry, the link's revocation and
// expiry, and that the file is still inside the link's scope. A download (the report or an
// original fetched from its first byte) is recorded; partial re-fetches and playback are not.
import "server-only";
import { Readable } from "node:stream";
import { env } from "@/lib/config/env";
import { parseRange } from "@/lib/http/parse-range";
import { buildRangeResponseHeaders } from "@/lib/http/build-range-response-headers";
import { contentLengthHeaders } from "@/lib/http/content-length-carrier";
import { buildContentDisposition } from "@/lib/http/build-content-disposition";
import { readKey, readStoredBytes, statKey } from "@/lib/storage/store";
import { requestFacts } from "@/lib/custody/record-custody-event";
import { countsAsDownload } from "@/lib/custody/counts-as-download";
import { DOWNLOAD_KINDS, verifyMediaGrant } from "./media-grant";
import { resolveShareLinkById } from "./resolve-share-link";
import { resolveScopedFile } from "./resolve-scoped-file";
import { recordShareDownload } from "./record-share-access";
import { SHARE_RESPONSE_HEADERS } from "./share-response-headers";
import { signedShareMediaPath } from "./share-media-url";
import { rewriteThumbnailTrack } from "./rewrite-thumbnail-track";

function refuse(status: 404 | 410 | 416, message: string, extra: Record<string, string> = {}): Response {
  const code = status === 404 ? "not_found" : status === 410 ? "gone" : "range_not_satisfiable";
  return Response.json({ error: { code, message } }, { status, headers: { ...SHARE_RESPONSE_HEADERS, ...extra } });
}

async function readAll(key: string): Promise<string> {
  return (await readStoredBytes(key)).toString("utf8");
}

export async function serveShareMedia(req: Request, grantValue: string): Promise<Response> {
  const now = Date.now();
  const check = verifyMediaGrant(grantValue, env().MEDIA_SIGNING_KEY, now);
  if (!check.ok) {
    return check.reason === "expired" ? refuse(410, "This media address has expired. Reload the shared page for a fresh one.") : refuse(404, "Not found");
  }
  const { grant } = check;
  const resolved = await resolveShareLinkById(grant.linkId, new Date(now));
  if (resolved.kind === "unknown") return refuse(404, "Not found");
  if (resolved.kind === "gone") return refuse(410, resolved.reason === "revoked" ? "This share link has been revoked." : "This share link has expired.");
  const link = resolved.link;
  const file = await resolveScopedFile(link, grant.kind, grant.resourceId);
  if (!file) return refuse(404, "Not found");
  const stat = await statKey(file.storageKey);
  if (!stat) return refuse(404, "Not found");

  const head = req.method === "HEAD";
  const disposition: Record<string, string> = file.downloadName ? { "Content-Disposition": buildContentDisposition(file.downloadName, "attachment") } : {};

  if (grant.kind === "thumbnails") {
    // small text rewritten per request: served whole (RFC 9110 14.2 lets a server ignore Range)
    const sprite = signedShareMediaPath(link.id, "sprite", grant.resourceId, now);
    const body = rewriteThumbnailTrack(await readAll(file.storageKey), sprite);
    return new Response(head ? null : body, {
      status: 200,
      headers: { ...SHARE_RESPONSE_HEADERS, "Content-Type": "text/vtt; charset=utf-8", ...contentLengthHeaders(Buffer.byteLength(body)) },
    });
  }

  const range = head ? ({ kind: "full" } as const) : parseRange(req.headers.get("range"), stat.size);
  const rangeHead = buildRangeResponseHeaders(range, stat.size);
  const headers: Record<string, string> = { ...SHARE_RESPONSE_HEADERS, ...rangeHead.headers, "Content-Type": file.contentType, ...disposition };
  if (range.kind === "unsatisfiable") return new Response(null, { status: 416, headers });

  if (DOWNLOAD_KINDS.has(grant.kind) && countsAsDownload(req.method, rangeHead.status, rangeHead.headers["Content-Range"])) {
    await recordShareDownload(link, file, requestFacts(req));
  }
  if (head || stat.size === 0) return new Response(null, { status: rangeHead.status, headers });
  const nodeStream = readKey(file.storageKey, range.kind === "partial" ? { start: range.start, end: range.end } : undefined);
  // a player that seeks aborts the request: the web stream's cancel destroys the file stream quietly
  nodeStream.on("error", () => {});
  return new Response(Readable.toWeb(nodeStream) as ReadableStream<Uint8Array>, { status: rangeHead.status, headers });
}
