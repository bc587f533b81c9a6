import { pageMember } from "@/lib/auth/page-member";
import { MembersView } from "@/components/work/members-view";
import { devMailboxEnabled } from "@/app/dev/mailbox/dev-mailbox-enabled";

export const metadata = { title: "Members" };

export default async function MembersPage() {
  const member = await pageMember("members.manage");
  return <MembersView me={member.userId} mailboxHref={devMailboxEnabled() ? "/dev/mailbox" : undefined} />;
}
