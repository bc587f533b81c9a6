// Headers on everything a share link serves: the capability URL must not leak through the Referer
// header, land in a shared cache, or be indexed by a crawler that somehow got hold of it.
export const SHARE_RESPONSE_HEADERS: Readonly<Record<string, string>> = {
  "Referrer-Policy": "no-referrer",
  "Cache-Control": "no-store",
  "X-Robots-Tag": "noindex, nofollow",
  "X-Content-Type-Options": "nosniff",
};
