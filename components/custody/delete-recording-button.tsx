"use client";
// Deleting a recording's files, for owners: asks to type the file name and a reason, explains what
// stays (the custody trail, the record that it existed) and shows a legal-hold refusal plainly.
// Embed: <DeleteRecordingButton recordingId={id} recordingName={name} />; other roles' attempts are
// refused by the server and logged, so render it for owners only.
import { useState } from "react";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { Panel } from "@/components/ui/panel";
import { fetchJson } from "@/components/fetch-json";

export function DeleteRecordingButton({ recordingId, recordingName, onDeleted }: { recordingId: string; recordingName: string; onDeleted?: () => void }) {
  const qc = useQueryClient();
  const [open, setOpen] = useState(false);
  const [typed, setTyped] = useState("");
  const [reason, setReason] = useState("");
  const del = useMutation({
    mutationFn: () => fetchJson<{ removed: string[] }>(`/api/recordings/${recordingId}/deletion`, { method: "POST", json: { reason } }),
    onSettled: () => qc.invalidateQueries({ queryKey: ["custody"] }),
    onSuccess: () => onDeleted?.(),
  });
  return (
    <>
      <Button variant="danger" onClick={() => setOpen(true)}>
        Delete recording files
      </Button>
      <Panel open={open} title="Delete recording files" onClose={() => setOpen(false)}>
        {del.isSuccess ? (
          <div className="flex flex-col gap-3 text-sm" role="status">
            <p className="font-medium">Deleted. {del.data.removed.length} stored files or folders were removed.</p>
            <p>The custody log keeps the recording&apos;s whole trail, including this deletion.</p>
            <Button variant="secondary" onClick={() => setOpen(false)}>
              Close
            </Button>
          </div>
        ) : (
          <form
            className="flex flex-col gap-4"
            onSubmit={(e) => {
              e.preventDefault();
              del.mutate();
            }}
          >
            <p className="text-sm">
              This removes the original <strong>{recordingName}</strong>, its playable copy, stills and thumbnails from storage. It cannot be undone. The custody
              log keeps every event about it, and records this deletion.
            </p>
            <Field label={`Type the file name to confirm: ${recordingName}`} value={typed} onChange={(e) => setTyped(e.target.value)} autoComplete="off" />
            <Field label="Reason" value={reason} onChange={(e) => setReason(e.target.value)} maxLength={500} />
            {del.error && (
              <p role="alert" className="rounded-md border border-bad bg-bad-soft px-3 py-2 text-sm">
                {del.error.message}
              </p>
            )}
            <Button type="submit" variant="danger" disabled={typed !== recordingName || !reason.trim()} busy={del.isPending}>
              Delete the files
            </Button>
          </form>
        )}
      </Panel>
    </>
  );
}
