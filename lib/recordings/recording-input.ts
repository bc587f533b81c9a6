// The inputs of a recording's routes: tags, and the request to delete its files.
import { z } from "zod";
import { plainText, textRule } from "@/lib/validation/common";
import { MAX_FPS, MIN_FPS } from "@/lib/processing/choose-frame-rate";

export const tagName = z
  .string()
  .transform((s) => s.normalize("NFC").replace(/\s+/g, " ").trim())
  .pipe(
    z
      .string()
      .min(1, "Required")
      .max(40, "At most 40 characters")
      .superRefine(textRule()),
  );
export const tagInput = z.object({ name: tagName }).strict();

/** DELETE /api/recordings/:id/tags?name= */
export const tagRemovalQuery = z.object({ name: tagName });

/** POST /api/recordings/:id/deletion: the reason is kept in the custody log */
export const recordingDeletionInput = z.object({ reason: plainText(500, true).nullish() }).strict();

/** POST /api/recordings/:id/reprocess: a frame rate for a raw stream, or null to clear the override */
export const reprocessInput = z
  .object({ fps: z.number().min(MIN_FPS, `At least ${MIN_FPS} fps`).max(MAX_FPS, `At most ${MAX_FPS} fps`).nullable().optional() })
  .strict();
