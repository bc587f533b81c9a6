// Where custody checkpoints are time-stamped and how often they are made.
//   TSA_URL                      an RFC 3161 time-stamping authority (HTTP POST, application/timestamp-query).
//                                Local default: the fake authority docker-less-dev/fake-tsa.ts starts on
//                                127.0.0.1:3399. "off" signs checkpoints without a time-stamp. A production
//                                server without TSA_URL also signs without one (and says so when verifying).
//   CUSTODY_CHECKPOINT_EVERY_MS  how often the worker checks for new events to checkpoint (default 5 min).
//   CUSTODY_PREVIOUS_PUBLIC_KEYS earlier custody public keys (base64url, comma-separated) still trusted for
//                                checkpoints signed before CUSTODY_SIGNING_KEY was changed. Kept in the
//                                environment, not the database, so a database writer cannot add one.
import "server-only";
import { isProductionServer } from "@/lib/config/env";

export const LOCAL_TSA_URL = "http://127.0.0.1:3399/";
const DEFAULT_EVERY_MS = 5 * 60_000; // 5 min

export function checkpointSettings(e: NodeJS.ProcessEnv = process.env): { tsaUrl: string | null; everyMs: number; previousPublicKeys: string[] } {
  const raw = e.TSA_URL?.trim();
  const tsaUrl = raw === "off" ? null : raw ? new URL(raw).toString() : isProductionServer(e) ? null : LOCAL_TSA_URL;
  const every = Number(e.CUSTODY_CHECKPOINT_EVERY_MS);
  const previousPublicKeys = (e.CUSTODY_PREVIOUS_PUBLIC_KEYS ?? "").split(",").map((k) => k.trim()).filter(Boolean);
  return { tsaUrl, everyMs: Number.isInteger(every) && every >= 1000 ? every : DEFAULT_EVERY_MS, previousPublicKeys };
}
