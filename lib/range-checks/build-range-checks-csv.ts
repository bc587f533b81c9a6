import { fromMetres } from "@/lib/geo";
import { ALTITUDE_CAUTION_THRESHOLD_M, ALTITUDE_LIMIT_CAUTION, LOCAL_RULES_CAUTION, RADIO_RANGE_CAUTION } from "@/lib/geo/cautions";
import { csvDocument, type CsvValue } from "@/lib/csv/write-csv";
import { LINK_EVENT_META } from "./link-events";
import type { RangeCheckMeasures } from "./range-check-measures";

/** One range check as the export reads it: the stored row plus the names a reader needs around it. */
export type RangeCheckExportRow = RangeCheckMeasures & {
  id: string;
  flownOn: string;
  jobTitle: string;
  siteName: string;
  flightAircraft: string | null;
  recordingName: string | null;
  createdAt: Date | string;
};

/** The last column's header: what the range figures are not, and who decides (lib/geo/cautions.ts). */
export const RANGE_CHECK_CSV_CAUTION = `Caution: ${RADIO_RANGE_CAUTION.summary} ${LOCAL_RULES_CAUTION.summary}`;

// Every length twice, metres and feet, so a reader in either unit never converts by hand; the unit
// is in every header (docs/look.md: units always written).
export const RANGE_CHECK_CSV_HEADER = [
  "Flown on",
  "Job",
  "Site",
  "Link event",
  "Time into recording (s)",
  "Recording",
  "Latitude (deg)",
  "Longitude (deg)",
  "Bearing from launch (deg true)",
  "Ground distance (m)",
  "Ground distance (ft)",
  "Height AGL (m)",
  "Height AGL (ft)",
  "Slant range (m)",
  "Slant range (ft)",
  "Antenna orientation",
  "Camera orientation",
  "Aircraft",
  "Firmware",
  "Notes",
  "Recorded at (UTC)",
  "Range check id",
  // the figures are distances to the aircraft: the radio-range caution travels with the file, in its
  // header (docs/look.md, "Cautions"); a check above the common altitude limit says so in its row
  RANGE_CHECK_CSV_CAUTION,
] as const;

/** Rounds to a fixed number of decimals but stays a number: 3 decimals of a metre is a millimetre. */
const round = (value: number | null, decimals: number): number | null => (value === null ? null : Number(value.toFixed(decimals)));
const metres = (m: number) => round(m, 3);
const feet = (m: number) => round(fromMetres(m, "ft"), 3);

export function rangeCheckCsvRecord(r: RangeCheckExportRow): CsvValue[] {
  return [
    r.flownOn,
    r.jobTitle,
    r.siteName,
    LINK_EVENT_META[r.event].label,
    round(r.atSec, 3),
    r.recordingName,
    // 7 decimals of a degree is about 1 cm on the ground
    round(r.latitude, 7),
    round(r.longitude, 7),
    round(r.bearingDeg, 2),
    metres(r.groundDistanceM),
    feet(r.groundDistanceM),
    metres(r.heightAglM),
    feet(r.heightAglM),
    metres(r.slantRangeM),
    feet(r.slantRangeM),
    r.antennaOrientation,
    r.cameraOrientation,
    r.aircraft ?? r.flightAircraft,
    r.firmware,
    r.notes,
    (typeof r.createdAt === "string" ? new Date(r.createdAt) : r.createdAt).toISOString(),
    r.id,
    r.heightAglM > ALTITUDE_CAUTION_THRESHOLD_M ? `Caution: ${ALTITUDE_LIMIT_CAUTION.summary}` : null,
  ];
}

// Every text field quoted, so a reader never has to guess which cells are text.
export function buildRangeChecksCsv(rows: readonly RangeCheckExportRow[]): string {
  return csvDocument(RANGE_CHECK_CSV_HEADER, rows.map(rangeCheckCsvRecord), "all-text");
}
