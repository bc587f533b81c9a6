// The body of every media route: authorize this very request, then serve the file with ranges.
// Share-link routes call the same function with the token from their path.
import { errorResponse } from "@/lib/api/errors";
import type { DispositionType } from "@/lib/http/build-content-disposition";
import { authorizeMedia } from "./authorize-media";
import type { MediaTarget } from "./media-file";
import { serveStoredFile } from "./serve-stored-file";

/** `target` is read inside the error handling, so a malformed id in the URL answers 404 like any miss. */
export async function handleMediaRequest(req: Request, target: () => MediaTarget, opts: { token?: string | null; disposition?: DispositionType; onServed?: (grant: Awaited<ReturnType<typeof authorizeMedia>>, res: Response) => Promise<void> } = {}): Promise<Response> {
  try {
    const grant = await authorizeMedia(req, target(), opts.token ?? null);
    const res = await serveStoredFile(req, grant.file, opts.disposition ?? "inline");
    if (res.status !== 416) {
      await grant.mode.onServed?.(grant.principal, grant.file, grant.credentials, res).catch(() => {});
      await opts.onServed?.(grant, res).catch((err) => console.warn("[cairn] media served, but recording the access failed:", (err as Error).message));
    }
    return res;
  } catch (err) {
    const res = errorResponse(err);
    res.headers.set("X-Content-Type-Options", "nosniff");
    return res;
  }
}
