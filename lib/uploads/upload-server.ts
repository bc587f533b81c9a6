// The tus 1.0.0 server behind /api/uploads (creation, termination and expiration extensions). Several
// web processes may share one staging folder (UPLOAD_DIR on a shared file system): the lock of each
// upload is a PostgreSQL lock that every process sees (lib/uploads/shared-upload-locks.ts) and the quota
// is reserved in the database (lib/uploads/upload-reservations.ts), so an upload started through one instance can be finished
// through another, and the running hash is then recomputed once from the staged file.
// The Next route and the stand-alone test server both use this module, so tests exercise exactly
// the hooks production runs.
//
// Hooks:
//   maxSize / onIncomingRequest  every request: a signed-in member who may upload; for an existing
//                                upload, the member's organisation must be the one that created it
//                                (others get 404). A complete upload that was never committed is
//                                committed before the request is answered.
//   onUploadCreate               metadata, names, job and flight of the organisation, size.
//   store.create (admit)         the storage quota, checked and the bytes reserved in one database
//                                transaction (lib/uploads/check-upload-quota.ts).
//   onUploadFinish               the commit (settle-upload.ts); its outcome rides on the response.
import "server-only";
import { Server } from "@tus/server";
import { env } from "@/lib/config/env";
import { authorizeUploadRequest } from "./authorize-upload-request";
import { reserveWithinQuota } from "./check-upload-quota";
import { explainTusError } from "./explain-tus-error";
import { readFileHead } from "./read-file-head";
import { refusalMessage, sniffContent } from "./sniff-content";
import { settleUpload } from "./settle-upload";
import { SharedUploadLocker } from "./shared-upload-locks";
import { releaseReservation } from "./upload-reservations";
import { StagingStore } from "./staging-store";
import { settledMark } from "./upload-metadata";
import { SNIFF_BYTES, UPLOAD_ROUTE_PATH } from "./upload-limits";
import { outcomeHeaders } from "./upload-outcome";
import { UploadRefusal } from "./upload-refusal";
import { validateNewUpload } from "./validate-new-upload";

export type UploadService = { server: Server; store: StagingStore };

const g = globalThis as unknown as { __cairnUploads?: UploadService };

// Uploads whose head already passed the content check in this process (bounded; forgetting one only costs a re-read).
const headChecked = new Set<string>();
const HEAD_CHECKED_LIMIT = 10_000;

export function uploadService(): UploadService {
  if (!g.__cairnUploads) g.__cairnUploads = createUploadService(env().uploadDir);
  return g.__cairnUploads;
}

export function createUploadService(directory: string): UploadService {
  // the quota is checked as the upload is recorded, one organisation's uploads at a time
  const store: StagingStore = new StagingStore(directory, {
    // the quota is checked and the upload's bytes reserved in one database transaction
    admit: (file) =>
      reserveWithinQuota({ organisationId: String(file.metadata?.cairnOrg), uploadId: file.id, bytes: file.size ?? 0, fileName: file.metadata?.filename ?? file.id }),
    release: (id) => releaseReservation(id),
  });
  const maxBytes = () => env().UPLOAD_MAX_BYTES;
  const server = new Server({
    path: UPLOAD_ROUTE_PATH,
    datastore: store,
    locker: new SharedUploadLocker(),
    // a relative Location stays right behind a proxy that terminates TLS
    relativeLocation: true,
    allowedOrigins: [new URL(env().APP_URL).origin],
    disableTerminationForFinishedUploads: true,
    // runs before onIncomingRequest on creation: authorize first, so a stranger learns nothing, not even the limit
    maxSize: async (req) => {
      if (req.method !== "OPTIONS") await authorizeUploadRequest(req);
      return maxBytes();
    },
    onIncomingRequest: async (req, uploadId) => {
      const member = await authorizeUploadRequest(req);
      if (req.method === "POST") return;
      const info = await store.readInfo(uploadId);
      if (!info) return; // tus answers 404
      if (info.metadata?.cairnOrg !== member.organisationId) throw new UploadRefusal("not_found", "Upload not found");
      const mark = settledMark(info.metadata);
      if (mark?.done === "refused") {
        if (req.method === "DELETE") return;
        throw new UploadRefusal("unprocessable", mark.reason ?? "The file was refused");
      }
      if (mark) return; // stored or linked: HEAD answers the full offset, a final empty PATCH repeats the outcome
      const staged = await store.stagedSize(uploadId);
      const complete = info.size !== undefined && (staged === null || staged >= info.size);
      if (complete && req.method !== "DELETE") {
        // finished earlier but never committed (server died, response lost): commit before answering
        const outcome = await settleUpload(store, uploadId, { req, role: member.role });
        if (outcome.state === "storing") throw new UploadRefusal("locked", `“${outcome.fileName}” is being stored; try again in a moment`);
        if (outcome.state === "refused") throw new UploadRefusal("unprocessable", outcome.reason);
        return;
      }
      // Refuse a wrong file after its first chunk instead of after its last gigabyte.
      if (req.method === "PATCH" && staged !== null && info.size !== undefined && staged >= Math.min(SNIFF_BYTES, info.size) && !headChecked.has(uploadId)) {
        const sniff = sniffContent(await readFileHead(store.dataPath(uploadId), SNIFF_BYTES), staged >= info.size);
        if (!sniff.ok) {
          const reason = refusalMessage(info.metadata.filename ?? uploadId, sniff.reason);
          await store.removeData(uploadId);
          await store.markSettled(uploadId, { done: "refused", reason });
          throw new UploadRefusal("unprocessable", reason);
        }
        if (headChecked.size >= HEAD_CHECKED_LIMIT) headChecked.clear();
        headChecked.add(uploadId);
      }
    },
    onUploadCreate: async (req, upload) => {
      const member = await authorizeUploadRequest(req);
      return { metadata: await validateNewUpload(member, upload) };
    },
    onUploadFinish: async (req, upload) => {
      headChecked.delete(upload.id);
      const member = await authorizeUploadRequest(req); // the check made for this request, kept
      const outcome = await settleUpload(store, upload.id, { req, role: member.role });
      if (outcome.state === "refused") throw new UploadRefusal("unprocessable", outcome.reason);
      return { status_code: 204, headers: outcomeHeaders(outcome) };
    },
    onResponseError: (_req, err) => explainTusError(err, maxBytes()),
  });
  return { server, store };
}
