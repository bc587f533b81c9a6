// The tus Upload-Metadata of a Cairn upload: what the uploader sends (where the file goes, its name,
// folder path and modified time) and what the server adds at creation (who uploaded it, for which
// organisation). Server fields are written only by the server: the client's copy of them is dropped.
import { z } from "zod";
import { fileNameProblem, normaliseRelativePath } from "./check-file-name";
import { textRule } from "@/lib/validation/common";

/** Metadata keys the uploader sends. */
export const CLIENT_METADATA_KEYS = ["jobId", "flightId", "filename", "filetype", "relativePath", "lastModified"] as const;

// Upper bound for a recorder's file time: far enough ahead for a recorder clock set a day wrong.
const FUTURE_SLACK_MS = 48 * 3600_000; // 48 h

// Uppy sends meta values through String(), so an absent value arrives as "null" or "undefined".
const absent = (v: unknown) => v === undefined || v === null || v === "" || v === "null" || v === "undefined";

const fileName = z
  .string({ message: "Required" })
  .transform((s) => s.normalize("NFC"))
  .superRefine((s, ctx) => {
    const problem = fileNameProblem(s);
    if (problem) ctx.addIssue({ code: "custom", message: problem });
  });

const relativePath = z.preprocess(
  (v) => (absent(v) ? undefined : v),
  z
    .string()
    .transform((s, ctx) => {
      const r = normaliseRelativePath(s);
      if ("problem" in r) {
        ctx.addIssue({ code: "custom", message: r.problem });
        return z.NEVER;
      }
      return r.path;
    })
    .optional(),
);

const lastModified = z.preprocess(
  (v) => (absent(v) ? undefined : v),
  z
    .string()
    .regex(/^\d{1,15}$/, "must be milliseconds since 1970 (digits only)")
    .transform(Number)
    .refine((ms) => ms > 0 && ms <= Date.now() + FUTURE_SLACK_MS, "is not a plausible file time")
    .optional(),
);

export const clientUploadMetadata = z.object({
  jobId: z.string({ message: "Required" }).uuid("Choose a job"),
  flightId: z.string({ message: "Required" }).uuid("Choose a flight"),
  filename: fileName,
  filetype: z.preprocess((v) => (absent(v) ? undefined : v), z.string().superRefine(textRule()).max(200, "At most 200 characters").optional()),
  relativePath,
  lastModified,
});
export type ClientUploadMetadata = z.infer<typeof clientUploadMetadata>;

/** Everything the server keeps about an upload in its tus info. */
export type StoredUploadMetadata = ClientUploadMetadata & { organisationId: string; userId: string };

/** Outcome marks written into the tus info once the upload is settled (see staging-store.ts). */
export type SettledMark = { done: "stored" | "duplicate" | "refused"; reason?: string; recordingId?: string };

type TusMetadata = Record<string, string | null>;

export function parseClientMetadata(raw: TusMetadata | undefined):
  | { ok: true; value: ClientUploadMetadata }
  | { ok: false; message: string; fields: Record<string, string[]> } {
  const r = clientUploadMetadata.safeParse(raw ?? {});
  if (r.success) return { ok: true, value: r.data };
  const fields: Record<string, string[]> = {};
  for (const issue of r.error.issues) (fields[issue.path.join(".") || "_"] ??= []).push(issue.message);
  const first = Object.entries(fields)
    .map(([k, v]) => `${k}: ${v[0]}`)
    .join("; ");
  return { ok: false, message: `The upload's metadata is not valid (${first})`, fields };
}

/** The metadata as stored in the tus info: only validated client fields plus the server's own. */
export function toTusMetadata(m: StoredUploadMetadata): TusMetadata {
  const out: TusMetadata = {
    jobId: m.jobId,
    flightId: m.flightId,
    filename: m.filename,
    cairnOrg: m.organisationId,
    cairnUser: m.userId,
  };
  if (m.filetype) out.filetype = m.filetype;
  if (m.relativePath) out.relativePath = m.relativePath;
  if (m.lastModified !== undefined) out.lastModified = String(m.lastModified);
  return out;
}

/** Reads back what toTusMetadata stored; null when the info was not written by us. */
export function fromTusMetadata(raw: TusMetadata | undefined): StoredUploadMetadata | null {
  if (!raw?.cairnOrg || !raw.cairnUser || !raw.jobId || !raw.flightId || !raw.filename) return null;
  return {
    organisationId: raw.cairnOrg,
    userId: raw.cairnUser,
    jobId: raw.jobId,
    flightId: raw.flightId,
    filename: raw.filename,
    filetype: raw.filetype ?? undefined,
    relativePath: raw.relativePath ?? undefined,
    lastModified: raw.lastModified ? Number(raw.lastModified) : undefined,
  };
}

export function settledMark(raw: TusMetadata | undefined): SettledMark | null {
  const done = raw?.cairnDone;
  if (done !== "stored" && done !== "duplicate" && done !== "refused") return null;
  return { done, reason: raw?.cairnReason ?? undefined, recordingId: raw?.cairnRecording ?? undefined };
}
