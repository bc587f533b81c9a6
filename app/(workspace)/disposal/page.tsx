import { pageMember } from "@/lib/auth/page-member";
import { PageHeader } from "@/components/ui/page-header";
import { DisposalList } from "@/components/retention/disposal-list";

export const metadata = { title: "Disposal" };

// The owner's retention page: how long closed jobs are kept, and what falls due for disposal.
export default async function DisposalPage() {
  await pageMember("retention.manage");
  return (
    <div className="flex flex-col gap-6">
      <PageHeader
        title="Retention and disposal"
        intro="A closed job's evidence is kept for its retention period, then falls due for disposal. Owners are reminded by e-mail 30 and 7 days ahead and on the day. Nothing is destroyed until an owner confirms here; a legal hold blocks disposal. The custody trail is always kept."
      />
      <DisposalList />
    </div>
  );
}
