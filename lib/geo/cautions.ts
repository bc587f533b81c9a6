import { requireFinite } from "./geo-input-error";

/**
 * Safety cautions shown beside altitude, distance and range figures.
 *
 * Cairn records figures; it does not know the airspace, the waivers or authorisations a crew holds,
 * or the conditions on the day. So every text here informs and defers to local regulations and the
 * pilot in command, and none says whether a flight was or is allowed.
 */

export type CautionId = "altitude-limit" | "visual-line-of-sight" | "radio-range" | "local-rules";

export type Caution = {
  readonly id: CautionId;
  /** One line, for a badge or a table cell. */
  readonly summary: string;
  /** A few sentences, for the expanded view. */
  readonly detail: string;
  /** The rules the text paraphrases, so a reader can look them up. */
  readonly sources: readonly string[];
};

export const ALTITUDE_LIMIT_CAUTION: Caution = {
  id: "altitude-limit",
  summary: "Above 120 m (about 400 ft) above ground level, a common altitude limit for drone flights.",
  detail:
    "Many jurisdictions limit drone flights to about 120 m or 400 ft above ground level. " +
    "In the US, 14 CFR 107.51 sets 400 ft AGL, with an allowance within a 400 ft radius of a structure, " +
    "up to 400 ft above its top. In the EU open category, Regulation (EU) 2019/947 Art. 4(1)(e) sets 120 m " +
    "from the closest point of the Earth's surface. Waivers, authorisations or other categories may apply. " +
    "Check the rules that apply where you fly; the pilot in command decides.",
  sources: ["US 14 CFR 107.51", "Regulation (EU) 2019/947, Art. 4(1)(e)"],
};

export const VISUAL_LINE_OF_SIGHT_CAUTION: Caution = {
  id: "visual-line-of-sight",
  summary: "Keep the aircraft within visual line of sight, as local rules commonly require.",
  detail:
    "In the US, 14 CFR 107.31 requires that the aircraft can be seen throughout the flight with vision " +
    "unaided by any device other than corrective lenses, and 14 CFR 107.51 asks for a flight visibility of " +
    "at least 3 statute miles from the control station. Many other jurisdictions have similar rules. " +
    "How far an aircraft stays visible depends on its size, the light and the weather, not on the radio link. " +
    "Check the rules that apply where you fly; the pilot in command decides.",
  sources: ["US 14 CFR 107.31", "US 14 CFR 107.51"],
};

export const RADIO_RANGE_CAUTION: Caution = {
  id: "radio-range",
  summary: "Range figures describe the radio link, not permission to fly that far.",
  detail:
    "A range check shows how far the control and video link held under the conditions of that test; " +
    "antennas, interference, terrain and weather change it from day to day. It does not mean a flight at " +
    "that distance is allowed: visual line of sight, altitude limits, airspace and local rules still apply. " +
    "Check the rules that apply where you fly; the pilot in command decides.",
  sources: ["US 14 CFR 107.31"],
};

export const LOCAL_RULES_CAUTION: Caution = {
  id: "local-rules",
  summary: "Local regulations and the pilot in command decide; these figures are a record, not advice.",
  detail:
    "Cairn computes and records altitude, distance and range figures. It does not know the airspace, the " +
    "permissions held or the conditions on the day, and it does not decide whether a flight may go ahead. " +
    "Follow the regulations that apply where you fly; the pilot in command decides.",
  // 107.19(b): the remote pilot in command is the final authority as to the operation (recalled from memory).
  sources: ["US 14 CFR 107.19(b)"],
};

export const CAUTIONS: readonly Caution[] = [
  ALTITUDE_LIMIT_CAUTION,
  VISUAL_LINE_OF_SIGHT_CAUTION,
  RADIO_RANGE_CAUTION,
  LOCAL_RULES_CAUTION,
];

/**
 * The lower of the two common limits (120 m; 400 ft = 121.92 m), so the caution shows under either
 * rule. A height exactly at the limit does not trigger it: both rules read "at most".
 */
export const ALTITUDE_CAUTION_THRESHOLD_M = 120;

/** Cautions to show beside a height above ground, in metres (convert feet with units.ts first). */
export function altitudeCautions(heightAglM: number): Caution[] {
  requireFinite("heightAglM", heightAglM);
  return heightAglM > ALTITUDE_CAUTION_THRESHOLD_M ? [ALTITUDE_LIMIT_CAUTION, LOCAL_RULES_CAUTION] : [LOCAL_RULES_CAUTION];
}

/** Cautions to show beside a range check: the link caveats always, the altitude one when it applies. */
export function rangeCheckCautions(heightAglM: number): Caution[] {
  const altitude = altitudeCautions(heightAglM).filter((c) => c.id !== "local-rules");
  return [RADIO_RANGE_CAUTION, VISUAL_LINE_OF_SIGHT_CAUTION, ...altitude, LOCAL_RULES_CAUTION];
}
