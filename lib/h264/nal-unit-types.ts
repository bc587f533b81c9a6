// nal_unit_type values from ITU-T H.264 Table 7-1.

export const NalType = {
  Unspecified0: 0,
  SliceNonIdr: 1,
  SliceDataPartitionA: 2,
  SliceDataPartitionB: 3,
  SliceDataPartitionC: 4,
  SliceIdr: 5,
  Sei: 6,
  Sps: 7,
  Pps: 8,
  AccessUnitDelimiter: 9,
  EndOfSequence: 10,
  EndOfStream: 11,
  FillerData: 12,
  SpsExtension: 13,
  PrefixNal: 14,
  SubsetSps: 15,
  DepthParameterSet: 16,
  AuxiliarySlice: 19,
  SliceExtension: 20,
  SliceExtensionDepth: 21,
} as const;

const NAMES: Record<number, string> = {
  0: "unspecified",
  1: "coded slice of a non-IDR picture",
  2: "coded slice data partition A",
  3: "coded slice data partition B",
  4: "coded slice data partition C",
  5: "coded slice of an IDR picture",
  6: "supplemental enhancement information (SEI)",
  7: "sequence parameter set",
  8: "picture parameter set",
  9: "access unit delimiter",
  10: "end of sequence",
  11: "end of stream",
  12: "filler data",
  13: "sequence parameter set extension",
  14: "prefix NAL unit",
  15: "subset sequence parameter set",
  16: "depth parameter set",
  19: "coded slice of an auxiliary coded picture without partitioning",
  20: "coded slice extension",
  21: "coded slice extension for a depth view component",
};

export function describeNalType(nalUnitType: number): string {
  if (NAMES[nalUnitType]) return NAMES[nalUnitType];
  if (nalUnitType === 17 || nalUnitType === 18 || nalUnitType === 22 || nalUnitType === 23) return "reserved";
  return "unspecified";
}

/** Slice NAL units of the primary coded picture that carry a slice header we parse (types 1, 2, 5). */
export function carriesSliceHeader(nalUnitType: number): boolean {
  return nalUnitType === NalType.SliceNonIdr || nalUnitType === NalType.SliceIdr || nalUnitType === NalType.SliceDataPartitionA;
}

/**
 * Types that Table 7-1 reserves (0 is "unspecified" but no Annex B writer emits it). In a recorded
 * file these come from damage, typically a start code emulated by corrupted slice bytes.
 */
export function isReservedNalType(nalUnitType: number): boolean {
  return nalUnitType === 0 || nalUnitType === 17 || nalUnitType === 18 || nalUnitType === 22 || nalUnitType === 23;
}

/**
 * Section 7.4.1.2.3: the first of these after the last VCL NAL unit of a primary coded picture
 * starts a new access unit.
 */
export function startsNewAccessUnit(nalUnitType: number): boolean {
  return (
    nalUnitType === NalType.AccessUnitDelimiter ||
    nalUnitType === NalType.Sps ||
    nalUnitType === NalType.Pps ||
    nalUnitType === NalType.Sei ||
    (nalUnitType >= 14 && nalUnitType <= 18)
  );
}
