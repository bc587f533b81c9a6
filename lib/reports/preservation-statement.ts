// How Cairn keeps originals, in the words a report prints. Each sentence states something the code
// does (lib/storage/*, lib/custody/*), so the report never promises more than is true.
export const PRESERVATION_STATEMENT: readonly string[] = [
  "Every recording listed in this report was received byte for byte as it left the recorder. Its SHA-256 digest was computed while the bytes arrived and is printed beside it here.",
  "Originals are stored write-once under a name derived from the recording's identifier, made read-only once in place, and never modified. Playable videos, thumbnails and stills are separate derived files; making them only reads the original.",
  "Each still in this report was decoded from the exact frame named beside it, and its own SHA-256 digest is kept with it.",
  "Every upload, derivation, finding, edit, deletion, share and approval is appended to an organisation-wide custody log in which each entry carries the SHA-256 of the one before it, so a removed or altered entry breaks the chain.",
  "To check an original, compute its SHA-256 (for example with the command “sha256sum FILE” or “shasum -a 256 FILE”) and compare it with the digest printed here. Identical digests mean identical bytes.",
];
