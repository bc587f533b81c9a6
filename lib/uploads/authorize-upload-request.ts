// Who may touch the upload endpoint: a signed-in member whose role may upload recordings.
// Checked once per request (the result is kept for the request's other hooks) and again on every
// request of an upload, never only at creation.
import { readSession } from "@/lib/auth/read-session";
import { loadMember, type Member } from "@/lib/auth/load-member";
import { can } from "@/lib/auth/permissions";
import { UploadRefusal } from "./upload-refusal";

const checked = new WeakMap<Request, Promise<Member>>();

async function check(req: Request): Promise<Member> {
  const claims = await readSession(req.headers);
  if (!claims) throw new UploadRefusal("unauthenticated", "Sign in to upload recordings");
  const member = await loadMember(claims);
  if (!member) throw new UploadRefusal("unauthenticated", "Your membership has ended; sign in again");
  if (!can(member.role, "recordings.upload")) throw new UploadRefusal("forbidden", "Your role does not allow uploading recordings");
  return member;
}

/** The member behind the request, or a thrown UploadRefusal (401 without session, 403 for a role that may not upload). */
export function authorizeUploadRequest(req: Request): Promise<Member> {
  let p = checked.get(req);
  if (!p) {
    p = check(req);
    checked.set(req, p);
  }
  return p;
}

