// GPX 1.1 (topografix.com/GPX/1/1, an open standard) read with @xmldom/xmldom: every <trkpt> of every
// <trk>/<trkseg>, in document order, with its lat/lon attributes, <time> and optional <ele>. The XML
// parser reports where a malformed file breaks (line and column); an element keeps its line number, so
// every problem with a point names its line and its number in the track.
import { DOMParser } from "@xmldom/xmldom";
import { checkCoordinates, checkPointOrder, type LocatedPoint } from "./check-track-points";
import { readTrackTime } from "./read-track-time";
import { MAX_PROBLEMS, type ParseResult, type TrackProblem } from "./track-types";

export const GPX_1_1_NAMESPACE = "http://www.topografix.com/GPX/1/1";

type El = { localName: string; namespaceURI: string | null; lineNumber?: number; getAttribute(n: string): string | null; childNodes: ArrayLike<unknown>; textContent: string | null };

function xmlProblems(text: string): { doc: unknown; problems: TrackProblem[] } {
  const problems: TrackProblem[] = [];
  const report = (level: string) => (msg: string) => {
    if (problems.length >= MAX_PROBLEMS) return;
    // xmldom appends the position as "@#[line:N,col:M]"
    const at = /@#\[line:(\d+),col:(\d+)\]/.exec(msg);
    const reason = msg.replace(/\s*@#\[line:\d+,col:\d+\]\s*/g, " ").replace(/^\[xmldom [a-z]+\]\s*/i, "").trim();
    problems.push({ line: at ? Number(at[1]) : null, point: null, reason: `the XML is malformed (${level}): ${reason}` });
  };
  const parser = new DOMParser({ locator: {}, errorHandler: { warning: report("warning"), error: report("error"), fatalError: report("fatal error") } });
  let doc: unknown = null;
  try {
    doc = parser.parseFromString(text, "text/xml");
  } catch (err) {
    if (!problems.length) problems.push({ line: null, point: null, reason: `the XML is malformed: ${(err as Error).message.split("\n")[0]}` });
  }
  return { doc, problems };
}

function children(el: El, name: string): El[] {
  const out: El[] = [];
  for (const n of Array.from(el.childNodes) as El[]) if (n && n.localName === name && n.namespaceURI === GPX_1_1_NAMESPACE) out.push(n);
  return out;
}

export function parseGpx(text: string): ParseResult {
  if (text.includes("\u0000")) return { ok: false, format: "gpx", problems: [{ line: lineOf(text, text.indexOf("\u0000")), point: null, reason: "the file contains a NUL character, which XML does not allow" }] };
  const { doc, problems } = xmlProblems(text);
  if (problems.length || !doc) return { ok: false, format: "gpx", problems: problems.length ? problems : [{ line: null, point: null, reason: "the XML could not be read" }] };
  const root = (doc as { documentElement: El | null }).documentElement;
  if (!root || root.localName !== "gpx" || root.namespaceURI !== GPX_1_1_NAMESPACE) {
    return { ok: false, format: "gpx", problems: [{ line: root?.lineNumber ?? null, point: null, reason: `this is not a GPX 1.1 file: the root element must be <gpx> in the namespace ${GPX_1_1_NAMESPACE}` }] };
  }
  if (root.getAttribute("version") !== "1.1") {
    return { ok: false, format: "gpx", problems: [{ line: root.lineNumber ?? null, point: null, reason: `the <gpx> element says version "${root.getAttribute("version") ?? ""}"; Cairn reads GPX 1.1` }] };
  }

  const raw: { el: El; line: number | null }[] = [];
  for (const trk of children(root, "trk")) for (const seg of children(trk, "trkseg")) for (const pt of children(seg, "trkpt")) raw.push({ el: pt, line: pt.lineNumber ?? null });
  if (!raw.length) return { ok: false, format: "gpx", problems: [{ line: null, point: null, reason: "the file has no track points (<trk><trkseg><trkpt>); routes and waypoints carry no flight times" }] };

  const out: (LocatedPoint & { ele: number | null })[] = [];
  const bad: TrackProblem[] = [];
  let withoutTime = 0;
  raw.forEach(({ el, line }, i) => {
    if (bad.length >= MAX_PROBLEMS) return;
    const point = i + 1;
    const lat = Number(el.getAttribute("lat") ?? "NaN");
    const lon = Number(el.getAttribute("lon") ?? "NaN");
    const latText = el.getAttribute("lat");
    const lonText = el.getAttribute("lon");
    if (latText === null || lonText === null || latText.trim() === "" || lonText.trim() === "") {
      bad.push({ line, point, reason: "the point has no lat or lon attribute" });
      return;
    }
    const coord = checkCoordinates(lat, lon);
    if (coord) {
      bad.push({ line, point, reason: coord });
      return;
    }
    const [timeEl] = children(el, "time");
    if (!timeEl) {
      withoutTime++;
      bad.push({ line, point, reason: "the point has no <time>; a track without times cannot be matched to a recording" });
      return;
    }
    const time = readTrackTime(timeEl.textContent ?? "");
    if (!time.ok) {
      bad.push({ line: timeEl.lineNumber ?? line, point, reason: time.reason });
      return;
    }
    const [eleEl] = children(el, "ele");
    let ele: number | null = null;
    if (eleEl) {
      ele = Number((eleEl.textContent ?? "").trim());
      if (!Number.isFinite(ele) || (eleEl.textContent ?? "").trim() === "") {
        bad.push({ line: eleEl.lineNumber ?? line, point, reason: `the elevation "${(eleEl.textContent ?? "").trim().slice(0, 30)}" is not a number` });
        return;
      }
    }
    out.push({ t: time.ms, lat, lon, h: null, ele, line });
  });
  if (withoutTime === raw.length) return { ok: false, format: "gpx", problems: [{ line: null, point: null, reason: `none of the ${raw.length} track points has a <time>; a track without times cannot be matched to a recording` }] };
  if (bad.length) return { ok: false, format: "gpx", problems: bad };
  const order = checkPointOrder(out);
  if (order.length) return { ok: false, format: "gpx", problems: order };

  // GPX <ele> is an elevation (the schema says metres); the height above launch is measured from the
  // first point, taken as the launch (common practice, no published source)
  const warnings: string[] = [];
  const first = out[0].ele;
  const missingEle = out.filter((p) => p.ele === null).length;
  if (first !== null && missingEle) warnings.push(`${missingEle} of ${out.length} points have no <ele>: their height is unknown`);
  if (first === null && missingEle < out.length) warnings.push("point 1 has no <ele>, so heights above the launch cannot be measured from it: heights are unknown");
  const heightSource = first === null ? "none" : "elevation_minus_first";
  const points = out.map((p) => ({ t: p.t, lat: p.lat, lon: p.lon, h: first === null || p.ele === null ? null : round3(p.ele - first) }));
  if (heightSource === "none") warnings.push("the track has no heights: slant ranges use the flight's logged height");
  return { ok: true, track: { format: "gpx", points, heightSource, warnings } };
}

const round3 = (x: number) => Math.round(x * 1000) / 1000;

function lineOf(text: string, index: number): number {
  let line = 1;
  for (let i = 0; i < index; i++) if (text.charCodeAt(i) === 10) line++;
  return line;
}
