// Content types the media route sends. Only types we produce are served as themselves; anything else
// goes out as an opaque download, so a stored file can never be rendered as a page (with nosniff).
const SERVED: Record<string, string> = {
  "video/mp4": "video/mp4",
  "image/jpeg": "image/jpeg",
  "image/png": "image/png",
  "text/vtt": "text/vtt; charset=utf-8",
  "application/pdf": "application/pdf",
};
const BY_EXTENSION: Record<string, string> = {
  mp4: "video/mp4",
  m4v: "video/mp4",
  jpg: "image/jpeg",
  jpeg: "image/jpeg",
  png: "image/png",
  vtt: "text/vtt",
  pdf: "application/pdf",
};

export function mediaContentType(storedMimeType: string | null | undefined, fileName: string): string {
  const declared = storedMimeType?.split(";")[0].trim().toLowerCase();
  if (declared && SERVED[declared]) return SERVED[declared];
  const ext = fileName.toLowerCase().match(/\.([a-z0-9]+)$/)?.[1];
  const byExt = ext ? BY_EXTENSION[ext] : undefined;
  return byExt ? SERVED[byExt] : "application/octet-stream";
}
