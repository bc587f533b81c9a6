// Frame rates are exact ratios because the NTSC-family rates (23.976, 29.97, 59.94) are
// N*1000/1001 and have no finite decimal form: a rate of 29.97 instead of 30000/1001 slips a
// whole frame every ~9 h of video, and frame-exact findings would drift off their pictures.

export interface FrameRate {
  /** frames */
  readonly num: number;
  /** per this many seconds */
  readonly den: number;
}

export const FRAME_RATES = {
  fps23_976: { num: 24000, den: 1001 },
  fps24: { num: 24, den: 1 },
  fps25: { num: 25, den: 1 },
  fps29_97: { num: 30000, den: 1001 },
  fps30: { num: 30, den: 1 },
  fps50: { num: 50, den: 1 },
  fps59_94: { num: 60000, den: 1001 },
  fps60: { num: 60, den: 1 },
} as const satisfies Record<string, FrameRate>;

export function assertFrameRate(rate: FrameRate): void {
  const ok =
    Number.isSafeInteger(rate.num) && Number.isSafeInteger(rate.den) && rate.num > 0 && rate.den > 0;
  if (!ok) throw new RangeError(`frame rate must be positive integers num/den, got ${rate.num}/${rate.den}`);
}

function gcd(a: number, b: number): number {
  while (b !== 0) [a, b] = [b, a % b];
  return a;
}

/** The same rate in lowest terms, so 60/2 and 30/1 compare equal. */
export function reduceFrameRate(rate: FrameRate): FrameRate {
  assertFrameRate(rate);
  const g = gcd(rate.num, rate.den);
  return { num: rate.num / g, den: rate.den / g };
}

export function frameRateToNumber(rate: FrameRate): number {
  return rate.num / rate.den;
}
