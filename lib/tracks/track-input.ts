// The bodies of the track routes (zod; the same schemas check the browser's forms).
import { z } from "zod";
import { textRule } from "@/lib/validation/common";
import { MAX_TRACK_BYTES, MAX_TRACK_POINTS } from "./track-types";

/** The file name as the browser gave it: shown and kept, never used for a path. */
export const trackFileName = z.string({ message: "Give the file's name" }).superRefine(textRule()).trim().min(1, "Give the file's name").max(255, "At most 255 characters");

/** POST /api/flights/:id/track: the file's exact bytes as base64 (RFC 4648, section 4) inside JSON. */
export const trackImportInput = z
  .object({
    fileName: trackFileName,
    contentBase64: z
      .string({ message: "Send the file's content as base64" })
      .max(Math.ceil(MAX_TRACK_BYTES / 3) * 4 + 4, `A track may be at most ${MAX_TRACK_BYTES / 1024 / 1024} MiB`)
      .regex(/^[A-Za-z0-9+/]*={0,2}$/, "The file's content is not base64"),
  })
  .strict();

const int = (what: string, max: number) =>
  z.preprocess((v) => (typeof v === "string" && v.trim() !== "" ? Number(v) : v), z.number({ message: `${what} must be a whole number` }).int(`${what} must be a whole number`).min(0, `${what} cannot be negative`).max(max, `${what} is too large`));

/** POST /api/flights/:id/track/alignment */
export const trackAlignmentInput = z.discriminatedUnion("method", [
  z.object({ method: z.literal("file_times") }).strict(),
  z.object({ method: z.literal("frame_match"), recordingId: z.string().uuid("Choose a recording of this flight"), frame: int("Frame", 24 * 3600 * 240), pointIndex: int("Track point", MAX_TRACK_POINTS) }).strict(),
]);
export type TrackAlignmentInput = z.infer<typeof trackAlignmentInput>;

/** POST /api/flights/:id/track/range-checks: one link event of a signal trace, measured on the track. */
export const trackRangeCheckInput = z.object({ recordingId: z.string().uuid("Choose a recording of this flight"), intervalIndex: int("Interval", 1_000_000) }).strict();
