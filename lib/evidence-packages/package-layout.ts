// Where each file goes inside a package's data/ folder. Paths are made of ids, numbers and a cleaned
// copy of the recording's original name (letters, digits, dot, dash, underscore only), so they are the
// same on every system that unpacks the ZIP and never need the percent-encoding manifests allow.
//
//   data/recordings/<NN>-<recording id>/original/<cleaned original name>   the original, byte for byte
//   data/recordings/<NN>-<recording id>/renditions/<file>                  playable rendition, poster, thumbnails
//   data/recordings/<NN>-<recording id>/stills/frame-<n>-<still id>.jpg    stills of findings
//   data/reports/report-v<version>-<report id>.pdf                         every approved report version
//   data/custody/custody-events.json | custody-events.csv                   the custody events of all of it
//   data/custody/checkpoint.json (+ checkpoint-statement.json, checkpoint-timestamp.tsr)
//   data/contents.csv                                                      each payload file, what it is, its record's SHA-256

/** A file name safe everywhere: other characters become "_", no leading dot, at most 120 characters. */
export function cleanFileName(name: string): string {
  const base = name.split(/[\\/]/).pop() ?? "";
  const cleaned = base.replace(/[^A-Za-z0-9._-]/g, "_").replace(/^\.+/, "_").slice(-120);
  return cleaned === "" || /^_*$/.test(cleaned) ? "original" : cleaned;
}

export function recordingFolder(index: number, recordingId: string): string {
  return `recordings/${String(index + 1).padStart(2, "0")}-${recordingId}`;
}

/** The bag's own name: its top-level folder in the ZIP and the ZIP's file name. */
export function bagName(jobTitle: string, packageId: string, at: Date): string {
  const slug = jobTitle
    .normalize("NFKD")
    .replace(/[^A-Za-z0-9]+/g, "-")
    .replace(/^-+|-+$/g, "")
    .toLowerCase()
    .slice(0, 48);
  return `cairn-evidence-${slug || "job"}-${at.toISOString().slice(0, 10)}-${packageId.slice(0, 8)}`;
}
