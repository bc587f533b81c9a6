// Runs once when the web server starts (Next.js instrumentation hook): a production server without
// its secrets refuses to start here, with a message that says what to set, instead of at its first
// request (lib/config/env.ts).
export async function register() {
  if (process.env.NEXT_RUNTIME !== "nodejs") return;
  const { requireSecrets } = await import("@/lib/config/env");
  requireSecrets();
}
