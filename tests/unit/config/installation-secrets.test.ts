// Secrets made on first start: random per installation, private to their owner, read again later,
// the same for processes that start at the same moment.
import { afterEach, describe, expect, it } from "vitest";
import { mkdtempSync, readFileSync, rmSync, statSync, writeFileSync, chmodSync } from "node:fs";
import { execFile } from "node:child_process";
import { promisify } from "node:util";
import os from "node:os";
import path from "node:path";
import { loadInstallationSecrets, SECRET_NAMES } from "@/lib/config/installation-secrets";

const run = promisify(execFile);
const root = path.resolve(__dirname, "../../..");
const dirs: string[] = [];
const tempDir = () => {
  const d = mkdtempSync(path.join(os.tmpdir(), "cairn-secrets-"));
  dirs.push(d);
  return d;
};
afterEach(() => {
  for (const d of dirs.splice(0)) rmSync(d, { recursive: true, force: true });
});

describe("loadInstallationSecrets", () => {
  it("makes 256-bit random secrets on first use, in a file only its owner can read, and reads them again later", () => {
    const file = path.join(tempDir(), "nested", "installation.json");
    const first = loadInstallationSecrets(file);
    for (const name of SECRET_NAMES) {
      // 32 bytes as base64url without padding is 43 characters (RFC 4648 section 5)
      expect(first[name]).toMatch(/^[A-Za-z0-9_-]{43}$/);
      expect(Buffer.from(first[name], "base64url")).toHaveLength(32);
    }
    expect(new Set(SECRET_NAMES.map((n) => first[n])).size).toBe(SECRET_NAMES.length);
    expect(statSync(file).mode & 0o777).toBe(0o600);
    expect(loadInstallationSecrets(file)).toEqual(first);
  });

  it("two installations never share a secret (no value is built into the source)", () => {
    const a = loadInstallationSecrets(path.join(tempDir(), "s.json"));
    const b = loadInstallationSecrets(path.join(tempDir(), "s.json"));
    for (const name of SECRET_NAMES) expect(a[name]).not.toBe(b[name]);
  });

  it("processes that start at the same moment end up with the same secrets", async () => {
    const file = path.join(tempDir(), "installation.json");
    const script = `import { loadInstallationSecrets } from "./lib/config/installation-secrets.ts"; process.stdout.write(JSON.stringify(loadInstallationSecrets(${JSON.stringify(file)})));`;
    const outs = await Promise.all(
      Array.from({ length: 4 }, () => run(path.join(root, "node_modules/.bin/tsx"), ["-e", script], { cwd: root }).then((r) => r.stdout)),
    );
    expect(new Set(outs).size).toBe(1);
    expect(JSON.parse(outs[0])).toEqual(JSON.parse(readFileSync(file, "utf8")));
  });

  it("makes a readable-by-others file private again, and refuses a damaged one with a clear message", () => {
    const file = path.join(tempDir(), "installation.json");
    loadInstallationSecrets(file);
    chmodSync(file, 0o644);
    loadInstallationSecrets(file);
    expect(statSync(file).mode & 0o777).toBe(0o600);
    writeFileSync(file, "{ not json");
    expect(() => loadInstallationSecrets(file)).toThrow(/not valid JSON/);
    writeFileSync(file, JSON.stringify({ NEXTAUTH_SECRET: "short" }));
    expect(() => loadInstallationSecrets(file)).toThrow(/lacks NEXTAUTH_SECRET, MEDIA_SIGNING_KEY, CUSTODY_SIGNING_KEY/);
  });
});

describe("a production server without configured secrets", () => {
  it("the worker refuses to start and says what to set", async () => {
    const env: NodeJS.ProcessEnv = { PATH: process.env.PATH, HOME: process.env.HOME, NODE_ENV: "production", SECRETS_FILE: path.join(tempDir(), "never-made.json") };
    const err = await run(path.join(root, "node_modules/.bin/tsx"), ["worker/main.ts"], { cwd: root, env, timeout: 60_000 }).then(
      () => null,
      (e: { code: number; stderr: string }) => e,
    );
    expect(err).not.toBeNull();
    expect(err!.code).toBe(1);
    expect(err!.stderr).toContain("refuses to run in production without its secrets");
    expect(err!.stderr).toContain("NEXTAUTH_SECRET, MEDIA_SIGNING_KEY, CUSTODY_SIGNING_KEY");
  });
});
