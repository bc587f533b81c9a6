// The few pieces of ASN.1 DER (ITU-T X.690, section 10) that an RFC 3161 time-stamp request and
// response need: writing SEQUENCE, INTEGER, OID, OCTET STRING, NULL and BOOLEAN, and reading any
// element as tag + content so a response can be walked field by field. Definite lengths only (DER).

export type DerNode = { tag: number; constructed: boolean; content: Buffer; /** the whole element, tag and length included */ raw: Buffer };

function encodeLength(n: number): Buffer {
  if (n < 0x80) return Buffer.from([n]);
  const bytes: number[] = [];
  for (let v = n; v > 0; v = Math.floor(v / 256)) bytes.unshift(v & 0xff);
  return Buffer.from([0x80 | bytes.length, ...bytes]);
}

export function tlv(tag: number, content: Buffer): Buffer {
  return Buffer.concat([Buffer.from([tag]), encodeLength(content.length), content]);
}

export const derSequence = (...items: Buffer[]) => tlv(0x30, Buffer.concat(items));
export const derOctetString = (bytes: Buffer) => tlv(0x04, bytes);
export const derNull = () => Buffer.from([0x05, 0x00]);
export const derBoolean = (v: boolean) => Buffer.from([0x01, 0x01, v ? 0xff : 0x00]);

/** A non-negative INTEGER from big-endian bytes (a leading 0x00 keeps a high first bit positive). */
export function derUnsignedInteger(bytes: Buffer): Buffer {
  let i = 0;
  while (i < bytes.length - 1 && bytes[i] === 0) i++;
  let body = bytes.subarray(i);
  if (body.length === 0) body = Buffer.from([0]);
  if (body[0] & 0x80) body = Buffer.concat([Buffer.from([0]), body]);
  return tlv(0x02, body);
}

export function derSmallInteger(n: number): Buffer {
  const hex = n.toString(16);
  return derUnsignedInteger(Buffer.from(hex.length % 2 ? `0${hex}` : hex, "hex"));
}

export function derOid(dotted: string): Buffer {
  const parts = dotted.split(".").map(Number);
  const out: number[] = [parts[0] * 40 + parts[1]];
  for (const p of parts.slice(2)) {
    const group: number[] = [];
    let v = p;
    do {
      group.unshift(v & 0x7f);
      v = Math.floor(v / 128);
    } while (v > 0);
    for (let i = 0; i < group.length - 1; i++) group[i] |= 0x80;
    out.push(...group);
  }
  return tlv(0x06, Buffer.from(out));
}

export function oidToString(content: Buffer): string {
  const out = [Math.floor(content[0] / 40), content[0] % 40];
  let v = 0;
  for (const b of content.subarray(1)) {
    v = v * 128 + (b & 0x7f);
    if (!(b & 0x80)) {
      out.push(v);
      v = 0;
    }
  }
  return out.join(".");
}

/** Reads one element at `offset`; throws on truncated or indefinite-length input. */
export function readDer(buf: Buffer, offset = 0): DerNode & { end: number } {
  if (offset + 2 > buf.length) throw new Error("DER: truncated element");
  const first = buf[offset];
  if ((first & 0x1f) === 0x1f) throw new Error("DER: multi-byte tags are not used here");
  let len = buf[offset + 1];
  let p = offset + 2;
  if (len & 0x80) {
    const n = len & 0x7f;
    if (n === 0 || n > 4) throw new Error("DER: unsupported length form");
    if (p + n > buf.length) throw new Error("DER: truncated length");
    len = 0;
    for (let i = 0; i < n; i++) len = len * 256 + buf[p + i];
    p += n;
  }
  if (p + len > buf.length) throw new Error("DER: element runs past the end");
  return { tag: first, constructed: (first & 0x20) !== 0, content: buf.subarray(p, p + len), raw: buf.subarray(offset, p + len), end: p + len };
}

/** The elements inside a constructed element, in order. */
export function children(node: DerNode): DerNode[] {
  if (!node.constructed) throw new Error("DER: not a constructed element");
  const out: DerNode[] = [];
  for (let p = 0; p < node.content.length; ) {
    const c = readDer(node.content, p);
    out.push(c);
    p = c.end;
  }
  return out;
}

/** GeneralizedTime "YYYYMMDDHHMMSS[.fff]Z" (RFC 3161 2.4.2 requires UTC with Z). */
export function parseGeneralizedTime(content: Buffer): Date {
  const s = content.toString("latin1");
  const m = /^(\d{4})(\d{2})(\d{2})(\d{2})(\d{2})(\d{2})(?:\.(\d+))?Z$/.exec(s);
  if (!m) throw new Error(`DER: GeneralizedTime ${JSON.stringify(s)} is not UTC`);
  const ms = m[7] ? Number(m[7].slice(0, 3).padEnd(3, "0")) : 0;
  return new Date(Date.UTC(+m[1], +m[2] - 1, +m[3], +m[4], +m[5], +m[6], ms));
}
