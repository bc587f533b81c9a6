// ITU-T H.264 section 7.4.1.1 (syntax in 7.3.1): inside a NAL unit an encoder writes 0x03 after
// every 0x0000 that would otherwise be followed by 0x00..0x03, so no start code can appear in the
// payload. A decoder drops every emulation_prevention_three_byte (a 0x03 preceded by two zero bytes)
// to recover the RBSP.

function findFirstEscape(src: Uint8Array): number {
  const end = src.length;
  for (let i = 2; i < end; i++) {
    if (src[i] === 0x03 && src[i - 1] === 0x00 && src[i - 2] === 0x00) return i;
  }
  return -1;
}

/**
 * Returns the RBSP bytes of `src` (NAL unit bytes, header included or not). When `src` holds
 * no emulation prevention byte the same array is returned without copying.
 */
export function removeEmulationPrevention(src: Uint8Array): Uint8Array {
  const first = findFirstEscape(src);
  if (first < 0) return src;
  const out = new Uint8Array(src.length - 1);
  out.set(src.subarray(0, first), 0);
  let written = first;
  let zeros = 0;
  for (let i = first + 1; i < src.length; i++) {
    const b = src[i];
    if (zeros >= 2 && b === 0x03) {
      zeros = 0;
      continue;
    }
    out[written++] = b;
    zeros = b === 0 ? zeros + 1 : 0;
  }
  return out.subarray(0, written);
}
