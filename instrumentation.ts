// Runs once when the web server starts (Next.js instrumentation hook): a production server without
// its secrets refuses to start here, with a message that says what to set, instead of at its first
// request (lib/config/env.ts).
export async function register() {
  if (process.env.NEXT_RUNTIME !== "nodejs") return;
  // every request carries the socket address it came from (lib/http/client-address.ts)
  const { installPeerAddress } = await import("@/lib/http/install-peer-address");
  installPeerAddress();
  // Content-Length that Next would drop from media responses (lib/http/content-length-carrier.ts)
  const { installContentLengthCarrier } = await import("@/lib/http/content-length-carrier");
  installContentLengthCarrier();
  const { requireSecrets } = await import("@/lib/config/env");
  requireSecrets();
  // settings that lose acknowledged work in a crash are printed, never fatal (lib/config/check-durability.ts)
  if (process.env.NEXT_PHASE === "phase-production-build") return;
  const { warnAboutDurability } = await import("@/lib/config/check-durability");
  void warnAboutDurability().catch(() => {});
}
