// Secrets of this installation: the session-signing secret, the media-grant key and the custody
// signing seed. A deployment sets them in its environment. A local run (`npm start`, `npm run dev`,
// the tests) that has none gets random values made on first use and kept in one file under the data
// folder, readable by its owner only, and read again on every later start. No usable value is in the
// source, so reading the code never lets anyone sign a session or a media address.
import "server-only";
import { randomBytes } from "node:crypto";
import { chmodSync, closeSync, linkSync, mkdirSync, openSync, readFileSync, statSync, unlinkSync, writeSync } from "node:fs";
import path from "node:path";

export const SECRET_NAMES = ["NEXTAUTH_SECRET", "MEDIA_SIGNING_KEY", "CUSTODY_SIGNING_KEY"] as const;
export type SecretName = (typeof SECRET_NAMES)[number];
export type InstallationSecrets = Record<SecretName, string>;

/** 32 random bytes (256 bits), base64url: the size of an HMAC-SHA-256 key and of an Ed25519 seed (RFC 8032). */
export function newSecretValue(): string {
  return randomBytes(32).toString("base64url");
}

function parse(text: string, file: string): Partial<InstallationSecrets> {
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch {
    throw new Error(`${file} is not valid JSON: fix it, or delete it to make new secrets (every session and share grant then ends)`);
  }
  const out: Partial<InstallationSecrets> = {};
  for (const name of SECRET_NAMES) {
    const v = (data as Record<string, unknown>)?.[name];
    if (typeof v === "string" && v.length >= 32) out[name] = v;
  }
  return out;
}

/**
 * Writes `values` to `file` only if no file is there yet: the content goes to a private temporary file,
 * which is then hard-linked to the final name (link fails when the name exists), so two processes
 * starting at the same moment (web and worker) end up reading the same secrets.
 */
function createOnce(file: string, values: InstallationSecrets): void {
  const tmp = `${file}.${process.pid}.${randomBytes(4).toString("hex")}.tmp`;
  const fd = openSync(tmp, "wx", 0o600);
  try {
    writeSync(fd, JSON.stringify(values, null, 2) + "\n");
  } finally {
    closeSync(fd);
  }
  try {
    linkSync(tmp, file);
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code !== "EEXIST") throw err;
  } finally {
    unlinkSync(tmp);
  }
}

/**
 * The secrets kept in `file`, made on first use. A file that others can read is made private again
 * (mode 0600).
 */
export function loadInstallationSecrets(file: string): InstallationSecrets {
  mkdirSync(path.dirname(file), { recursive: true, mode: 0o700 });
  let stored: Partial<InstallationSecrets>;
  try {
    stored = parse(readFileSync(file, "utf8"), file);
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code !== "ENOENT") throw err;
    const fresh = Object.fromEntries(SECRET_NAMES.map((n) => [n, newSecretValue()])) as InstallationSecrets;
    createOnce(file, fresh);
    stored = parse(readFileSync(file, "utf8"), file);
  }
  const missing = SECRET_NAMES.filter((n) => !stored[n]);
  if (missing.length) throw new Error(`${file} lacks ${missing.join(", ")} (32+ characters each): add them, or delete the file to make new secrets`);
  if ((statSync(file).mode & 0o077) !== 0) chmodSync(file, 0o600);
  return stored as InstallationSecrets;
}
