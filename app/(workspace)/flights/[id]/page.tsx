// A flight's page: its facts, then the sections later parts of Cairn add (components/work/flight-sections.tsx).
import { notFound } from "next/navigation";
import { pageMember } from "@/lib/auth/page-member";
import { inScope } from "@/lib/auth/client-scope";
import type { Member } from "@/lib/auth/load-member";
import { can } from "@/lib/auth/permissions";
import { ApiError } from "@/lib/api/errors";
import { getFlightOrThrow } from "@/lib/filing/flights";
import { FlightDetailView, type FlightDetailData } from "@/components/work/flight-detail-view";
import { FLIGHT_SECTIONS } from "@/components/work/flight-sections";
import { DetailSection } from "@/components/work/detail-section";

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

async function loadFlight(member: Member, id: string) {
  if (!UUID.test(id)) notFound();
  // a client account: only its own clients' work; anything else is "not found"
  if (!(await inScope(member, "flight", id.toLowerCase()))) notFound();
  const orgId = member.organisationId;
  try {
    return await getFlightOrThrow(orgId, id);
  } catch (err) {
    if (err instanceof ApiError && err.code === "not_found") notFound();
    throw err;
  }
}

export async function generateMetadata({ params }: { params: Promise<{ id: string }> }) {
  const member = await pageMember();
  const flight = await loadFlight(member, (await params).id);
  return { title: `Flight ${flight.flownOn}` };
}

export default async function FlightPage({ params }: { params: Promise<{ id: string }> }) {
  const member = await pageMember();
  const flight = await loadFlight(member, (await params).id);
  const data = JSON.parse(JSON.stringify(flight)) as FlightDetailData;
  return (
    <div className="flex flex-col gap-8">
      <FlightDetailView flight={data} canEdit={can(member.role, "flights.write")} units={member.preferredUnits} me={{ userId: member.userId, role: member.role }} />
      {FLIGHT_SECTIONS.map(({ id, title, Component }) => (
        <DetailSection key={id} id={id} title={title}>
          <Component flight={flight} viewer={member} />
        </DetailSection>
      ))}
    </div>
  );
}
