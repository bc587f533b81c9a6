// Query parameters of the custody list (GET /api/custody). Server-side only (it names the event types
// from lib/custody/record-custody-event.ts).
import { z } from "zod";
import { CUSTODY_EVENT_TYPES } from "@/lib/custody/record-custody-event";
import { CUSTODY_ORDERS, CUSTODY_PAGE_SIZE_DEFAULT, CUSTODY_PAGE_SIZE_MAX } from "@/lib/custody/list-custody-events";
import { isoDate } from "./common";

const id = z.string().uuid("Not a valid id").optional();

export const custodyListQuery = z
  .object({
    recordingId: id,
    jobId: id,
    // "upload,view": kinds of event; an unknown word is a 422, not an empty list
    eventType: z
      .string()
      .max(400)
      .transform((s) => s.split(",").map((x) => x.trim()).filter(Boolean))
      .pipe(z.array(z.enum(CUSTODY_EVENT_TYPES)).max(CUSTODY_EVENT_TYPES.length))
      .optional(),
    // a member's user id, "system" (Cairn itself) or "share" (a client through a share link)
    actor: z.union([z.literal("system"), z.literal("share"), z.string().uuid("Not a valid person")]).optional(),
    from: isoDate.optional(),
    to: isoDate.optional(),
    order: z.enum(CUSTODY_ORDERS).default("newest"),
    // the seq of the previous page's last event (its `nextCursor`)
    cursor: z
      .string()
      .regex(/^[1-9][0-9]{0,14}$/, "The cursor is not valid")
      .transform(Number)
      .optional(),
    pageSize: z.coerce.number().int().min(1).max(CUSTODY_PAGE_SIZE_MAX).default(CUSTODY_PAGE_SIZE_DEFAULT),
  })
  .refine((q) => !q.from || !q.to || q.from <= q.to, { message: "The first day comes after the last", path: ["to"] });

export type CustodyListQuery = z.infer<typeof custodyListQuery>;
