// /custody/recordings/:id: one recording's custody trail (its own events, its renditions', stills'
// and findings'), the verify action, exports, and for owners the deletion of its files.
import Link from "next/link";
import { notFound } from "next/navigation";
import { pageMember } from "@/lib/auth/page-member";
import { can } from "@/lib/auth/permissions";
import { loadCustodyRecording } from "@/lib/custody/load-custody-subject";
import { PageHeader } from "@/components/ui/page-header";
import { HashText } from "@/components/ui/hash-text";
import { DetailSection } from "@/components/work/detail-section";
import { CustodyLogPanel } from "@/components/custody/custody-log-panel";
import { DeleteRecordingButton } from "@/components/custody/delete-recording-button";

export const metadata = { title: "Recording custody" };

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export default async function RecordingCustodyPage({ params }: { params: Promise<{ id: string }> }) {
  const member = await pageMember("custody.read");
  const { id } = await params;
  const rec = UUID.test(id) ? await loadCustodyRecording(member.organisationId, id) : null;
  if (!rec) notFound();
  return (
    <div className="flex flex-col gap-8">
      <div>
        <Link href={`/custody/jobs/${rec.jobId}`} className="text-sm text-lake underline">
          ← {rec.jobTitle}: custody and sharing
        </Link>
        <PageHeader
          title={`Custody: ${rec.originalName}`}
          actions={can(member.role, "recordings.delete") && !rec.deletedAt && !rec.legalHold ? <DeleteRecordingButton recordingId={rec.id} recordingName={rec.originalName} /> : undefined}
        />
        <dl className="flex flex-wrap gap-6 text-sm">
          <div>
            <dt className="text-xs font-medium uppercase tracking-wide text-ink-2">Original SHA-256</dt>
            <dd>
              <HashText value={rec.sha256} />
            </dd>
          </div>
          <div>
            <dt className="text-xs font-medium uppercase tracking-wide text-ink-2">Size</dt>
            <dd className="font-mono tabular">{rec.sizeBytes.toLocaleString("en-US")} bytes</dd>
          </div>
          <div>
            <dt className="text-xs font-medium uppercase tracking-wide text-ink-2">State</dt>
            <dd>
              {rec.deletedAt ? `Files deleted ${rec.deletedAt.toISOString().slice(0, 10)}; the trail below is kept` : rec.legalHold ? "Kept: the job is under legal hold" : "Stored"}
            </dd>
          </div>
        </dl>
      </div>
      <DetailSection id="custody" title="Custody log">
        <CustodyLogPanel recordingId={rec.id} />
      </DetailSection>
    </div>
  );
}
