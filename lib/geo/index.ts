// Public surface of the flight arithmetic: import from "@/lib/geo".
export { GeoInputError } from "./geo-input-error";
export {
  METRES_PER_FOOT,
  METRES_PER_NAUTICAL_MILE,
  METRES_PER_STATUTE_MILE,
  convertLength,
  feetToMetres,
  formatLength,
  fromMetres,
  metresToFeet,
  metresToNauticalMiles,
  metresToStatuteMiles,
  nauticalMilesToMetres,
  statuteMilesToMetres,
  toMetres,
  type Length,
  type LengthUnit,
} from "./units";
export { slantRange, type SlantRangeInput } from "./slant-range";
export { direct, inverse, normalizeBearing, type GeoPoint, type InverseSolution } from "./geodesic";
export { MEAN_EARTH_RADIUS_M, haversineDistanceM } from "./haversine";
export {
  formatCoordinatePair,
  formatDecimalDegrees,
  parseAngle,
  parseCoordinatePair,
  parseLatitude,
  parseLongitude,
  toDms,
  type Axis,
  type Coordinate,
} from "./parse-coordinate";
export {
  ALTITUDE_CAUTION_THRESHOLD_M,
  ALTITUDE_LIMIT_CAUTION,
  CAUTIONS,
  LOCAL_RULES_CAUTION,
  RADIO_RANGE_CAUTION,
  VISUAL_LINE_OF_SIGHT_CAUTION,
  altitudeCautions,
  rangeCheckCautions,
  type Caution,
  type CautionId,
} from "./cautions";
