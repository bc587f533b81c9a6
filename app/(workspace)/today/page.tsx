// /today: the start page. What needs attention now for this member's role, each item one click from
// where it is handled; signing in lands here (components/auth/sign-in-form.tsx).
import { pageMember } from "@/lib/auth/page-member";
import { listAttention } from "@/lib/attention/list-attention";
import type { Role } from "@/db/schema/types";
import { PageHeader } from "@/components/ui/page-header";
import { StartView } from "@/components/start/start-view";

export const metadata = { title: "Today" };

const INTRO: Record<Role, string> = {
  owner: "What needs you or your crew now: failed or unfinished processing, findings waiting for a report, reports waiting for your approval, share links about to expire and flights still without a recording.",
  pilot: "Your flights still without a recording, and recordings that are processing or failed.",
  reviewer: "Recordings that are processing or failed, and findings not yet in a report.",
  client: "Recordings of your work that are still being processed or could not be processed. Approved reports are on each job's page.",
};

export default async function TodayPage() {
  const member = await pageMember();
  const attention = await listAttention(member);
  return (
    <>
      <PageHeader title="Today" intro={INTRO[member.role]} />
      <StartView initial={attention} />
    </>
  );
}
