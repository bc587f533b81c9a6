// Names of profiles and levels, from ITU-T H.264 Annex A (A.2 profiles, A.3 levels).

import type { Sps } from "./parse-sps";

type ProfileFields = Pick<Sps, "profileIdc" | "constraintFlags" | "levelIdc">;

/**
 * Profile name as Annex A spells it. profile_idc alone is not enough: constraint_set1_flag turns
 * Baseline into Constrained Baseline (A.2.1.1), constraint_set3_flag marks the Intra profiles
 * (A.2.8..A.2.10), constraint_set4/5 the Progressive and Constrained High profiles (A.2.4.1, A.2.4.2).
 */
export function describeProfile(sps: ProfileFields): string {
  const [, set1, , set3, set4, set5] = sps.constraintFlags;
  switch (sps.profileIdc) {
    case 66:
      return set1 ? "Constrained Baseline" : "Baseline";
    case 77:
      return "Main";
    case 88:
      return "Extended";
    case 100:
      if (set4 && set5) return "Constrained High";
      return set4 ? "Progressive High" : "High";
    case 110:
      if (set3) return "High 10 Intra";
      return set4 ? "Progressive High 10" : "High 10";
    case 122:
      return set3 ? "High 4:2:2 Intra" : "High 4:2:2";
    case 244:
      return set3 ? "High 4:4:4 Intra" : "High 4:4:4 Predictive";
    case 44:
      return "CAVLC 4:4:4 Intra";
    case 83:
      return "Scalable Baseline";
    case 86:
      return "Scalable High";
    case 118:
      return "Multiview High";
    case 128:
      return "Stereo High";
    case 134:
      return "MFC High";
    case 135:
      return "MFC Depth High";
    case 138:
      return "Multiview Depth High";
    case 139:
      return "Enhanced Multiview Depth High";
    default:
      return `profile_idc ${sps.profileIdc}`;
  }
}

/**
 * Level as written in Table A-1 ("1b", "2.1", "3"). level_idc is ten times the level number, except
 * level 1b: level_idc 9, or level_idc 11 with constraint_set3_flag in Baseline, Main and Extended.
 */
export function describeLevel(sps: ProfileFields): string {
  const idc = sps.levelIdc;
  if (idc === 9) return "1b";
  if (idc === 11 && sps.constraintFlags[3] && (sps.profileIdc === 66 || sps.profileIdc === 77 || sps.profileIdc === 88)) {
    return "1b";
  }
  const major = Math.floor(idc / 10);
  const minor = idc % 10;
  return minor === 0 ? `${major}` : `${major}.${minor}`;
}
