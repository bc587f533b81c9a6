// A finding's note as the reviewer typed it. React renders it as text: markup in a note shows as
// the characters typed, never as HTML.
export function FindingNote({ note, className = "" }: { note: string; className?: string }) {
  if (!note) return <p className={`text-xs italic text-ink-2 ${className}`}>No note</p>;
  return <p className={`whitespace-pre-wrap break-words text-sm ${className}`} data-testid="finding-note">{note}</p>;
}
