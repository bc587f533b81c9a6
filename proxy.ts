// Every page gets a Content-Security-Policy with a nonce of its own (lib/http/build-content-security-policy.ts).
// The nonce travels to the renderer on the request (Next reads it from the request's CSP header and
// stamps it on its scripts; app/layout.tsx reads x-nonce) and to the browser on the response.
//
// The matcher leaves out:
//   - /api/uploads above all: Next buffers the body of every request its proxy matches and keeps only
//     the first 10 MB, and tus PATCHes are larger (tests/unit/ingest/no-proxy-on-uploads.test.ts);
//   - the rest of /api: JSON, media and PDFs are not documents that run scripts;
//   - Next's static files and public assets, which never change per request.
import { NextResponse, type NextRequest } from "next/server";
import { buildContentSecurityPolicy, makeNonce } from "@/lib/http/build-content-security-policy";

export function proxy(request: NextRequest) {
  const nonce = makeNonce();
  const policy = buildContentSecurityPolicy(nonce, { dev: process.env.NODE_ENV === "development" });
  const headers = new Headers(request.headers);
  headers.set("x-nonce", nonce);
  headers.set("Content-Security-Policy", policy);
  const response = NextResponse.next({ request: { headers } });
  response.headers.set("Content-Security-Policy", policy);
  return response;
}

export const config = {
  matcher: ["/((?!api/uploads|api/|_next/static|_next/image|favicon\\.ico|cairn-mark\\.svg|.*\\.(?:svg|png|jpg|jpeg|gif|webp|ico|woff2?|txt|xml)$).*)"],
};
