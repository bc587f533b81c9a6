// /custody: the organisation's whole custody log, newest first, paged and filtered, with the verify action and exports.
import { pageMember } from "@/lib/auth/page-member";
import { PageHeader } from "@/components/ui/page-header";
import { CustodyLogPanel } from "@/components/custody/custody-log-panel";

export const metadata = { title: "Custody log" };

export default async function CustodyPage() {
  await pageMember("custody.read");
  return (
    <>
      <PageHeader
        title="Custody log"
        intro="Every handling of evidence in your organisation, newest first: uploads, processing, views, downloads, shares, holds and deletions. Filter by recording, kind of event, person or date. Each event is sealed with a SHA-256 hash that includes the one before it, so a changed or missing event shows up when the chain is verified."
      />
      <CustodyLogPanel />
    </>
  );
}
