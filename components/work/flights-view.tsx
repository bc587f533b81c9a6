"use client";
// The flights page: every sortie across the organisation's jobs, newest first.
import { useState } from "react";
import { useRouter } from "next/navigation";
import { PageHeader } from "@/components/ui/page-header";
import { Button } from "@/components/ui/button";
import type { Role } from "@/db/schema/types";
import type { AltitudeUnit } from "@/lib/filing/format-altitude";
import { FlightsTable } from "./flights-table";
import { FlightForm } from "./flight-form";

export function FlightsView({ canWrite, units, me }: { canWrite: boolean; units: AltitudeUnit; me: { userId: string; role: Role } }) {
  const [logging, setLogging] = useState(false);
  const router = useRouter();
  return (
    <>
      <PageHeader
        title="Flights"
        intro={`Every sortie flown for a job: date, pilot in command, aircraft, launch point and maximum altitude above ground level (shown in ${units === "ft" ? "feet" : "metres"}).`}
        actions={canWrite && <Button onClick={() => setLogging(true)}>Log flight</Button>}
      />
      <FlightsTable
        units={units}
        empty={{
          title: "No flights logged yet",
          next: canWrite ? "After landing, log the flight against its job; recordings are then filed to it." : "Flights appear here once pilots log them.",
          action: canWrite ? <Button onClick={() => setLogging(true)}>Log flight</Button> : undefined,
        }}
      />
      {logging && <FlightForm row={null} units={units} me={me} onClose={() => setLogging(false)} onSaved={(id) => router.push(`/flights/${id}`)} />}
    </>
  );
}
