// The worker's hourly retention sweep (job "retention-sweep"): disposal reminders that have come due,
// and evidence packages past their keep date. It never disposes of a job: that takes an owner.
import { expirePackages } from "@/lib/evidence-packages/expire-packages";
import { sendDisposalReminders } from "./send-disposal-reminders";

export async function runRetentionSweep(now = new Date()) {
  const reminders = await sendDisposalReminders(now);
  const expired = await expirePackages(now);
  return { reminders: reminders.length, expiredPackages: expired.length };
}
