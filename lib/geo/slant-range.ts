import { requireNonNegative } from "./geo-input-error";

export { GeoInputError } from "./geo-input-error";

export type SlantRangeInput = {
  /** Horizontal distance from the pilot (or ground antenna) to the point under the aircraft. */
  readonly groundDistance: number;
  /** Height of the aircraft above the ground at the pilot's position. */
  readonly heightAgl: number;
};

/**
 * Straight-line distance from the pilot to the aircraft: the hypotenuse of the right triangle formed by
 * ground distance and height above ground (Pythagoras). Both inputs must be in the same unit, and the
 * result is in that unit; the function never guesses a unit, so callers convert first (see units.ts).
 *
 * Flat-ground model: over the short distances of a visual-line-of-sight flight the Earth's curvature
 * changes the figure by far less than the accuracy of a barometric height.
 */
export function slantRange({ groundDistance, heightAgl }: SlantRangeInput): number {
  requireNonNegative("groundDistance", groundDistance);
  requireNonNegative("heightAgl", heightAgl);
  // Math.hypot avoids overflow/underflow in the squares; irrelevant at drone scale, free to have.
  return Math.hypot(groundDistance, heightAgl);
}
