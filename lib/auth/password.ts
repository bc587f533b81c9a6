// Password hashing with bcrypt, cost 12 (OWASP ASVS 5.0 appendix C asks for cost >= 10).
import bcrypt from "bcryptjs";

export const BCRYPT_COST = 12;
// A real hash of a random string: compared against when the account does not exist, so that
// unknown and known e-mails take the same time.
const DUMMY_HASH = "$2b$12$RsRIGqzLNPVuUyMPpDNi5Ou5KCojlfqfJMT8VDM0oErrH2hvF37ki";

export async function hashPassword(plain: string): Promise<string> {
  return bcrypt.hash(plain, BCRYPT_COST);
}

export async function verifyPassword(plain: string, hash: string | null | undefined): Promise<boolean> {
  const ok = await bcrypt.compare(plain, hash ?? DUMMY_HASH);
  return Boolean(hash) && ok;
}
