// The order of a flight's files. A recorder that closes a file when the link degrades and opens a
// new one when it recovers numbers its files (REC_0009, REC_0010...) and stamps each with the time it
// was closed. The "recorder order" reads those: by modification time when every file has a distinct
// one, else by file name compared numerically (so 10 comes after 9), which also survives a recorder
// whose clock was never set. The flight order is sequenceIndex (placed at upload by file time,
// editable by the pilot), with the recorder order breaking ties.

export interface FlightFile {
  id: string;
  originalName: string;
  relativePath?: string | null;
  recorderModifiedAt: Date | null;
  sequenceIndex: number;
}

// Numeric collation: digit runs compare as numbers ("clip2" < "clip10"); case and accents ignored.
const collator = new Intl.Collator("en", { numeric: true, sensitivity: "base" });

export function compareRecorderNames(a: string, b: string): number {
  return collator.compare(a, b);
}

const nameOf = (f: FlightFile) => f.relativePath || f.originalName;

export function recorderOrder<T extends FlightFile>(files: readonly T[]): T[] {
  const times = files.map((f) => f.recorderModifiedAt?.getTime());
  const timed = times.every((t) => typeof t === "number" && Number.isFinite(t)) && new Set(times).size === times.length;
  return [...files].sort((a, b) => {
    if (timed) {
      const d = a.recorderModifiedAt!.getTime() - b.recorderModifiedAt!.getTime();
      if (d !== 0) return d;
    }
    return compareRecorderNames(nameOf(a), nameOf(b)) || a.id.localeCompare(b.id);
  });
}

export function flightOrder<T extends FlightFile>(files: readonly T[]): T[] {
  const rank = new Map(recorderOrder(files).map((f, i) => [f.id, i]));
  return [...files].sort((a, b) => a.sequenceIndex - b.sequenceIndex || rank.get(a.id)! - rank.get(b.id)!);
}
