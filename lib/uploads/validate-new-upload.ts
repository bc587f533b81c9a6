// The checks made when an upload is created, before a byte is stored: the size is declared and
// not zero, the metadata is complete and its names are safe, and the job and flight belong to the
// member's organisation. Returns the metadata to keep, with the organisation and uploader added by
// the server. The quota comes next, as the upload is recorded (StagingStore's admit, upload-server.ts).
import "server-only";
import { and, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { flights } from "@/db/schema";
import type { Member } from "@/lib/auth/load-member";
import { parseClientMetadata, toTusMetadata } from "./upload-metadata";
import { UploadRefusal } from "./upload-refusal";

export async function validateNewUpload(
  member: Member,
  upload: { size?: number; metadata?: Record<string, string | null> },
): Promise<Record<string, string | null>> {
  const parsed = parseClientMetadata(upload.metadata);
  if (!parsed.ok) throw new UploadRefusal("unprocessable", parsed.message, parsed.fields);
  const meta = parsed.value;
  if (upload.size === undefined) {
    throw new UploadRefusal("bad_request", `“${meta.filename}”: send Upload-Length; Cairn needs the size before the upload starts to check the storage quota`);
  }
  if (upload.size === 0) throw new UploadRefusal("unprocessable", `“${meta.filename}” was not stored: it is empty (0 bytes)`);

  const [flight] = await db()
    .select({ jobId: flights.jobId })
    .from(flights)
    .where(and(eq(flights.id, meta.flightId), eq(flights.organisationId, member.organisationId)));
  if (!flight) throw new UploadRefusal("unprocessable", "Flight not found in your organisation", { flightId: ["Flight not found in your organisation"] });
  if (flight.jobId !== meta.jobId) throw new UploadRefusal("unprocessable", "That flight belongs to another job", { jobId: ["That flight belongs to another job"] });

  return toTusMetadata({ ...meta, organisationId: member.organisationId, userId: member.userId });
}
