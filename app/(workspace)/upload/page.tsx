import { pageMember } from "@/lib/auth/page-member";
import { can } from "@/lib/auth/permissions";
import { env } from "@/lib/config/env";
import { listUploadTargets } from "@/lib/uploads/list-upload-targets";
import { UploadView } from "@/components/upload/upload-view";

export const metadata = { title: "Upload recordings" };

export default async function UploadPage({ searchParams }: { searchParams: Promise<{ jobId?: string; flightId?: string }> }) {
  const member = await pageMember("recordings.upload");
  const { jobId, flightId } = await searchParams;
  return (
    <UploadView
      targets={await listUploadTargets(member.organisationId)}
      canCreateFlight={can(member.role, "flights.write")}
      canTag={can(member.role, "recordings.tag")}
      canDownload={can(member.role, "originals.download")}
      maxFileBytes={env().UPLOAD_MAX_BYTES}
      initialJobId={typeof jobId === "string" ? jobId : undefined}
      initialFlightId={typeof flightId === "string" ? flightId : undefined}
    />
  );
}
