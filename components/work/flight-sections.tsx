// The sections that later parts of Cairn add to a flight's page after its facts: the flight's
// recordings (and their flight timeline) and its range checks. Same contract as job-sections.tsx.
import type { ComponentType } from "react";
import type { FlightDetail } from "@/lib/filing/flights";
import type { Member } from "@/lib/auth/load-member";
import { FlightTimelineSection } from "@/components/flight-timeline/flight-timeline-section";
import { FlightRecordingsSection } from "./evidence-sections";
import { FlightTrackSection } from "@/components/tracks/flight-track-section";

export type FlightSectionProps = { flight: FlightDetail; viewer: Member };
export type FlightSection = { id: string; title: string; Component: ComponentType<FlightSectionProps> };

export const FLIGHT_SECTIONS: FlightSection[] = [
  { id: "timeline", title: "Flight timeline", Component: FlightTimelineSection },
  { id: "recordings", title: "Recordings", Component: FlightRecordingsSection },
  { id: "track", title: "Flight track", Component: FlightTrackSection },
];
