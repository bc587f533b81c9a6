// Content-Disposition for downloads, per RFC 6266 with the RFC 8187 extended parameter.
//
// The header carries two names: `filename="..."`, an ASCII-only fallback for clients that ignore
// the extended form, then `filename*=UTF-8''...`, the exact name percent-encoded as UTF-8
// (RFC 6266 section 4.3: recipients prefer filename* when both are present; appendix D: send
// both, the fallback first, for clients that stop at the first filename parameter).
// The fallback follows RFC 6266 appendix D's advice: ASCII only, no "%" followed by two hex digits
// (some clients would decode it), no path separators.

export type DispositionType = "attachment" | "inline";

// Characters RFC 8187 section 3.2.1 lets through unencoded in a value (attr-char).
const ATTR_CHAR = /[A-Za-z0-9!#$&+\-.^_`|~]/;
// C0 controls, DEL and C1 controls: never part of a file name anyone should receive.
const CONTROL = /[\u0000-\u001f\u007f-\u009f]/g;
const PATH_SEPARATOR = /[/\\]/g;

const utf8 = new TextEncoder();

function encodeRfc8187(value: string): string {
  let out = "";
  for (const char of value) {
    if (ATTR_CHAR.test(char)) {
      out += char;
      continue;
    }
    for (const byte of utf8.encode(char)) out += `%${byte.toString(16).toUpperCase().padStart(2, "0")}`;
  }
  return out;
}

function splitExtension(name: string): [string, string] {
  const dot = name.lastIndexOf(".");
  return dot > 0 ? [name.slice(0, dot), name.slice(dot)] : [name, ""];
}

function toAscii(text: string): string {
  return text
    .normalize("NFKD") // "é" becomes "e" + combining accent, so the letter survives the ASCII cut
    .replace(/[^\u0020-\u007e]/g, "")
    .replace(/%(?=[0-9A-Fa-f]{2})/g, "_")
    .replace(/\s+/g, " ")
    .trim();
}

function asciiFallback(name: string): string {
  const [base, extension] = splitExtension(name);
  const asciiBase = toAscii(base);
  const asciiExtension = toAscii(extension);
  // A base written entirely outside ASCII leaves nothing usable; keep the extension so the saved
  // file still opens with the right program.
  const fallbackBase = /[A-Za-z0-9]/.test(asciiBase) ? asciiBase : "download";
  const fallbackExtension = /^\.[A-Za-z0-9]+$/.test(asciiExtension) ? asciiExtension : "";
  return (fallbackBase + fallbackExtension).replace(/["\\]/g, (c) => `\\${c}`); // quoted-string escaping (RFC 9110 5.6.4)
}

/** `attachment; filename="..."; filename*=UTF-8''...` for a file name of any script. */
export function buildContentDisposition(fileName: string, type: DispositionType = "attachment"): string {
  const cleaned = fileName.normalize("NFC").replace(CONTROL, "").replace(PATH_SEPARATOR, "_").trim();
  if (cleaned === "") return type;
  return `${type}; filename="${asciiFallback(cleaned)}"; filename*=UTF-8''${encodeRfc8187(cleaned)}`;
}
