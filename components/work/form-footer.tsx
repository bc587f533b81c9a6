"use client";
// The foot of every create/edit panel in the workspace, so the error, the submit button and the
// archive toggle read and behave the same in each: archiving is offered only once a record exists.
import { Button } from "@/components/ui/button";
import { FormError } from "@/components/ui/panel";

export function FormFooter({
  submitLabel,
  save,
  archive,
  record,
}: {
  submitLabel: string;
  save: { isPending: boolean; error: Error | null };
  archive: { isPending: boolean; mutate: (v: { archived: boolean }) => void };
  /** the record being edited; null while creating */
  record: { archivedAt: string | null } | null;
}) {
  return (
    <>
      <FormError error={save.error} />
      <div className="flex gap-2">
        <Button type="submit" busy={save.isPending}>
          {submitLabel}
        </Button>
        {record && (
          <Button type="button" variant="secondary" busy={archive.isPending} onClick={() => archive.mutate({ archived: !record.archivedAt })}>
            {record.archivedAt ? "Restore" : "Archive"}
          </Button>
        )}
      </div>
    </>
  );
}
