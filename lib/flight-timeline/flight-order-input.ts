// PATCH /api/flights/:id/order: the pilot's order of the flight's files (every file exactly once), or
// back to the recorder's order.
import { z } from "zod";

export const flightOrderInput = z.union([
  z.object({ recordingIds: z.array(z.string().uuid()).min(1).max(1000) }).strict(),
  z.object({ recorderOrder: z.literal(true) }).strict(),
]);
