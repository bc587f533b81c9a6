// The worker's hourly retention sweep (job "retention-sweep"): disposal reminders that have come due,
// evidence packages past their keep date, and packages whose queued job Redis lost. It never disposes
// of a job: that takes an owner.
import { expirePackages } from "@/lib/evidence-packages/expire-packages";
import { requeueLostPackages } from "@/lib/evidence-packages/requeue-packages";
import { sendDisposalReminders } from "./send-disposal-reminders";

export async function runRetentionSweep(now = new Date()) {
  const reminders = await sendDisposalReminders(now);
  const expired = await expirePackages(now);
  const requeued = await requeueLostPackages(now);
  return { reminders: reminders.length, expiredPackages: expired.length, requeuedPackages: requeued.length };
}
