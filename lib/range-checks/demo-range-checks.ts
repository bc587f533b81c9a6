// Invented range checks for the demo flights (docs/product-rules.md, demo scenario): every figure here is made
// up to give the chart something to compare; none was measured. The slant range and coordinates are
// computed from the invented distance, bearing and height exactly as the API would compute them.
import type { InferInsertModel } from "drizzle-orm";
import type { rangeChecks } from "@/db/schema";
import { DEMO_FLIGHTS } from "@/db/seed/demo-scenario";
import { computeRangeCheckFigures } from "./compute-range-check";
import type { LinkEvent } from "./link-events";

type DemoFlightKey = (typeof DEMO_FLIGHTS)[number]["key"];

type DemoCheck = {
  flight: DemoFlightKey;
  event: LinkEvent;
  groundDistanceM: number;
  bearingDeg: number;
  heightAglM: number;
  antenna: string;
  camera: string;
  firmware: string;
  notes?: string;
};

// invented numbers, no measurement behind them
const DEMO_CHECKS: readonly DemoCheck[] = [
  // valve tower, first battery: camera pitched up, link fades behind the tower to the south-west
  { flight: "tower-f1", event: "first_degradation", groundDistanceM: 412, bearingDeg: 214, heightAglM: 42, antenna: "Vertical", camera: "Pitched up 20°", firmware: "demo-fw 2.1.0", notes: "Break-up as the tower came between aircraft and pilot." },
  { flight: "tower-f1", event: "total_loss", groundDistanceM: 538, bearingDeg: 219, heightAglM: 40, antenna: "Vertical", camera: "Pitched up 20°", firmware: "demo-fw 2.1.0" },
  { flight: "tower-f1", event: "reacquired", groundDistanceM: 465, bearingDeg: 221, heightAglM: 55, antenna: "Vertical", camera: "Pitched up 20°", firmware: "demo-fw 2.1.0", notes: "Climbed to clear the tower; picture back." },
  // valve tower, second battery: same airframe, camera pitched down for the roof
  { flight: "tower-f2", event: "first_degradation", groundDistanceM: 356, bearingDeg: 208, heightAglM: 38, antenna: "Vertical", camera: "Pitched down 30°", firmware: "demo-fw 2.1.0" },
  { flight: "tower-f2", event: "total_loss", groundDistanceM: 471, bearingDeg: 212, heightAglM: 36, antenna: "Vertical", camera: "Pitched down 30°", firmware: "demo-fw 2.1.0" },
  { flight: "tower-f2", event: "reacquired", groundDistanceM: 398, bearingDeg: 210, heightAglM: 44, antenna: "Vertical", camera: "Pitched down 30°", firmware: "demo-fw 2.1.0" },
  // footbridge: ducted quad under the deck, antenna laid horizontal
  { flight: "bridge-f1", event: "first_degradation", groundDistanceM: 148, bearingDeg: 96, heightAglM: 6, antenna: "Horizontal", camera: "Level", firmware: "demo-fw 1.8.4", notes: "Under the deck: steel and water." },
  { flight: "bridge-f1", event: "total_loss", groundDistanceM: 187, bearingDeg: 99, heightAglM: 5, antenna: "Horizontal", camera: "Level", firmware: "demo-fw 1.8.4" },
  { flight: "bridge-f1", event: "reacquired", groundDistanceM: 162, bearingDeg: 97, heightAglM: 12, antenna: "Horizontal", camera: "Level", firmware: "demo-fw 1.8.4" },
  // solar array: open ground, long rows, camera level
  { flight: "solar-f1", event: "first_degradation", groundDistanceM: 684, bearingDeg: 121, heightAglM: 40, antenna: "Vertical", camera: "Level", firmware: "demo-fw 3.0.2" },
  { flight: "solar-f1", event: "total_loss", groundDistanceM: 812, bearingDeg: 118, heightAglM: 40, antenna: "Vertical", camera: "Level", firmware: "demo-fw 3.0.2" },
  { flight: "solar-f1", event: "reacquired", groundDistanceM: 741, bearingDeg: 119, heightAglM: 40, antenna: "Vertical", camera: "Level", firmware: "demo-fw 3.0.2" },
];

/**
 * Rows ready for `tx.insert(rangeChecks).values(...)`. `flightIds` maps each DEMO_FLIGHTS key to the
 * id the seed gave that flight; flights missing from the map get no range checks.
 */
export function demoRangeChecks(
  organisationId: string,
  flightIds: Partial<Record<DemoFlightKey, string>>,
  createdBy: string | null = null,
): InferInsertModel<typeof rangeChecks>[] {
  const rows: InferInsertModel<typeof rangeChecks>[] = [];
  for (const check of DEMO_CHECKS) {
    const flightId = flightIds[check.flight];
    if (!flightId) continue;
    const flight = DEMO_FLIGHTS.find((f) => f.key === check.flight)!;
    const figures = computeRangeCheckFigures(
      { lat: flight.launch[0], lon: flight.launch[1] },
      { by: "distance", groundDistanceM: check.groundDistanceM, bearingDeg: check.bearingDeg },
      check.heightAglM,
    );
    rows.push({
      organisationId,
      flightId,
      event: check.event,
      ...figures,
      antennaOrientation: check.antenna,
      cameraOrientation: check.camera,
      aircraft: flight.aircraft,
      firmware: check.firmware,
      notes: check.notes ?? null,
      createdBy,
    });
  }
  return rows;
}
