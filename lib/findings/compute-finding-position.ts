// Position columns of a finding: the point itself and, when the flight logged a launch point, how far
// it lies from there (lib/range-checks/finding-distances.ts). Without a launch point the distances stay empty
// rather than being measured from a guessed origin.
import { findingDistances } from "@/lib/range-checks/finding-distances";

export type PositionInput = { latitude: number | null; longitude: number | null; heightAglM: number | null };
export type PositionColumns = PositionInput & { groundDistanceM: number | null; slantDistanceM: number | null };

export function computeFindingPosition(launch: { lat: number; lon: number } | null, p: PositionInput): PositionColumns {
  if (p.latitude === null || p.longitude === null) {
    return { latitude: null, longitude: null, heightAglM: p.heightAglM, groundDistanceM: null, slantDistanceM: null };
  }
  const d = findingDistances(launch, { latitude: p.latitude, longitude: p.longitude, heightAglM: p.heightAglM });
  return { ...p, groundDistanceM: d?.groundDistanceM ?? null, slantDistanceM: d?.slantDistanceM ?? null };
}
