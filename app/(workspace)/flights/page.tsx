import { pageMember } from "@/lib/auth/page-member";
import { can } from "@/lib/auth/permissions";
import { FlightsView } from "@/components/work/flights-view";

export const metadata = { title: "Flights" };

export default async function FlightsPage() {
  const member = await pageMember();
  return <FlightsView canWrite={can(member.role, "flights.write")} units={member.preferredUnits} me={{ userId: member.userId, role: member.role }} />;
}
