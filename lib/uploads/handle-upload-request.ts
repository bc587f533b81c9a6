// Answers every request to /api/uploads[/<id>] with a web Request/Response pair: the Next route
// and the stand-alone test server both call this.
//   OPTIONS, POST, HEAD, PATCH, DELETE  the tus protocol (upload-server.ts), after our own checks:
//                                       a session and the upload permission first, then for PATCH
//                                       the Content-Type tus 1.0.0 requires (415 otherwise).
//   GET /api/uploads/<id>               the upload's outcome as JSON, never its bytes: originals are
//                                       served by /api/recordings/<id>/original with its checks.
import { TUS_RESUMABLE } from "@tus/server";
import { authorizeUploadRequest } from "./authorize-upload-request";
import { settleUpload } from "./settle-upload";
import { StagingStore } from "./staging-store";
import { UPLOAD_ROUTE_PATH } from "./upload-limits";
import { UploadRefusal } from "./upload-refusal";
import { uploadService } from "./upload-server";
import { ApiError } from "@/lib/api/errors";
import { assertSameOrigin, isStateChanging } from "@/lib/api/refuse-cross-site";
import { describeErrorForLog } from "@/lib/api/describe-error-for-log";
import { isServiceUnavailable, RETRY_AFTER_SECONDS } from "@/lib/api/service-unavailable";

export const UPLOAD_UNAVAILABLE_MESSAGE =
  "Cairn cannot reach its database right now. The bytes already received are kept: the upload continues from there once it is back.";

function sameOriginOrRefuse(req: Request): void {
  try {
    assertSameOrigin(req);
  } catch (err) {
    if (err instanceof ApiError) throw new UploadRefusal(err.code, err.message);
    throw err;
  }
}

const PATCH_CONTENT_TYPE = "application/offset+octet-stream";

function answer(status: number, body: unknown, tus: boolean): Response {
  const headers: Record<string, string> = { "Content-Type": "application/json", "Cache-Control": "no-store" };
  if (tus) headers["Tus-Resumable"] = TUS_RESUMABLE;
  return new Response(JSON.stringify(body), { status, headers });
}

/** 503 while the database is away: tus clients retry, and the upload continues where it stopped. */
export function unavailable(tus: boolean, err: unknown): Response {
  console.warn(`[uploads] service unavailable: ${describeErrorForLog(err)}`);
  const res = answer(503, { error: { code: "unavailable", message: UPLOAD_UNAVAILABLE_MESSAGE } }, tus);
  res.headers.set("Retry-After", String(RETRY_AFTER_SECONDS));
  return res;
}

function refusalResponse(err: UploadRefusal, tus: boolean): Response {
  return answer(err.status_code, JSON.parse(err.body), tus);
}

/** The upload id in /api/uploads/<id>, or null. */
function uploadIdOf(req: Request): string | null {
  const { pathname } = new URL(req.url);
  const rest = pathname.startsWith(UPLOAD_ROUTE_PATH + "/") ? pathname.slice(UPLOAD_ROUTE_PATH.length + 1).replace(/\/$/, "") : "";
  return rest && StagingStore.isUploadId(rest) ? rest : null;
}

async function outcomeOf(req: Request): Promise<Response> {
  const member = await authorizeUploadRequest(req);
  const id = uploadIdOf(req);
  if (!id) throw new UploadRefusal("not_found", "Upload not found");
  const { store } = uploadService();
  const info = await store.readInfo(id);
  if (!info || info.metadata?.cairnOrg !== member.organisationId) throw new UploadRefusal("not_found", "Upload not found");
  // settling here also finishes an upload whose commit was interrupted
  const outcome = await settleUpload(store, id, { req, role: member.role });
  return answer(200, outcome, false);
}

/**
 * @tus/server answers a few protocol errors before any hook runs (a missing Tus-Resumable, headers
 * that fail its validation) with plain text: give those our JSON error shape too.
 */
async function asJsonError(res: Response): Promise<Response> {
  if (res.status < 400 || res.headers.get("content-type")?.includes("json")) return res;
  const text = (await res.text()).trim();
  if (text.startsWith("{")) return new Response(text, { status: res.status, headers: withJson(res.headers) });
  let message = text || "The request was refused";
  const invalid = /^Invalid (.+)$/.exec(text);
  if (invalid) {
    const names = invalid[1].split(" ");
    message = names.includes("upload-metadata")
      ? "Upload-Metadata is malformed: it must be comma-separated pairs of a key and a Base64 value, each key once"
      : `Invalid header${names.length > 1 ? "s" : ""}: ${names.join(", ")}`;
  } else if (res.status === 412) {
    message = "Tus-Resumable: 1.0.0 header required";
  }
  const code = res.status === 404 ? "not_found" : "bad_request";
  return new Response(JSON.stringify({ error: { code, message } }), { status: res.status, headers: withJson(res.headers) });
}

function withJson(h: Headers): Headers {
  const out = new Headers(h);
  out.set("Content-Type", "application/json");
  out.delete("Content-Length");
  return out;
}

/**
 * A request refused before its body was read (a PATCH answered 401, 415 or 503 by our checks) still
 * has its bytes on the wire. Read and drop them after answering, as Node's own server does for a body
 * nobody consumed: otherwise the next request a client sends on the same kept-alive connection (tus
 * clients retry with HEAD at once) waits behind bytes nobody reads, forever.
 */
function discardUnreadBody(req: Request): void {
  if (!req.body || req.bodyUsed || req.body.locked) return;
  void req.body.pipeTo(new WritableStream()).catch(() => {});
}

export async function handleUploadRequest(req: Request): Promise<Response> {
  const method = req.method.toUpperCase();
  const tus = method !== "GET";
  try {
    if (method === "GET") return await outcomeOf(req);
    if (method !== "OPTIONS") {
      // tus keeps its own body type, but a page on another origin may not drive it either
      if (isStateChanging(method)) sameOriginOrRefuse(req);
      await authorizeUploadRequest(req);
      if (method === "PATCH") {
        const type = req.headers.get("content-type")?.trim().toLowerCase();
        if (type !== PATCH_CONTENT_TYPE) {
          throw new UploadRefusal("unsupported_media_type", `PATCH requests need Content-Type: ${PATCH_CONTENT_TYPE}`);
        }
      }
    }
    return await asJsonError(await uploadService().server.handleWeb(req));
  } catch (err) {
    discardUnreadBody(req);
    if (err instanceof UploadRefusal) return refusalResponse(err, tus);
    if (isServiceUnavailable(err)) return unavailable(tus, err);
    console.error(`[uploads] unexpected error: ${describeErrorForLog(err)}`);
    return answer(500, { error: { code: "internal", message: "Something went wrong on our side; retrying continues the upload from the bytes already received" } }, tus);
  }
}
