// The one wrapper every workspace route handler goes through: session -> membership -> permission.
// No session: 401. Signed in but the role lacks the permission: 403. Records of another
// organisation are filtered by the handler's queries and answer 404.
import { z } from "zod";
import { ApiError, errorResponse } from "./errors";
import { readSession } from "@/lib/auth/read-session";
import { loadMember, type Member } from "@/lib/auth/load-member";
import { can, type Permission } from "@/lib/auth/permissions";
import { refuseCrossSite } from "./refuse-cross-site";
import { plainText, safeText } from "@/lib/validation/common";
import { cursorParam, MAX_PAGE_SIZE } from "./keyset";

export type OrgContext<P> = { req: Request; params: P; member: Member };
type RouteArg = { params: Promise<Record<string, string | string[]>> };

export function withOrg<P extends Record<string, string | string[]> = Record<string, never>>(
  options: { permission: Permission },
  handler: (ctx: OrgContext<P>) => Promise<Response>,
) {
  return async (req: Request, route?: RouteArg): Promise<Response> => {
    try {
      refuseCrossSite(req); // state-changing methods only: foreign origin 403, non-JSON body 415
      const member = await requireMember(req);
      if (!can(member.role, options.permission)) throw new ApiError("forbidden", "Your role does not allow this action");
      const params = (route?.params ? await route.params : {}) as P;
      return await handler({ req, params, member });
    } catch (err) {
      return errorResponse(err);
    }
  };
}

export async function requireMember(req: Request): Promise<Member> {
  const claims = await readSession(req.headers);
  if (!claims) throw new ApiError("unauthenticated", "Sign in to continue");
  const member = await loadMember(claims);
  if (!member) throw new ApiError("unauthenticated", "Your session or membership has ended; sign in again");
  return member;
}

/** Parses a JSON body with a zod schema: malformed JSON is 400, invalid fields 422. */
export async function readJson<T extends z.ZodType>(req: Request, schema: T): Promise<z.infer<T>> {
  let body: unknown;
  try {
    body = await req.json();
  } catch {
    throw new ApiError("bad_request", "The request body is not valid JSON");
  }
  return schema.parse(body);
}

const uuid = z.string().uuid();
/** An id from the URL; anything that is not a UUID cannot exist, so it is 404, not a database error. */
export function idParam(value: string | string[] | undefined, what = "Not found"): string {
  const r = uuid.safeParse(value);
  if (!r.success) throw new ApiError("not_found", what);
  return r.data;
}

/**
 * Reads list query parameters (search, sort, paging) with bounds. Paging is by keyset: `cursor` is the
 * previous answer's `nextCursor` (lib/api/keyset.ts). `page` still works for the first pages of old
 * callers but is capped, so nobody can make the database walk a deep OFFSET.
 */
export const listQuery = z.object({
  q: plainText(200).optional(),
  page: z.coerce.number().int().min(1).max(1000).default(1),
  pageSize: z.coerce.number().int().min(1).max(MAX_PAGE_SIZE).default(25),
  cursor: cursorParam,
  sort: safeText().max(40).optional(),
  dir: z.enum(["asc", "desc"]).default("asc"),
  archived: z.enum(["0", "1"]).default("0"),
});
export function parseQuery<T extends z.ZodType>(req: Request, schema: T): z.infer<T> {
  const params = Object.fromEntries(new URL(req.url).searchParams.entries());
  return schema.parse(params);
}

export const created = (body: unknown) => Response.json(body, { status: 201, headers: { "Cache-Control": "no-store" } });
export const ok = (body: unknown) => Response.json(body, { headers: { "Cache-Control": "no-store" } });
