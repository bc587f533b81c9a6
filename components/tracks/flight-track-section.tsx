// The flight track as a section of a flight's page (the FlightSection contract of
// components/work/flight-sections.tsx). The range tools are for the crew: a client account sees a note.
import type { FlightDetail } from "@/lib/filing/flights";
import type { Member } from "@/lib/auth/load-member";
import { can } from "@/lib/auth/permissions";
import { FlightTrackPanel } from "./flight-track-panel";

export function FlightTrackSection({ flight, viewer }: { flight: FlightDetail; viewer: Member }) {
  if (!can(viewer.role, "range.read")) return <p className="text-sm text-ink-2">The flight track is kept for the crew.</p>;
  return <FlightTrackPanel flightId={flight.id} canImport={can(viewer.role, "recordings.upload")} canAlign={can(viewer.role, "rangechecks.write")} units={viewer.preferredUnits} />;
}
