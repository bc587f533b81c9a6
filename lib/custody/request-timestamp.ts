// RFC 3161 time-stamping: builds a TimeStampReq for a SHA-256 digest, posts it to a time-stamping
// authority over HTTP (RFC 3161 section 3.4: application/timestamp-query in, application/timestamp-reply
// out), and reads the answer: its status, and from the token's TSTInfo the message imprint, the nonce,
// the serial number and genTime. The response is kept whole, so anyone can check it later with
// `openssl ts -verify` against the authority's certificates. This reader checks that the token is for
// our digest and our nonce; the authority's CMS signature is checked by `openssl ts -verify`.
import { randomBytes } from "node:crypto";
import {
  children,
  derBoolean,
  derNull,
  derOctetString,
  derOid,
  derSequence,
  derSmallInteger,
  derUnsignedInteger,
  oidToString,
  parseGeneralizedTime,
  readDer,
  type DerNode,
} from "./der";

const OID_SHA256 = "2.16.840.1.101.3.4.2.1"; // RFC 5754
const OID_SIGNED_DATA = "1.2.840.113549.1.7.2"; // RFC 5652
const OID_TST_INFO = "1.2.840.113549.1.9.16.1.4"; // RFC 3161 2.4.2 id-ct-TSTInfo
const REQUEST_TIMEOUT_MS = 15_000;

export type TimestampInfo = { genTime: Date; serial: string; imprintSha256: string; nonce: string | null; policy: string };

/** TimeStampReq (RFC 3161 2.4.1): version 1, SHA-256 imprint, a nonce, certReq TRUE (the TSA's certificate rides along). */
export function buildTimestampRequest(sha256: Buffer, nonce: Buffer): Buffer {
  if (sha256.length !== 32) throw new TypeError("a SHA-256 digest is 32 bytes");
  return derSequence(
    derSmallInteger(1),
    derSequence(derSequence(derOid(OID_SHA256), derNull()), derOctetString(sha256)),
    derUnsignedInteger(nonce),
    derBoolean(true),
  );
}

const intHex = (n: DerNode) => {
  if (n.tag !== 0x02) throw new Error("time-stamp: expected an INTEGER");
  return BigInt(`0x${n.content.toString("hex") || "0"}`).toString(16);
};

/** Reads a TimeStampResp (RFC 3161 2.4.2); throws with the authority's status when it refused. */
export function readTimestampResponse(der: Buffer): TimestampInfo {
  const resp = readDer(der);
  if (resp.end !== der.length) throw new Error("time-stamp: trailing bytes after the response");
  const [statusInfo, token] = children(resp);
  const status = Number(intHex(children(statusInfo)[0]));
  if (status !== 0 && status !== 1) throw new Error(`time-stamp authority refused the request (PKIStatus ${status})`);
  if (!token) throw new Error("time-stamp: granted but no token");
  const [contentType, explicit] = children(token);
  if (oidToString(contentType.content) !== OID_SIGNED_DATA) throw new Error("time-stamp: the token is not CMS SignedData");
  const signedData = children(explicit)[0];
  const encap = children(signedData)[2];
  const [eType, eExplicit] = children(encap);
  if (oidToString(eType.content) !== OID_TST_INFO) throw new Error("time-stamp: the token does not hold a TSTInfo");
  const tstInfo = readDer(children(eExplicit)[0].content);
  const fields = children(tstInfo);
  const [, policy, imprint, serial, genTime, ...rest] = fields;
  const [alg, hashed] = children(imprint);
  if (oidToString(children(alg)[0].content) !== OID_SHA256) throw new Error("time-stamp: the imprint is not SHA-256");
  if (genTime.tag !== 0x18) throw new Error("time-stamp: genTime missing");
  const nonce = rest.find((n) => n.tag === 0x02);
  return {
    genTime: parseGeneralizedTime(genTime.content),
    serial: intHex(serial),
    imprintSha256: hashed.content.toString("hex"),
    nonce: nonce ? intHex(nonce) : null,
    policy: oidToString(policy.content),
  };
}

/** Asks the authority at `url` to stamp `sha256`; returns the whole DER response and what it says. */
export async function requestTimestamp(url: string, sha256: Buffer): Promise<{ response: Buffer; info: TimestampInfo }> {
  const nonce = randomBytes(8);
  const res = await fetch(url, {
    method: "POST",
    headers: { "content-type": "application/timestamp-query", accept: "application/timestamp-reply" },
    body: new Uint8Array(buildTimestampRequest(sha256, nonce)),
    signal: AbortSignal.timeout(REQUEST_TIMEOUT_MS),
  });
  if (!res.ok) throw new Error(`time-stamp authority ${new URL(url).host} answered HTTP ${res.status}`);
  const response = Buffer.from(await res.arrayBuffer());
  const info = readTimestampResponse(response);
  if (info.imprintSha256 !== sha256.toString("hex")) throw new Error("time-stamp: the token stamps another digest");
  if (info.nonce !== BigInt(`0x${nonce.toString("hex")}`).toString(16)) throw new Error("time-stamp: the token's nonce is not ours");
  return { response, info };
}
