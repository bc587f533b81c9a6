// What a reviewer sends to mark or edit a finding. The same schemas validate the form and the API.
// Shape errors (wrong types, unknown severity, negative frames, a box outside the frame) are caught
// here; whether the moment lies inside the recording needs the recording and is checked by
// resolveFindingSpan.
import { z } from "zod";
import { SEVERITIES } from "./severity-scale";
import { plainText, textRule } from "@/lib/validation/common";
import { keysetParams } from "@/lib/validation/page-params";

export const NOTE_MAX = 4000;

const frame = z.number().int("Frames are whole numbers").min(0, "Frames start at 0");
const seconds = z.number().finite().min(0, "Time cannot be negative");
const optionalCoordinate = (min: number, max: number, what: string) =>
  z.number({ message: `${what} must be a number` }).finite().min(min, `${what} must be at least ${min}`).max(max, `${what} must be at most ${max}`).nullable().optional();

export const frameBox = z
  .object({
    x: z.number().finite().min(0).max(1),
    y: z.number().finite().min(0).max(1),
    w: z.number().finite().gt(0, "The box needs a width").max(1),
    h: z.number().finite().gt(0, "The box needs a height").max(1),
  })
  .strict()
  // a small tolerance: fractions computed from pixel drags can overshoot by a rounding error
  .refine((b) => b.x + b.w <= 1 + 1e-9 && b.y + b.h <= 1 + 1e-9, "The box must lie inside the frame");

const fields = {
  severity: z.enum(SEVERITIES, { message: `Choose one of: ${SEVERITIES.join(", ")}` }),
  categoryId: z.string().uuid("Choose a category from the list").nullable().optional(),
  note: z.string().superRefine(textRule(true)).max(NOTE_MAX, `At most ${NOTE_MAX} characters`).optional(),
  box: frameBox.nullable().optional(),
  latitude: optionalCoordinate(-90, 90, "Latitude"),
  longitude: optionalCoordinate(-180, 180, "Longitude"),
  // height of the defect above the launch point's ground, metres; negative below it
  heightAglM: z.number().finite().min(-1000).max(10000).nullable().optional(),
};

const span = {
  startFrame: frame.optional(),
  startSec: seconds.optional(),
  endFrame: frame.nullable().optional(),
  endSec: seconds.nullable().optional(),
};

function coordinatePair(v: { latitude?: number | null; longitude?: number | null }, ctx: z.RefinementCtx) {
  const hasLat = v.latitude !== undefined && v.latitude !== null;
  const hasLon = v.longitude !== undefined && v.longitude !== null;
  if (hasLat !== hasLon) ctx.addIssue({ code: "custom", path: [hasLat ? "longitude" : "latitude"], message: "Give both latitude and longitude, or neither" });
}

export const createFindingInput = z
  .object({ recordingId: z.string().uuid("Unknown recording"), ...span, ...fields })
  .strict()
  .superRefine((v, ctx) => {
    if (v.startFrame === undefined && v.startSec === undefined) ctx.addIssue({ code: "custom", path: ["startFrame"], message: "Give the frame (or time) of the finding" });
    if (v.startFrame !== undefined && v.startSec !== undefined) ctx.addIssue({ code: "custom", path: ["startSec"], message: "Give the frame or the time, not both" });
    if (v.endFrame != null && v.endSec != null) ctx.addIssue({ code: "custom", path: ["endSec"], message: "Give the end frame or the end time, not both" });
    coordinatePair(v, ctx);
  });

export const updateFindingInput = z
  .object({
    ...span,
    ...fields,
    severity: fields.severity.optional(),
    // the version the editor saw: a stale edit is refused instead of silently overwriting another
    version: z.number().int().min(1).optional(),
  })
  .strict()
  .superRefine((v, ctx) => {
    if (v.startFrame !== undefined && v.startSec !== undefined) ctx.addIssue({ code: "custom", path: ["startSec"], message: "Give the frame or the time, not both" });
    if (v.endFrame != null && v.endSec != null) ctx.addIssue({ code: "custom", path: ["endSec"], message: "Give the end frame or the end time, not both" });
    coordinatePair(v, ctx);
  });

export type CreateFindingInput = z.infer<typeof createFindingInput>;
export type UpdateFindingInput = z.infer<typeof updateFindingInput>;

/** GET /api/findings: a recording's or a job's live findings; a page holds up to 200, callers that need them all follow `nextCursor` */
export const findingsQuery = keysetParams(200).extend({ recordingId: z.string().uuid().optional(), jobId: z.string().uuid().optional() });

/** DELETE /api/findings/:id: the reason is kept with the deletion */
export const deleteFindingInput = z.object({ reason: plainText(500, true).optional() }).strict();
