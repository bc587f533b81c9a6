// The words that travel inside a package: bag-info.txt's labels (RFC 8493 section 2.2.2 reserves the
// standard ones; Cairn's own start with "Cairn-") and README.txt, which tells the receiver how to check
// the package with common tools and no Cairn.
import { HASH_RULE } from "@/lib/custody/export-custody-log";

export type PackageFacts = {
  packageId: string;
  bagName: string;
  organisationName: string;
  jobId: string;
  jobTitle: string;
  clientName: string;
  siteName: string;
  selection: "job" | "flight" | "recordings";
  flightFlownOn: string | null;
  recordingCount: number;
  madeBy: { name: string; email: string } | null;
  madeAt: Date;
  purpose: string | null;
  legalHold: boolean;
  checkpoint: { number: number; headSeq: number; covers: boolean } | null;
  custodyEvents: number;
  custodyMaxSeq: number;
};

const SELECTION_WORDS = { job: "the whole job", flight: "one flight", recordings: "chosen recordings" } as const;

export function bagInfo(f: PackageFacts): [string, string][] {
  const what = f.selection === "flight" ? `flight of ${f.flightFlownOn}` : SELECTION_WORDS[f.selection];
  return [
    ["Source-Organization", f.organisationName],
    ...(f.madeBy ? ([["Contact-Name", f.madeBy.name], ["Contact-Email", f.madeBy.email]] as [string, string][]) : []),
    ["External-Identifier", f.packageId],
    ["External-Description", `Evidence package of "${f.jobTitle}" (${what}, ${f.recordingCount} recording${f.recordingCount === 1 ? "" : "s"}) for ${f.clientName}, ${f.siteName}`],
    ["Internal-Sender-Identifier", f.jobId],
    ["Bag-Software-Agent", "Cairn evidence package"],
    ["Cairn-Organisation", f.organisationName],
    ["Cairn-Job-Title", f.jobTitle],
    ["Cairn-Job-Id", f.jobId],
    ["Cairn-Selection", what],
    ["Cairn-Packaged-By", f.madeBy ? `${f.madeBy.name} <${f.madeBy.email}>` : "(unknown)"],
    ["Cairn-Packaged-At", f.madeAt.toISOString()],
    ...(f.purpose ? ([["Cairn-Purpose", f.purpose]] as [string, string][]) : []),
    ["Cairn-Legal-Hold", f.legalHold ? "yes" : "no"],
    ["Cairn-Custody-Events", `${f.custodyEvents} (chain positions up to ${f.custodyMaxSeq})`],
    ["Cairn-Custody-Checkpoint", f.checkpoint ? `number ${f.checkpoint.number}, chain head ${f.checkpoint.headSeq}${f.checkpoint.covers ? "" : " (made before the newest events in this package)"}` : "none yet"],
  ];
}

export function readme(f: PackageFacts): string {
  const lines = [
    `EVIDENCE PACKAGE ${f.bagName}`,
    "",
    `Made by ${f.madeBy ? `${f.madeBy.name} <${f.madeBy.email}>` : "(unknown)"} of ${f.organisationName} on ${f.madeAt.toISOString()} (UTC),`,
    `from the job "${f.jobTitle}" (${f.clientName}, ${f.siteName}), with Cairn.`,
    "",
    "This folder is a BagIt bag (RFC 8493, https://www.rfc-editor.org/rfc/rfc8493). Everything delivered is",
    "under data/; the files beside it describe and check it:",
    "",
    "  bagit.txt               the BagIt version",
    "  bag-info.txt            who made the package, when, from which job",
    "  manifest-sha256.txt     the SHA-256 of every file under data/",
    "  tagmanifest-sha256.txt  the SHA-256 of the files above and of this README",
    "",
    "WHAT IS INSIDE",
    "",
    "  data/recordings/NN-<id>/original/    each recording exactly as uploaded, byte for byte",
    "  data/recordings/NN-<id>/renditions/  the playable video, poster and scrub thumbnails made from it",
    "  data/recordings/NN-<id>/stills/      stills of the findings",
    "  data/reports/                        every approved version of the job's report (PDF)",
    "  data/custody/                        the custody events of all of the above (JSON and CSV) and the",
    "                                       signed, time-stamped custody checkpoint that covers them",
    "  data/contents.csv                    each file, what it is, and the SHA-256 Cairn recorded for it",
    "",
    "HOW TO CHECK IT",
    "",
    "1. Unpack the ZIP, then in the folder that holds this README run:",
    "",
    "     sha256sum -c manifest-sha256.txt",
    "     sha256sum -c tagmanifest-sha256.txt",
    "",
    "   Every line must end in OK. On macOS use `shasum -a 256 -c` instead of `sha256sum -c`. Any BagIt",
    "   tool checks the same, for example `bagit.py --validate <this folder>`.",
    "",
    "2. An original's SHA-256 in manifest-sha256.txt equals the one Cairn recorded when it was uploaded",
    "   (data/contents.csv, and originalSha256 of its upload event in data/custody/custody-events.json).",
    "",
    "3. Each custody event carries its own hash:",
    `     ${HASH_RULE}.`,
    "   A package holds only the events of what is inside, so each event's hash can be recomputed, and",
    "   the links between them only in the organisation's full log.",
    "",
    "4. data/custody/checkpoint.json is a statement of the organisation's custody chain head, signed",
    "   with Ed25519 (RFC 8032) and time-stamped by an RFC 3161 authority. Its exact signed text is",
    "   data/custody/checkpoint-statement.json; with the authority's certificate the time-stamp checks with",
    "     openssl ts -verify -data data/custody/checkpoint-statement.json -in data/custody/checkpoint-timestamp.tsr -CAfile <authority certificate>",
    "",
    "Cairn also gave the SHA-256 of the ZIP file itself on the package's page: `sha256sum <zip file>` before",
    "unpacking shows that the package arrived whole.",
  ];
  if (f.legalHold) lines.push("", "The job was under legal hold when this package was made.");
  if (f.checkpoint && !f.checkpoint.covers) lines.push("", `Note: the newest checkpoint (number ${f.checkpoint.number}) was made before the last events in this package (chain position ${f.custodyMaxSeq}); a later checkpoint from Cairn covers them.`);
  if (!f.checkpoint) lines.push("", "Note: no custody checkpoint had been made yet when this package was built.");
  return lines.join("\n") + "\n";
}
