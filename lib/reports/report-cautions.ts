// The safety cautions the report PDF prints: the altitude caution when any height the report shows
// (a flight's logged maximum, a finding's height above ground) is above the common limit, the
// radio-range caution when the report prints a distance to the aircraft (a finding's ground or slant
// distance from the launch point), and always line of sight and local rules. Each defers to the
// local rules and the pilot in command (lib/geo/cautions.ts).
import {
  ALTITUDE_CAUTION_THRESHOLD_M,
  ALTITUDE_LIMIT_CAUTION,
  LOCAL_RULES_CAUTION,
  RADIO_RANGE_CAUTION,
  VISUAL_LINE_OF_SIGHT_CAUTION,
  type Caution,
} from "@/lib/geo/cautions";

export type ReportFigures = {
  /** every height above ground the report shows, in metres (flights' maxima, findings' heights) */
  heightsM: readonly (number | null | undefined)[];
  /** the report prints at least one distance from the launch point to the aircraft */
  showsDistances: boolean;
};

export function reportCautions(f: ReportFigures): Caution[] {
  const highest = Math.max(0, ...f.heightsM.filter((h): h is number => typeof h === "number" && Number.isFinite(h)));
  return [
    ...(highest > ALTITUDE_CAUTION_THRESHOLD_M ? [ALTITUDE_LIMIT_CAUTION] : []),
    ...(f.showsDistances ? [RADIO_RANGE_CAUTION] : []),
    VISUAL_LINE_OF_SIGHT_CAUTION,
    LOCAL_RULES_CAUTION,
  ];
}
