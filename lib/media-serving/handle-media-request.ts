// The body of every member media route: authorize this very request, then serve the file with ranges.
import { errorResponse } from "@/lib/api/errors";
import type { DispositionType } from "@/lib/http/build-content-disposition";
import { authorizeMedia } from "./authorize-media";
import type { MediaTarget } from "./media-file";
import { serveStoredFile } from "./serve-stored-file";

/** `target` is read inside the error handling, so a malformed id in the URL answers 404 like any miss. */
export async function handleMediaRequest(req: Request, target: () => MediaTarget, opts: { disposition?: DispositionType; onServed?: (grant: Awaited<ReturnType<typeof authorizeMedia>>, res: Response) => Promise<void> } = {}): Promise<Response> {
  try {
    const grant = await authorizeMedia(req, target());
    const res = await serveStoredFile(req, grant.file, opts.disposition ?? "inline");
    if (res.status !== 416) {
      await opts.onServed?.(grant, res).catch((err) => console.warn("[cairn] media served, but recording the access failed:", (err as Error).message));
    }
    return res;
  } catch (err) {
    const res = errorResponse(err);
    res.headers.set("X-Content-Type-Options", "nosniff");
    return res;
  }
}
