// The short note a player shows after its decode-error safety net acted (attach-decode-recovery.ts):
// where the browser stopped and where playback went on, or that it could not go on from there.
import { formatClockTime } from "@/lib/timecode/format-clock-time";
import type { DecodeRecoveryNote } from "./attach-decode-recovery";

export function DecodeRecoveryMessage({ note, onDismiss }: { note: DecodeRecoveryNote; onDismiss?: () => void }) {
  return (
    <p role="status" data-testid="decode-recovery-note" className="mt-2 flex flex-wrap items-center gap-2 rounded-md border border-line bg-paper-2 px-3 py-2 text-sm">
      <span aria-hidden>⚠︎</span>
      {note.resumedAtSec === null ? (
        <span>
          This browser cannot decode the video near <span className="font-mono tabular">{formatClockTime(note.failedAtSec)}</span>. Seek past it to go on watching.
        </span>
      ) : (
        <span>
          This browser could not decode the video at <span className="font-mono tabular">{formatClockTime(note.failedAtSec)}</span>; playback goes on from{" "}
          <span className="font-mono tabular">{formatClockTime(note.resumedAtSec)}</span>.
        </span>
      )}
      {onDismiss && (
        <button type="button" className="ml-auto rounded px-2 text-ink-2 underline-offset-2 hover:underline" onClick={onDismiss}>
          Dismiss
        </button>
      )}
    </p>
  );
}
