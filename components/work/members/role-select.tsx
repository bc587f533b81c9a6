"use client";
// A member's role, changed in place (owners); the server keeps at least one owner.
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { fetchJson } from "@/components/fetch-json";
import { ROLE_LABELS } from "@/lib/auth/permissions";
import { ROLES } from "@/lib/validation/members";
import type { Role } from "@/db/schema/types";
import type { MemberRow, Notice } from "./member-types";

export function RoleSelect({ row, onNotice }: { row: MemberRow; onNotice: (n: Notice) => void }) {
  const qc = useQueryClient();
  const change = useMutation({
    mutationFn: (role: Role) => fetchJson(`/api/members/${row.userId}`, { method: "PATCH", json: { role } }),
    onSuccess: async (_r, role) => {
      onNotice({ kind: "ok", text: `${row.name} is now ${ROLE_LABELS[role].label.toLowerCase()}.` });
      await qc.invalidateQueries({ queryKey: ["members"] });
    },
    onError: (err) => onNotice({ kind: "problem", text: (err as Error).message }),
  });
  return (
    <select
      aria-label={`Role of ${row.name}`}
      className="min-h-9 rounded-md border border-line bg-white px-2 text-sm dark:bg-paper-2"
      value={change.isPending ? change.variables : row.role}
      disabled={change.isPending}
      onChange={(e) => change.mutate(e.target.value as Role)}
    >
      {ROLES.map((r) => (
        <option key={r} value={r}>
          {ROLE_LABELS[r].label}
        </option>
      ))}
    </select>
  );
}
