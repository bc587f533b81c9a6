// The RFC 3161 pieces we write and read ourselves, checked against OpenSSL's own implementation:
// `openssl ts -query -in` parses our TimeStampReq and prints its fields; `openssl ts -reply` (the
// local fake authority's configuration) makes a TimeStampResp that our reader must read the same
// way `openssl ts -reply -in ... -text` does.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { execFileSync } from "node:child_process";
import { createHash, randomBytes } from "node:crypto";
import { mkdtempSync, rmSync, writeFileSync, readFileSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { buildTimestampRequest, readTimestampResponse } from "@/lib/custody/request-timestamp";
import { ensureTsaFiles, type FakeTsaFiles } from "@/docker-less-dev/fake-tsa";

let dir: string;
let files: FakeTsaFiles;
beforeAll(async () => {
  dir = mkdtempSync(path.join(os.tmpdir(), "cairn-tsq-"));
  files = await ensureTsaFiles(path.join(dir, "tsa"));
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe("TimeStampReq", () => {
  it("OpenSSL reads our request: version 1, SHA-256 imprint, our nonce, certificate required", () => {
    const digest = createHash("sha256").update("cairn checkpoint").digest();
    const nonce = Buffer.from("00f1e2d3c4b5a697", "hex"); // a leading zero byte: the INTEGER must not carry it twice
    const tsq = path.join(dir, "q.tsq");
    writeFileSync(tsq, buildTimestampRequest(digest, nonce));
    const text = execFileSync("openssl", ["ts", "-query", "-in", tsq, "-text"]).toString();
    expect(text).toMatch(/Version: 1/);
    expect(text).toMatch(/Hash Algorithm: sha256/);
    const hex = [...text.matchAll(/^\s+[0-9a-f]{4} - ([0-9a-f -]+)/gm)].map((m) => m[1].replace(/[^0-9a-f]/g, "")).join("");
    expect(hex).toBe(digest.toString("hex"));
    expect(text).toMatch(/Nonce: 0xF1E2D3C4B5A697/);
    expect(text).toMatch(/Certificate required: yes/);
  });
});

describe("TimeStampResp", () => {
  it("our reader finds the imprint, nonce, serial and genTime that OpenSSL prints", () => {
    const digest = createHash("sha256").update(randomBytes(16)).digest();
    const nonce = randomBytes(8);
    const tsq = path.join(dir, "r.tsq");
    const tsr = path.join(dir, "r.tsr");
    writeFileSync(tsq, buildTimestampRequest(digest, nonce));
    execFileSync("openssl", ["ts", "-reply", "-config", files.config, "-queryfile", tsq, "-signer", files.tsaCert, "-inkey", files.tsaKey, "-out", tsr], { stdio: "pipe" });
    const info = readTimestampResponse(readFileSync(tsr));
    const text = execFileSync("openssl", ["ts", "-reply", "-in", tsr, "-text"], { stdio: "pipe" }).toString();
    expect(info.imprintSha256).toBe(digest.toString("hex"));
    expect(info.nonce).toBe(BigInt(`0x${nonce.toString("hex")}`).toString(16));
    expect(text).toContain(`Serial number: 0x${info.serial.toUpperCase().padStart(2, "0")}`);
    // "Time stamp: Dec  2 22:38:01 2026 GMT"
    const stamped = /Time stamp: (.+) GMT/.exec(text)![1];
    expect(info.genTime.toISOString()).toBe(new Date(`${stamped} UTC`).toISOString());
    expect(info.policy).toBe("1.2.3.4.1");
  });

  it("a refusal is reported with the authority's status, and garbage is refused", () => {
    // PKIStatus 2 = rejection (RFC 3161 2.4.2): SEQUENCE { SEQUENCE { INTEGER 2 } }
    expect(() => readTimestampResponse(Buffer.from("30053003020102", "hex"))).toThrow(/PKIStatus 2/);
    expect(() => readTimestampResponse(Buffer.from("3003020100", "hex").subarray(0, 4))).toThrow();
    expect(() => readTimestampResponse(randomBytes(40))).toThrow();
  });
});
