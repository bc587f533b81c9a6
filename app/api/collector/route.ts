// POST /api/collector: the app's own playback-analytics collector. mux-embed posts its beacons here
// (text/plain JSON { metadata, events }); views are stored per viewer: the signed-in member, or for
// a shared page the share link its media grant names (lib/playback-analytics/share-viewer.ts). OPTIONS: CORS.
// Cross-site guard (lib/api/refuse-cross-site.ts): the origin check applies, the JSON-only body rule
// does not: mux-embed posts text/plain by design (a "simple" request, no CORS preflight). It writes
// analytics rows only: a member's own views (session cookie) or a share link's views, each of which
// must carry a media grant that the link signed for that recording. A page on another origin is
// refused before any of that, so it can neither count views for a signed-in member nor for a link.
import { ApiError, errorResponse } from "@/lib/api/errors";
import { assertSameOrigin } from "@/lib/api/refuse-cross-site";
import { requireMember } from "@/lib/api/with-org";
import { inScope, isClientScoped } from "@/lib/auth/client-scope";

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
import { env } from "@/lib/config/env";
import { readBeacons, BeaconError } from "@/lib/playback-analytics/read-beacons";
import { recordPlaybackViews } from "@/lib/playback-analytics/record-playback-views";
import { knownShareViewer, shareViewerOf } from "@/lib/playback-analytics/share-viewer";

const MAX_BODY_BYTES = 600 * 1024; // mux-embed caps a beacon at 500 KB (maxPayloadKBSize)

/** Only the app's own pages may post beacons with credentials. */
function corsHeaders(req: Request): Record<string, string> {
  const origin = req.headers.get("origin");
  if (!origin) return {};
  const allowed = new Set([new URL(env().APP_URL).origin]);
  const host = req.headers.get("host");
  if (host) {
    allowed.add(`http://${host}`);
    allowed.add(`https://${host}`);
  }
  if (!allowed.has(origin)) return {};
  return {
    "Access-Control-Allow-Origin": origin,
    "Access-Control-Allow-Credentials": "true",
    "Access-Control-Allow-Methods": "POST, OPTIONS",
    "Access-Control-Allow-Headers": "Content-Type",
    "Access-Control-Max-Age": "600",
    Vary: "Origin",
  };
}

export async function OPTIONS(req: Request) {
  return new Response(null, { status: 204, headers: { ...corsHeaders(req), "Cache-Control": "no-store" } });
}

export async function POST(req: Request) {
  const cors = corsHeaders(req);
  try {
    assertSameOrigin(req);
    const length = Number(req.headers.get("content-length") ?? 0);
    if (length > MAX_BODY_BYTES) throw new ApiError("payload_too_large", "Beacon too large");
    const text = await req.text();
    if (text.length > MAX_BODY_BYTES) throw new ApiError("payload_too_large", "Beacon too large");
    let body: unknown;
    try {
      body = JSON.parse(text);
    } catch {
      throw new ApiError("bad_request", "The beacon is not JSON");
    }
    let views;
    try {
      views = readBeacons(body);
    } catch (err) {
      if (err instanceof BeaconError) throw new ApiError("bad_request", err.message);
      throw err;
    }
    // a shared page's player sends its media grant with each view (no account behind it); every
    // other view needs a signed-in member, as does a post that carries nothing at all
    const shared = views.filter((v) => v.accessToken !== null);
    const result = { stored: 0, ignored: 0 };
    const add = (r: { stored: number; ignored: number }) => {
      result.stored += r.stored;
      result.ignored += r.ignored;
    };
    // a later beacon of a shared page's view carries no token (the SDK sends it in the view's first
    // event only): it adds to the share link's view that an earlier beacon proved, without a session
    const own = [];
    for (const v of views.filter((v) => v.accessToken === null)) {
      const known = UUID.test(v.recordingId) ? await knownShareViewer(v.viewKey, v.recordingId.toLowerCase()) : null;
      if (known) add(await recordPlaybackViews({ ...known, userId: null }, [v]));
      else own.push(v);
    }
    if (own.length > 0 || views.length === 0) {
      const member = await requireMember(req);
      // a client account counts views only of recordings it may see (its own clients' jobs)
      const mine = [];
      for (const v of own) if (!isClientScoped(member) || (UUID.test(v.recordingId) && (await inScope(member, "recording", v.recordingId.toLowerCase())))) mine.push(v);
      result.ignored += own.length - mine.length;
      add(await recordPlaybackViews({ organisationId: member.organisationId, userId: member.userId, shareLinkId: null }, mine));
    }
    for (const view of shared) {
      const viewer = await shareViewerOf(view.accessToken!, view.recordingId);
      if (viewer) add(await recordPlaybackViews({ ...viewer, userId: null }, [view]));
      else result.ignored += 1;
    }
    // 200 even when some views were ignored: the SDK retries failed posts, and an unknown video
    // will not become known by retrying
    return Response.json(result, { headers: { ...cors, "Cache-Control": "no-store" } });
  } catch (err) {
    const res = errorResponse(err);
    for (const [k, v] of Object.entries(cors)) res.headers.set(k, v);
    return res;
  }
}
