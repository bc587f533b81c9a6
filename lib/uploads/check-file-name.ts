// File names and folder paths sent by the uploader are kept as text (shown in lists, used in the
// download's Content-Disposition) and never as a path on our disk: originals are stored under a key
// derived from the recording id. Names that could mislead a person or a program later are refused
// with a reason instead of being silently rewritten, so what the pilot sees is what was on the card.

// C0 controls, DEL and C1 controls
const CONTROL = /[\u0000-\u001f\u007f-\u009f]/;
// Unicode bidirectional overrides and isolates: they can make "clip\u202Ekcp.264" read as "clip462.pck"
const BIDI = /[\u202a-\u202e\u2066-\u2069\u200e\u200f\u061c]/;
const MAX_NAME_BYTES = 255; // the common file-system limit for one name
const MAX_PATH_CHARS = 1024;

const utf8 = new TextEncoder();

/** Why a single file name cannot be accepted, or null when it can. */
export function fileNameProblem(name: string): string | null {
  if (name.trim() === "") return "the file name is empty";
  if (CONTROL.test(name)) return "the file name contains control characters";
  if (BIDI.test(name)) return "the file name contains invisible text-direction characters";
  if (name.includes("/") || name.includes("\\")) return "the file name contains a path separator";
  if (name === "." || name === "..") return "the file name is a path step (“.” or “..”)";
  if (utf8.encode(name).length > MAX_NAME_BYTES) return `the file name is longer than ${MAX_NAME_BYTES} bytes`;
  return null;
}

/**
 * Normalises the folder path a browser reports for a file dropped inside a folder
 * ("/card/DCIM/clip.264" from a drop, "card/DCIM/clip.264" from a folder picker) and says why it
 * cannot be accepted, if so. Only "/" separates folders; "." and ".." steps are refused.
 */
export function normaliseRelativePath(raw: string): { path: string } | { problem: string } {
  const path = raw.normalize("NFC").replace(/^\/+/, "");
  if (path === "") return { problem: "the folder path is empty" };
  if (path.length > MAX_PATH_CHARS) return { problem: `the folder path is longer than ${MAX_PATH_CHARS} characters` };
  if (path.includes("\\")) return { problem: "the folder path contains a backslash" };
  for (const step of path.split("/")) {
    if (step === "") return { problem: "the folder path has an empty step (“//”)" };
    if (step === "." || step === "..") return { problem: "the folder path contains a “.” or “..” step" };
    const p = fileNameProblem(step);
    if (p) return { problem: p.replace("the file name", "a folder name") };
  }
  return { path };
}
