import { GeoInputError, requireLatitude, requireLongitude } from "./geo-input-error";

/**
 * Reads latitude and longitude as pilots and clients type them: decimal degrees ("45.5", "-1.25",
 * "45.5 N"), degrees-minutes-seconds ("45°30'15.5\"N", "45 30 15.5 N") and degrees-decimal-minutes
 * ("N 45 30.25"). 1° = 60′ and 1′ = 60″ (sexagesimal subdivision of the degree, NIST SP 811).
 *
 * Anything ambiguous is refused with a message a person can act on, rather than guessed: a wrong
 * launch point moves every distance and bearing computed from it.
 */

export type Axis = "latitude" | "longitude";

export type Coordinate = { readonly lat: number; readonly lon: number };

const AXIS_LIMIT: Record<Axis, number> = { latitude: 90, longitude: 180 };
const AXIS_LETTERS: Record<Axis, readonly string[]> = { latitude: ["N", "S"], longitude: ["E", "W"] };
const NEGATIVE_LETTERS = new Set(["S", "W"]);

const UNIT_NAMES = ["degrees", "minutes", "seconds"] as const;
const UNIT_MARKS = ["°", "'", '"'] as const;

/** Folds the look-alike characters that phones and word processors substitute for ° ' " and -. */
function normalize(text: string): string {
  return text
    .trim()
    .replace(/[\u00ba\u02da]/g, "°") // masculine ordinal, ring above
    .replace(/''/g, '"')
    .replace(/[\u2032\u2019\u2018\u00b4`]/g, "'") // prime, curly quotes, acute accent, backtick
    .replace(/[\u2033\u201c\u201d]/g, '"') // double prime, curly double quotes
    .replace(/[\u2212\u2013]/g, "-") // minus sign, en dash
    .toUpperCase();
}

type Component = { readonly digits: string; readonly mark: string };

// A number, an optional unit mark, then a boundary: a mark or whitespace must separate two numbers.
const COMPONENT = /^(\d+(?:\.\d+)?|\.\d+)\s*([°'"]?)(?=\s|$|(?<=[°'"]))\s*/;

/** Parses one latitude or one longitude. `field` names the input in the error (defaults to the axis). */
export function parseAngle(text: string, axis: Axis, field: string = axis): number {
  const label = axis === "latitude" ? "Latitude" : "Longitude";
  if (typeof text !== "string" || text.trim() === "") {
    throw new GeoInputError(field, `${label} is empty.`);
  }
  let body = normalize(text);
  // Words ("NaN", "Infinity", "north") would otherwise lose a letter to the hemisphere check below.
  if (/[A-Z]{2,}/.test(body)) {
    throw new GeoInputError(
      field,
      `${label} "${text}" is not a number in degrees; write e.g. 45.5, 45.5 N, 45°30'15.5"N or 45 30.25 N.`,
    );
  }

  // Hemisphere letter, written before or after the number.
  let letter: string | null = null;
  const leading = /^([NSEW])\s*/.exec(body);
  if (leading) {
    letter = leading[1];
    body = body.slice(leading[0].length);
  }
  const trailing = /\s*([NSEW])$/.exec(body);
  if (trailing) {
    if (letter !== null) {
      throw new GeoInputError(field, `${label} "${text}" has two direction letters; write one (N, S, E or W).`);
    }
    letter = trailing[1];
    body = body.slice(0, body.length - trailing[0].length);
  }
  if (letter !== null && !AXIS_LETTERS[axis].includes(letter)) {
    const other = axis === "latitude" ? "a longitude" : "a latitude";
    throw new GeoInputError(
      field,
      `"${letter}" marks ${other}; ${axis} takes ${AXIS_LETTERS[axis].join(" or ")} (latitude is written first).`,
    );
  }

  let negative = false;
  const sign = /^([+-])\s*/.exec(body);
  if (sign) {
    if (letter !== null) {
      throw new GeoInputError(
        field,
        `${label} "${text}" has both a sign and a direction letter; use one or the other (e.g. "-45.5" or "45.5 S").`,
      );
    }
    negative = sign[1] === "-";
    body = body.slice(sign[0].length);
  }
  if (letter !== null && NEGATIVE_LETTERS.has(letter)) negative = true;

  const components: Component[] = [];
  let rest = body;
  while (rest.length > 0) {
    const m = COMPONENT.exec(rest);
    if (!m || components.length === 3) {
      throw new GeoInputError(
        field,
        `${label} "${text}" is not a number in degrees; write e.g. 45.5, 45.5 N, 45°30'15.5"N or 45 30.25 N.`,
      );
    }
    components.push({ digits: m[1], mark: m[2] });
    rest = rest.slice(m[0].length);
  }
  if (components.length === 0) {
    throw new GeoInputError(field, `${label} "${text}" has no number.`);
  }

  const values = components.map((c, i) => {
    if (c.mark !== "" && c.mark !== UNIT_MARKS[i]) {
      throw new GeoInputError(
        field,
        `${label} "${text}" mixes units: the ${ordinal(i)} part is marked ${c.mark} but must be ${UNIT_NAMES[i]}` +
          ` (degrees°, then minutes', then seconds").`,
      );
    }
    if (i < components.length - 1 && c.digits.includes(".")) {
      throw new GeoInputError(
        field,
        `${label} "${text}" mixes units: only the last part may have decimals (45.5°, 45°30.5' or 45°30'15.5", not 45.5°30').`,
      );
    }
    return Number(c.digits);
  });

  const [degrees, minutes = 0, seconds = 0] = values;
  if (minutes >= 60) {
    throw new GeoInputError(field, `${label} "${text}" has ${minutes} minutes; minutes must be below 60.`);
  }
  if (seconds >= 60) {
    throw new GeoInputError(field, `${label} "${text}" has ${seconds} seconds; seconds must be below 60.`);
  }
  const limit = AXIS_LIMIT[axis];
  const magnitude = degrees + minutes / 60 + seconds / 3600;
  if (magnitude > limit) {
    throw new GeoInputError(field, `${label} "${text}" is beyond ${limit}°; ${axis} runs from -${limit} to ${limit}.`);
  }
  // 0 rather than -0, so "0 S" compares and prints as the equator.
  return negative && magnitude !== 0 ? -magnitude : magnitude;
}

function ordinal(i: number): string {
  return ["first", "second", "third"][i] ?? `${i + 1}th`;
}

export const parseLatitude = (text: string): number => parseAngle(text, "latitude");
export const parseLongitude = (text: string): number => parseAngle(text, "longitude");

/**
 * Parses "lat, lon" (comma or semicolon between them), or two hemisphere-lettered halves with no
 * separator ("45°30'15\"N 1°15'00\"W", "N45 30.25 W1 15.00"). Latitude always comes first.
 */
export function parseCoordinatePair(text: string): Coordinate {
  if (typeof text !== "string" || text.trim() === "") {
    throw new GeoInputError("coordinate", "Coordinate is empty; write latitude, longitude (e.g. 45.5, -1.25).");
  }
  const parts = splitPair(text.trim());
  if (!parts) {
    throw new GeoInputError(
      "coordinate",
      `"${text}" is not a latitude, longitude pair; separate them with a comma (e.g. 45.5, -1.25).`,
    );
  }
  return { lat: parseAngle(parts[0], "latitude"), lon: parseAngle(parts[1], "longitude") };
}

function splitPair(text: string): [string, string] | null {
  const separated = text.split(/[,;]/);
  if (separated.length === 2) return [separated[0].trim(), separated[1].trim()];
  if (separated.length > 2) return null;
  // No separator: only hemisphere letters can show where latitude ends.
  const upper = text.toUpperCase();
  const ns = [...upper.matchAll(/[NS]/g)];
  const ew = [...upper.matchAll(/[EW]/g)];
  if (ns.length !== 1 || ew.length !== 1) return null;
  const nsAt = ns[0].index ?? 0;
  const ewAt = ew[0].index ?? 0;
  if (ewAt < nsAt) return null;
  // "N45 30 W1 15": letters lead each half; "45 30 N 1 15 W": letters close each half.
  const cut = nsAt === 0 ? ewAt : nsAt + 1;
  const lat = text.slice(0, cut).trim();
  const lon = text.slice(cut).trim();
  return lat && lon ? [lat, lon] : null;
}

/** Six decimals of a degree is about 0.1 m on the ground: finer than any drone GNSS fix. */
export function formatDecimalDegrees(value: number, decimals = 6): string {
  if (!Number.isFinite(value)) throw new GeoInputError("value", `Cannot format ${String(value)} as degrees.`);
  const text = value.toFixed(decimals);
  // toFixed(-0.0000001) gives "-0.000000"; the sign says nothing there.
  return /^-0(\.0+)?$/.test(text) ? text.slice(1) : text;
}

export function formatCoordinatePair({ lat, lon }: Coordinate, decimals = 6): string {
  requireLatitude("lat", lat);
  requireLongitude("lon", lon);
  return `${formatDecimalDegrees(lat, decimals)}, ${formatDecimalDegrees(lon, decimals)}`;
}

/**
 * Degrees, minutes and seconds with a hemisphere letter, e.g. 45°30'15.5"N. Plain ASCII marks so the
 * text survives copy and paste and reads back through parseAngle. Rounds once, on whole units of the
 * last seconds digit, so 59.96″ carries into the minutes instead of printing 60.0″.
 */
export function toDms(value: number, axis: Axis, secondsDecimals = 1): string {
  if (axis === "latitude") requireLatitude("latitude", value);
  else requireLongitude("longitude", value);
  if (!Number.isInteger(secondsDecimals) || secondsDecimals < 0 || secondsDecimals > 6) {
    throw new GeoInputError("secondsDecimals", `secondsDecimals must be a whole number from 0 to 6, got ${secondsDecimals}.`);
  }
  const scale = 10 ** secondsDecimals;
  const units = Math.round(Math.abs(value) * 3600 * scale);
  const degrees = Math.floor(units / (3600 * scale));
  const minutes = Math.floor((units - degrees * 3600 * scale) / (60 * scale));
  const secondUnits = units - degrees * 3600 * scale - minutes * 60 * scale;
  const seconds = (secondUnits / scale).toFixed(secondsDecimals).padStart(secondsDecimals > 0 ? 3 + secondsDecimals : 2, "0");
  const [positive, negative] = AXIS_LETTERS[axis];
  const letter = value < 0 && units > 0 ? negative : positive;
  return `${degrees}°${String(minutes).padStart(2, "0")}'${seconds}"${letter}`;
}
