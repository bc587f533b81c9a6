// Local S3-compatible object storage for development and tests: s3rver (npm), keeping its objects
// under .data/s3. Loopback only. Started by docker-less-dev/up.sh when STORAGE_BACKEND=s3 (or when
// the tests ask for it with CAIRN_NEED_S3=1); production points S3_ENDPOINT (or nothing, for Amazon
// S3 itself) at real object storage.
//
//   npx tsx docker-less-dev/fake-s3.ts        (CAIRN_S3_PORT, default 4569; CAIRN_S3_DIR, default .data/s3)
//
// s3rver accepts any credentials; Cairn's local settings use S3RVER / S3RVER. It does not enforce
// conditional writes (If-None-Match) nor Object Lock: lib/storage/s3-store.ts says what covers that.
import { mkdirSync } from "node:fs";
import path from "node:path";
import S3rver from "s3rver";

const port = Number(process.env.CAIRN_S3_PORT ?? 4569);
const directory = path.resolve(process.env.CAIRN_S3_DIR ?? ".data/s3");
mkdirSync(directory, { recursive: true });

const server = new S3rver({ port, address: "127.0.0.1", directory, silent: true });
server.run().then(
  () => console.log(`[fake-s3] listening on 127.0.0.1:${port}, objects in ${directory}`),
  (err: Error) => {
    console.error(`[fake-s3] could not start: ${err.message}`);
    process.exit(1);
  },
);
const stop = () => {
  server.close().finally(() => process.exit(0));
};
process.on("SIGTERM", stop);
process.on("SIGINT", stop);
