// The Content-Security-Policy of every page (W3C Content Security Policy Level 3), built per request
// around a fresh nonce that Next stamps on its own inline and bootstrap scripts (Next.js guide
// "Content Security Policy": the nonce is read from this header on the request while rendering).
//   script-src   the nonce + 'strict-dynamic': scripts our nonce'd scripts load (Next's chunks, the
//                analytics SDK loaded on demand) run, nothing injected does; 'unsafe-eval' only in
//                `next dev`, where React rebuilds server error stacks with eval.
//   style-src    'unsafe-inline': video.js, Uppy and the charts set style attributes and inject
//                <style> elements without a nonce; styles cannot run code.
//   media-src    blob: for players that feed media through Media Source Extensions.
//   worker-src   blob: for video.js's transmuxer worker, built from a blob URL.
//   img-src      data: and blob: for Uppy's thumbnails and inline icons.
//   connect-src  'self' only: the API, tus uploads and the analytics collector are all ours.
//   frame-ancestors 'self' (and X-Frame-Options SAMEORIGIN in next.config.ts for older browsers):
//                no other site may frame a page to trick a click.
export function buildContentSecurityPolicy(nonce: string, opts: { dev?: boolean } = {}): string {
  const directives: Record<string, string[]> = {
    "default-src": ["'self'"],
    "script-src": ["'self'", `'nonce-${nonce}'`, "'strict-dynamic'", ...(opts.dev ? ["'unsafe-eval'"] : [])],
    "style-src": ["'self'", "'unsafe-inline'"],
    "img-src": ["'self'", "data:", "blob:"],
    "media-src": ["'self'", "blob:"],
    "font-src": ["'self'", "data:"],
    "connect-src": ["'self'", ...(opts.dev ? ["ws:"] : [])],
    "worker-src": ["'self'", "blob:"],
    "frame-src": ["'self'"],
    "object-src": ["'none'"],
    "base-uri": ["'self'"],
    "form-action": ["'self'"],
    "frame-ancestors": ["'self'"],
  };
  return Object.entries(directives)
    .map(([name, values]) => `${name} ${values.join(" ")}`)
    .join("; ");
}

/** 128 random bits, base64: unguessable and fresh for every response (CSP3 section 2.3.1 asks for at least 128 bits). */
export function makeNonce(): string {
  const bytes = crypto.getRandomValues(new Uint8Array(16));
  let s = "";
  for (const b of bytes) s += String.fromCharCode(b);
  return btoa(s);
}
