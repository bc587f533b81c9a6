/**
 * One error type for every bad input to the flight arithmetic, so a route handler can turn it into a
 * 422 that names the offending form field instead of guessing from the message text.
 */
export class GeoInputError extends Error {
  /** The name of the input that was refused, e.g. "latitude", "groundDistance", "lat1". */
  readonly field: string;

  constructor(field: string, message: string) {
    super(message);
    this.name = "GeoInputError";
    this.field = field;
  }
}

/** Refuses NaN and ±Infinity, which would otherwise flow silently through Math.* into a displayed figure. */
export function requireFinite(field: string, value: number): number {
  if (typeof value !== "number" || !Number.isFinite(value)) {
    throw new GeoInputError(field, `${field} must be a finite number, got ${String(value)}.`);
  }
  return value;
}

export function requireNonNegative(field: string, value: number): number {
  requireFinite(field, value);
  if (value < 0) {
    throw new GeoInputError(field, `${field} must not be negative, got ${value}.`);
  }
  return value;
}

export function requireLatitude(field: string, value: number): number {
  requireFinite(field, value);
  if (value < -90 || value > 90) {
    throw new GeoInputError(field, `${field} must lie between -90 and 90 degrees, got ${value}.`);
  }
  return value;
}

export function requireLongitude(field: string, value: number): number {
  requireFinite(field, value);
  if (value < -180 || value > 180) {
    throw new GeoInputError(field, `${field} must lie between -180 and 180 degrees, got ${value}.`);
  }
  return value;
}
