// /range/checks?flightId=: range checks of one flight, its signal-trace events, the comparison chart.
import { pageMember } from "@/lib/auth/page-member";
import { can } from "@/lib/auth/permissions";
import { loadRangeFlights } from "@/lib/range-checks/load-range-page-data";
import { RangeChecksView } from "@/components/range/range-checks-view";

export const metadata = { title: "Range checks" };

export default async function RangeChecksPage({ searchParams }: { searchParams: Promise<{ flightId?: string | string[] }> }) {
  const member = await pageMember("range.read");
  const flights = await loadRangeFlights(member.organisationId);
  const wanted = (await searchParams).flightId;
  const flightId = flights.find((f) => f.id === wanted)?.id ?? flights[0]?.id ?? null;
  return <RangeChecksView flights={flights} flightId={flightId} canWrite={can(member.role, "rangechecks.write")} initialUnits={member.preferredUnits} />;
}
