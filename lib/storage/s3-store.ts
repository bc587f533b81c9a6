// The S3-compatible store (STORAGE_BACKEND=s3): every key is an object in one bucket, below an
// optional prefix, through the AWS SDK for JavaScript v3 (@aws-sdk/client-s3; @aws-sdk/lib-storage
// splits large files into a multipart upload).
//
// Write-once: an original is put with `If-None-Match: *` (a conditional write, which Amazon S3 honours
// since August 2024: the second writer gets 412 Precondition Failed). Stores that ignore the header,
// such as the local development server s3rver, are covered by a HEAD first, which leaves a window
// between the check and the put; production buckets should also turn on S3 Object Lock in compliance
// mode with a retention period, so no one, the application included, can overwrite or delete an
// original before it ends (README, "Several instances").
//
// Replacing a folder is not atomic here: the new files are uploaded first, then what is not among them
// is deleted, so a reader during the swap sees each file either old or new, never half of one.
import "server-only";
import { createReadStream, createWriteStream } from "node:fs";
import { mkdir, readdir, rm, stat, unlink } from "node:fs/promises";
import path from "node:path";
import { PassThrough, Transform, type Readable } from "node:stream";
import { pipeline } from "node:stream/promises";
import {
  CreateBucketCommand,
  DeleteObjectCommand,
  DeleteObjectsCommand,
  GetObjectCommand,
  HeadBucketCommand,
  HeadObjectCommand,
  ListObjectsV2Command,
  S3Client,
  type S3ClientConfig,
} from "@aws-sdk/client-s3";
import { Upload } from "@aws-sdk/lib-storage";
import { AlreadyStored, type ByteRange, type ObjectStore, type StoredObject } from "./object-store";
import { scratchFile } from "./scratch";
import { assertStoreKey } from "./storage-keys";

export type S3StoreOptions = {
  bucket: string;
  /** Prepended to every key ("" for none); lets several installations or test runs share a bucket. */
  keyPrefix: string;
  client: S3ClientConfig;
};

const PART_SIZE = 8 * 1024 * 1024; // lib-storage's minimum is 5 MiB (the S3 limit for all parts but the last)

function statusOf(err: unknown): number | undefined {
  return (err as { $metadata?: { httpStatusCode?: number } })?.$metadata?.httpStatusCode;
}
const isMissing = (err: unknown) => statusOf(err) === 404 || ["NotFound", "NoSuchKey"].includes((err as Error)?.name);

/** Passes on the first `limit` bytes, then ends (and lets the caller stop the source). */
function limitBytes(limit: number, onDone: () => void): Transform {
  let left = limit;
  return new Transform({
    transform(chunk: Buffer, _enc, cb) {
      if (left <= 0) return cb();
      const part = chunk.length > left ? chunk.subarray(0, left) : chunk;
      left -= part.length;
      this.push(part);
      if (left <= 0) {
        this.push(null);
        onDone();
      }
      cb();
    },
  });
}

export class S3Store implements ObjectStore {
  readonly kind = "s3" as const;
  readonly client: S3Client;
  private bucketChecked: Promise<void> | null = null;

  constructor(readonly opts: S3StoreOptions) {
    this.client = new S3Client(opts.client);
  }

  private objectKey(key: string): string {
    assertStoreKey(key);
    return this.opts.keyPrefix ? `${this.opts.keyPrefix}/${key}` : key;
  }

  /** Creates the bucket on first use when it is missing (a local development server starts empty). */
  ensureBucket(): Promise<void> {
    this.bucketChecked ??= (async () => {
      try {
        await this.client.send(new HeadBucketCommand({ Bucket: this.opts.bucket }));
      } catch (err) {
        if (!isMissing(err)) throw err;
        await this.client.send(new CreateBucketCommand({ Bucket: this.opts.bucket })).catch((e) => {
          if (!["BucketAlreadyOwnedByYou", "BucketAlreadyExists"].includes((e as Error).name)) throw e;
        });
      }
    })().catch((err) => {
      this.bucketChecked = null;
      throw err;
    });
    return this.bucketChecked;
  }

  async stat(key: string) {
    await this.ensureBucket();
    try {
      const head = await this.client.send(new HeadObjectCommand({ Bucket: this.opts.bucket, Key: this.objectKey(key) }));
      return { size: Number(head.ContentLength ?? 0) };
    } catch (err) {
      if (isMissing(err)) return null;
      throw err;
    }
  }

  read(key: string, range?: ByteRange): Readable {
    const out = new PassThrough({ highWaterMark: 256 * 1024 });
    const objectKey = this.objectKey(key);
    let source: Readable | null = null;
    out.on("close", () => source?.destroy());
    this.ensureBucket()
      .then(() =>
        this.client.send(
          new GetObjectCommand({ Bucket: this.opts.bucket, Key: objectKey, Range: range ? `bytes=${range.start}-${range.end}` : undefined })
        ),
      )
      .then((res) => {
        source = res.Body as Readable;
        if (out.destroyed) return void source.destroy();
        source.on("error", (err) => out.destroy(err));
        if (range) {
          // Some S3-compatible servers answer more than was asked (s3rver sends the whole object for
          // "bytes=0-0"): check where the answer starts and pass on exactly the requested bytes.
          const m = /^bytes (\d+)-(\d+)\//.exec(res.ContentRange ?? "");
          const from = m ? Number(m[1]) : 0;
          if (from !== range.start) return void out.destroy(new Error(`the store answered bytes from ${from} for a range from ${range.start}`));
          source.pipe(limitBytes(range.end - range.start + 1, () => source?.destroy())).pipe(out);
        } else {
          source.pipe(out);
        }
      })
      .catch((err) => out.destroy(isMissing(err) ? Object.assign(new Error(`no stored object at ${key}`), { code: "ENOENT" }) : err));
    return out;
  }

  private async upload(key: string, sourceFile: string, extra: { IfNoneMatch?: string } = {}) {
    await this.ensureBucket();
    const { size } = await stat(sourceFile);
    const upload = new Upload({
      client: this.client,
      params: { Bucket: this.opts.bucket, Key: this.objectKey(key), Body: createReadStream(sourceFile), ContentLength: size, ...extra },
      partSize: PART_SIZE,
      queueSize: 4,
      leavePartsOnError: false,
    });
    await upload.done();
  }

  async putFile(key: string, sourceFile: string, opts: { consume?: boolean } = {}) {
    await this.upload(key, sourceFile);
    if (opts.consume) await unlink(sourceFile);
  }

  async placeOnce(key: string, sourceFile: string) {
    if (await this.stat(key)) throw new AlreadyStored(key);
    try {
      await this.upload(key, sourceFile, { IfNoneMatch: "*" });
    } catch (err) {
      if (statusOf(err) === 412 || (err as Error).name === "PreconditionFailed") throw new AlreadyStored(key);
      throw err;
    }
    await unlink(sourceFile);
  }

  async takeBack(key: string, destFile: string) {
    await mkdir(path.dirname(destFile), { recursive: true });
    await pipeline(this.read(key), createWriteStream(destFile, { flags: "wx" }));
    await this.removeObject(key);
  }

  private async removeObject(key: string) {
    await this.client.send(new DeleteObjectCommand({ Bucket: this.opts.bucket, Key: this.objectKey(key) }));
  }

  private async removeObjects(keys: string[]) {
    for (let i = 0; i < keys.length; i += 1000) {
      const batch = keys.slice(i, i + 1000);
      const res = await this.client.send(
        new DeleteObjectsCommand({ Bucket: this.opts.bucket, Delete: { Objects: batch.map((k) => ({ Key: this.objectKey(k) })), Quiet: true } }),
      );
      if (res.Errors?.length) throw new Error(`could not delete ${res.Errors.length} object(s), first ${res.Errors[0].Key}: ${res.Errors[0].Message}`);
    }
  }

  async remove(key: string) {
    await this.ensureBucket();
    await this.removeObject(key);
    const below: string[] = [];
    for await (const o of this.list(key)) below.push(o.key);
    if (below.length) await this.removeObjects(below);
  }

  async replaceFolder(prefix: string, fromDir: string) {
    const names = (await readdir(fromDir, { withFileTypes: true })).filter((e) => e.isFile()).map((e) => e.name);
    for (const name of names) await this.upload(`${prefix}/${name}`, path.join(fromDir, name));
    const keep = new Set(names.map((n) => `${prefix}/${n}`));
    const stale: string[] = [];
    for await (const o of this.list(prefix)) if (!keep.has(o.key)) stale.push(o.key);
    if (stale.length) await this.removeObjects(stale);
    await rm(fromDir, { recursive: true, force: true });
  }

  async withLocalCopy<T>(key: string, fn: (file: string) => Promise<T>): Promise<T> {
    const file = await scratchFile(path.basename(key));
    try {
      await pipeline(this.read(key), createWriteStream(file, { flags: "wx", mode: 0o444 }));
      return await fn(file);
    } finally {
      await rm(file, { force: true });
    }
  }

  async *list(prefix: string): AsyncIterable<StoredObject> {
    await this.ensureBucket();
    const full = this.objectKey(prefix.replace(/\/+$/, "")) + "/";
    const strip = this.opts.keyPrefix ? this.opts.keyPrefix.length + 1 : 0;
    let token: string | undefined;
    do {
      const page = await this.client.send(new ListObjectsV2Command({ Bucket: this.opts.bucket, Prefix: full, ContinuationToken: token }));
      for (const o of page.Contents ?? []) {
        if (o.Key) yield { key: o.Key.slice(strip), size: Number(o.Size ?? 0), modifiedAt: o.LastModified ?? new Date(0) };
      }
      token = page.IsTruncated ? page.NextContinuationToken : undefined;
    } while (token);
  }
}
