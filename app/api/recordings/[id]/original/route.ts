// GET /api/recordings/:id/original: the original, byte for byte, as a download with its SHA-256 (a custody event)
import { withOrg, idParam } from "@/lib/api/with-org";
import { serveOriginal } from "@/lib/recordings/serve-original";

type P = { id: string };

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

export const GET = withOrg<P>({ permission: "originals.download" }, async ({ req, params, member }) =>
  serveOriginal(req, member, idParam(params.id, "Recording not found")),
);

// HEAD answers the same headers without sending or logging a download
export const HEAD = GET;
