// Writes a BagIt bag (RFC 8493) as one ZIP, streamed: every payload file is read once, in turn, through
// a SHA-256 on its way into the archive, so neither the files nor the package are ever held in memory
// or copied whole to a temporary place. The tag files that depend on the payload (bag-info.txt with its
// Payload-Oxum, manifest-sha256.txt, tagmanifest-sha256.txt) go in after it; a ZIP may hold its entries
// in any order. The bag sits in one top-level folder named after it (RFC 8493 section 4, serialization).
//
// The ZIP is written by archiver (its zip format, zip-stream underneath): media is stored, since
// H.264, MP4 and JPEG do not compress further, and text is deflated.
import { createHash } from "node:crypto";
import { Transform, type Readable, type Writable } from "node:stream";
import { pipeline } from "node:stream/promises";
import archiver from "archiver";

export type BagPayloadEntry = {
  /** Path below data/, "/"-separated, made by bagPath (package-layout.ts). */
  path: string;
  /** Opened when its turn comes, so only one file is open at a time. */
  open: () => Readable;
  /** Bytes expected, for progress; null when not known ahead (generated text). */
  size: number | null;
  /** When given, the build fails if the bytes read do not have this SHA-256 (a stored original that changed). */
  expectSha256?: string | null;
  /** Store without compression (media that does not compress). */
  store?: boolean;
};

export type BagTags = {
  /** bag-info.txt labels and values, in order; Payload-Oxum and Bagging-Date are added here. */
  bagInfo: [string, string][];
  /** Plain-text instructions for the receiver, put beside the tag files as README.txt. */
  readme: string;
};

export type WrittenBag = {
  payloadFiles: number;
  payloadBytes: number;
  /** data/... path -> SHA-256 hex, as written in manifest-sha256.txt */
  manifest: Map<string, string>;
  zipSha256: string;
  zipBytes: number;
};

export class PayloadMismatchError extends Error {
  constructor(
    public readonly path: string,
    public readonly expected: string,
    public readonly actual: string,
  ) {
    super(`${path}: the stored bytes have SHA-256 ${actual}, not ${expected} as recorded`);
    this.name = "PayloadMismatchError";
  }
}

/** A manifest line: checksum, whitespace, path, with CR, LF and % percent-encoded (RFC 8493 2.1.3). */
export function manifestLine(sha256: string, filePath: string): string {
  return `${sha256}  ${filePath.replace(/%/g, "%25").replace(/\r/g, "%0D").replace(/\n/g, "%0A")}\n`;
}

/** A bag-info.txt line; values are one line each (labels and values never carry line breaks here). */
export function tagLine(label: string, value: string): string {
  return `${label}: ${value.replace(/[\r\n]+/g, " ")}\n`;
}

function hashing(onDone: (sha256: string, bytes: number) => void, onChunk?: (bytes: number) => void): Transform {
  const hash = createHash("sha256");
  let bytes = 0;
  return new Transform({
    transform(chunk: Buffer, _enc, cb) {
      hash.update(chunk);
      bytes += chunk.length;
      onChunk?.(chunk.length);
      cb(null, chunk);
    },
    flush(cb) {
      onDone(hash.digest("hex"), bytes);
      cb();
    },
  });
}

export async function writeBagZip(
  output: Writable,
  bagName: string,
  entries: BagPayloadEntry[],
  tags: BagTags,
  opts: { now: Date; signal?: AbortSignal; onBytes?: (payloadBytesSoFar: number) => void } = { now: new Date() },
): Promise<WrittenBag> {
  const archive = archiver("zip", { zlib: { level: 6 } });
  let zipSha256 = "";
  let zipBytes = 0;
  const written = pipeline(archive, hashing((sha, n) => ((zipSha256 = sha), (zipBytes = n))), output, opts.signal ? { signal: opts.signal } : {});
  // archiver reports a source's failure as its own error; the pipeline above carries it
  let failed: Error | null = null;
  archive.on("warning", (err) => (failed ??= err));
  archive.on("error", (err) => (failed ??= err));
  written.catch((err) => (failed ??= err));

  const date = opts.now;
  const root = bagName.replace(/\/+$/, "");
  const tagSums = new Map<string, string>();

  /** Appends one entry and resolves once archiver has taken all of it (its "entry" event). */
  const add = (name: string, source: Readable | Buffer, store: boolean) =>
    new Promise<void>((resolve, reject) => {
      const full = `${root}/${name}`;
      const onEntry = (e: archiver.EntryData) => {
        if (e.name !== full) return;
        archive.off("entry", onEntry);
        resolve();
      };
      archive.on("entry", onEntry);
      if (!Buffer.isBuffer(source)) source.once("error", (err) => ((failed ??= err), archive.off("entry", onEntry), reject(err)));
      archive.append(source, { name: full, date, store });
      const check = setInterval(() => {
        if (failed) {
          clearInterval(check);
          archive.off("entry", onEntry);
          reject(failed);
        }
      }, 200);
      archive.once("entry", () => clearInterval(check));
    });
  const addTag = async (name: string, text: string) => {
    const bytes = Buffer.from(text, "utf8");
    tagSums.set(name, createHash("sha256").update(bytes).digest("hex"));
    await add(name, bytes, false);
  };

  const manifest = new Map<string, string>();
  let payloadBytes = 0;
  try {
    // bagit.txt first, so a reader of the listing sees what this is (RFC 8493 2.1.1)
    await addTag("bagit.txt", "BagIt-Version: 1.0\nTag-File-Character-Encoding: UTF-8\n");
    for (const entry of entries) {
      if (opts.signal?.aborted) throw new Error("cancelled");
      const dataPath = `data/${entry.path}`;
      let sha = "";
      let n = 0;
      let reported = payloadBytes;
      const through = hashing(
        (s, bytes) => ((sha = s), (n = bytes)),
        (bytes) => opts.onBytes?.((reported += bytes)),
      );
      const source = entry.open();
      source.on("error", (err) => through.destroy(err));
      source.pipe(through);
      await add(dataPath, through, entry.store ?? false);
      if (entry.expectSha256 && entry.expectSha256 !== sha) throw new PayloadMismatchError(dataPath, entry.expectSha256, sha);
      manifest.set(dataPath, sha);
      payloadBytes += n;
    }
    const bagInfo = [...tags.bagInfo, ["Bagging-Date", date.toISOString().slice(0, 10)] as [string, string], ["Payload-Oxum", `${payloadBytes}.${manifest.size}`] as [string, string]];
    await addTag("bag-info.txt", bagInfo.map(([k, v]) => tagLine(k, v)).join(""));
    await addTag("manifest-sha256.txt", [...manifest].map(([p, s]) => manifestLine(s, p)).join(""));
    await addTag("README.txt", tags.readme);
    // the tag manifest covers every tag file written before it (RFC 8493 2.2.1)
    await add("tagmanifest-sha256.txt", Buffer.from([...tagSums].map(([p, s]) => manifestLine(s, p)).join(""), "utf8"), false);
    await archive.finalize();
    await written;
  } catch (err) {
    archive.abort();
    output.destroy();
    await written.catch(() => {});
    throw err;
  }
  if (failed) throw failed;
  return { payloadFiles: manifest.size, payloadBytes, manifest, zipSha256, zipBytes };
}
