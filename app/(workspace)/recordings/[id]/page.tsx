import { notFound } from "next/navigation";
import { pageMember } from "@/lib/auth/page-member";
import { inScope } from "@/lib/auth/client-scope";
import { can } from "@/lib/auth/permissions";
import { loadRecordingPage } from "@/lib/recordings/load-recording-page";
import { loadFindingView } from "@/lib/findings/finding-view";
import { RecordingReview } from "@/components/player/recording-review";

export const metadata = { title: "Recording" };
const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export default async function RecordingPage({ params, searchParams }: { params: Promise<{ id: string }>; searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const member = await pageMember("recordings.read");
  const { id } = await params;
  if (!UUID.test(id)) notFound();
  if (!(await inScope(member, "recording", id.toLowerCase()))) notFound();
  const data = await loadRecordingPage(member.organisationId, id.toLowerCase());
  if (!data) notFound();
  const sp = await searchParams;
  // ?finding= opens at that finding's frame (when it belongs to this recording); ?frame= at a frame
  const linked = typeof sp.finding === "string" && UUID.test(sp.finding) ? await loadFindingView(member.organisationId, sp.finding.toLowerCase()) : null;
  const finding = linked?.recordingId === data.recording.id ? linked : null;
  const frame = finding ? finding.startFrame : typeof sp.frame === "string" && /^\d+$/.test(sp.frame) ? Number(sp.frame) : null;
  return <RecordingReview data={data} viewer={{ userId: member.userId, canWrite: can(member.role, "findings.write") }} initialFrame={frame} initialFindingId={finding?.id ?? null} />;
}
