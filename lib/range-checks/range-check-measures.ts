// What a range check measured and noted, as every reader selects it: the range-check API (and the
// browser's copy of its answer) and the CSV export. The type is what selecting these columns returns,
// so a column added, renamed or retyped here reaches every reader at once.
import type { SelectResultFields } from "drizzle-orm/query-builders/select.types";
import { rangeChecks } from "@/db/schema";

export const rangeCheckMeasureColumns = {
  event: rangeChecks.event,
  atSec: rangeChecks.atSec,
  latitude: rangeChecks.latitude,
  longitude: rangeChecks.longitude,
  groundDistanceM: rangeChecks.groundDistanceM,
  bearingDeg: rangeChecks.bearingDeg,
  heightAglM: rangeChecks.heightAglM,
  slantRangeM: rangeChecks.slantRangeM,
  antennaOrientation: rangeChecks.antennaOrientation,
  cameraOrientation: rangeChecks.cameraOrientation,
  aircraft: rangeChecks.aircraft,
  firmware: rangeChecks.firmware,
  notes: rangeChecks.notes,
};

export type RangeCheckMeasures = SelectResultFields<typeof rangeCheckMeasureColumns>;
