// The flight timeline as a section of a flight's page (the FlightSection contract of
// components/work/flight-sections.tsx): every file of the flight in order, gaps marked, re-ordering
// for those allowed to.
import type { FlightDetail } from "@/lib/filing/flights";
import type { Member } from "@/lib/auth/load-member";
import { can } from "@/lib/auth/permissions";
import { FlightTimeline } from "./flight-timeline";

export function FlightTimelineSection({ flight, viewer }: { flight: FlightDetail; viewer: Member }) {
  return <FlightTimeline flightId={flight.id} canReorder={can(viewer.role, "recordings.order")} />;
}
