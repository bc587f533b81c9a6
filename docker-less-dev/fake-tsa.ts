// Local fake time-stamping authority (RFC 3161 over HTTP, section 3.4): answers every
// application/timestamp-query with a token made by `openssl ts -reply`. On first start it makes,
// under .data/tsa, a CA and a TSA certificate signed by it (extendedKeyUsage critical timeStamping,
// which RFC 3161 2.3 requires), and an `openssl ts` configuration. Loopback only; for development and
// tests. Production points TSA_URL at a real authority.
//
//   npx tsx docker-less-dev/fake-tsa.ts        (CAIRN_TSA_PORT, default 3399; CAIRN_TSA_DIR, default .data/tsa)
//
// Tests start one in-process with startFakeTsa({ port: 0, dir }).
import http from "node:http";
import type { AddressInfo } from "node:net";
import { execFile } from "node:child_process";
import { existsSync, mkdirSync, writeFileSync } from "node:fs";
import { mkdtemp, readFile, rm, writeFile } from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import { promisify } from "node:util";

const run = promisify(execFile);
const MAX_QUERY_BYTES = 16 * 1024; // a TimeStampReq is ~60 bytes; anything this big is not one

export type FakeTsaFiles = { dir: string; caCert: string; tsaCert: string; tsaKey: string; config: string };

/** Makes the CA, the TSA certificate and the openssl ts configuration in `dir` unless they are there. */
export async function ensureTsaFiles(dir: string): Promise<FakeTsaFiles> {
  const files: FakeTsaFiles = {
    dir,
    caCert: path.join(dir, "ca.crt"),
    tsaCert: path.join(dir, "tsa.crt"),
    tsaKey: path.join(dir, "tsa.key"),
    config: path.join(dir, "tsa.cnf"),
  };
  if (existsSync(files.tsaCert) && existsSync(files.config)) return files;
  mkdirSync(dir, { recursive: true, mode: 0o700 });
  const caKey = path.join(dir, "ca.key");
  const ec = ["-newkey", "ec", "-pkeyopt", "ec_paramgen_curve:P-256", "-nodes"];
  await run("openssl", ["req", "-x509", ...ec, "-keyout", caKey, "-out", files.caCert, "-days", "3650", "-subj", "/CN=Cairn local test CA",
    "-addext", "basicConstraints=critical,CA:TRUE", "-addext", "keyUsage=critical,keyCertSign,cRLSign"]);
  const csr = path.join(dir, "tsa.csr");
  await run("openssl", ["req", "-new", ...ec, "-keyout", files.tsaKey, "-out", csr, "-subj", "/CN=Cairn local time-stamping authority"]);
  const ext = path.join(dir, "tsa-ext.cnf");
  writeFileSync(ext, "basicConstraints=critical,CA:FALSE\nkeyUsage=critical,digitalSignature,nonRepudiation\nextendedKeyUsage=critical,timeStamping\n");
  await run("openssl", ["x509", "-req", "-in", csr, "-CA", files.caCert, "-CAkey", caKey, "-CAcreateserial", "-out", files.tsaCert, "-days", "3650", "-extfile", ext]);
  writeFileSync(path.join(dir, "serial"), "01\n");
  // The policy OID is the example of OpenSSL's own ts configuration (openssl.cnf, section tsa_config1).
  writeFileSync(
    files.config,
    [
      "[ tsa ]",
      "default_tsa = tsa_config1",
      "[ tsa_config1 ]",
      `serial = ${path.join(dir, "serial")}`,
      "crypto_device = builtin",
      `signer_cert = ${files.tsaCert}`,
      `certs = ${files.caCert}`,
      `signer_key = ${files.tsaKey}`,
      "signer_digest = sha256",
      "default_policy = 1.2.3.4.1",
      "digests = sha256, sha384, sha512",
      "accuracy = secs:1",
      "ordering = yes",
      "tsa_name = yes",
      "ess_cert_id_chain = no",
      "ess_cert_id_alg = sha256",
      "",
    ].join("\n"),
  );
  return files;
}

export async function startFakeTsa(options: { port?: number; dir: string }): Promise<{ url: string; files: FakeTsaFiles; close: () => Promise<void> }> {
  const files = await ensureTsaFiles(options.dir);
  // openssl keeps the serial number in a file: one reply at a time
  let queue: Promise<unknown> = Promise.resolve();
  const reply = (query: Buffer) => {
    const next = queue.then(async () => {
      const work = await mkdtemp(path.join(os.tmpdir(), "cairn-tsa-"));
      try {
        await writeFile(path.join(work, "q.tsq"), query);
        await run("openssl", ["ts", "-reply", "-config", files.config, "-queryfile", path.join(work, "q.tsq"),
          "-signer", files.tsaCert, "-inkey", files.tsaKey, "-out", path.join(work, "r.tsr")]);
        return await readFile(path.join(work, "r.tsr"));
      } finally {
        await rm(work, { recursive: true, force: true });
      }
    });
    queue = next.catch(() => {});
    return next;
  };
  const server = http.createServer((req, res) => {
    if (req.method !== "POST" || req.headers["content-type"] !== "application/timestamp-query") {
      res.writeHead(415, { "content-type": "text/plain" }).end("POST an application/timestamp-query (RFC 3161 3.4)\n");
      return;
    }
    const parts: Buffer[] = [];
    let size = 0;
    req.on("data", (c: Buffer) => {
      size += c.length;
      if (size > MAX_QUERY_BYTES) req.destroy();
      else parts.push(c);
    });
    req.on("end", () => {
      reply(Buffer.concat(parts))
        .then((tsr) => res.writeHead(200, { "content-type": "application/timestamp-reply", "content-length": tsr.length }).end(tsr))
        .catch((err: Error) => res.writeHead(400, { "content-type": "text/plain" }).end(`${err.message.split("\n")[0]}\n`));
    });
  });
  await new Promise<void>((resolve) => server.listen(options.port ?? 0, "127.0.0.1", resolve));
  const { port } = server.address() as AddressInfo;
  return {
    url: `http://127.0.0.1:${port}/`,
    files,
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}

if (process.argv[1] && path.resolve(process.argv[1]) === path.resolve(__filename)) {
  const port = Number(process.env.CAIRN_TSA_PORT ?? 3399);
  const dir = process.env.CAIRN_TSA_DIR ?? path.resolve(process.cwd(), process.env.CAIRN_DATA_DIR ?? ".data", "tsa");
  startFakeTsa({ port, dir }).then(({ url }) => {
    console.log(`fake time-stamping authority on ${url} (certificates in ${dir})`);
    const stop = () => process.exit(0);
    process.on("SIGTERM", stop);
    process.on("SIGINT", stop);
  });
}
