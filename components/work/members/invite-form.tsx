"use client";
// Inviting someone by e-mail with a role (and, for a client account, the clients it sees).
import { useForm, useWatch } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import type { z } from "zod";
import { Button } from "@/components/ui/button";
import { Field, SelectField } from "@/components/ui/field";
import { FormError } from "@/components/ui/panel";
import { ROLE_LABELS } from "@/lib/auth/permissions";
import { ROLES, inviteInput } from "@/lib/validation/members";
import type { Role } from "@/db/schema/types";
import { useSave } from "../use-save";
import { ClientChoices } from "../client-ties";
import type { Notice } from "./member-types";

type InviteValues = z.input<typeof inviteInput>;

export function InviteForm({ onNotice }: { onNotice: (n: Notice) => void }) {
  const form = useForm<InviteValues, unknown, z.output<typeof inviteInput>>({ resolver: zodResolver(inviteInput), defaultValues: { email: "", role: "pilot" } });
  const save = useSave<InviteValues, { email: string; expiresAt: string }>({
    url: "/api/invitations",
    invalidate: ["invitations"],
    setError: form.setError,
    onDone: (r) => {
      onNotice({ kind: "ok", text: `Invitation sent to ${r.email}. The link works once, until ${r.expiresAt.slice(0, 10)}.` });
      form.reset({ email: "", role: form.getValues("role"), clientIds: [] });
    },
  });
  const role = useWatch({ control: form.control, name: "role" }) as Role;
  const clientIds = (useWatch({ control: form.control, name: "clientIds" }) as string[] | undefined) ?? [];
  const e = form.formState.errors;
  return (
    <section aria-labelledby="invite-title" className="rounded-lg border border-line p-4">
      <h2 id="invite-title" className="mb-3 text-lg font-semibold">
        Invite someone
      </h2>
      <form className="flex flex-col gap-3" noValidate onSubmit={form.handleSubmit((v) => save.mutate(v))}>
        <Field label="E-mail" type="email" autoComplete="off" {...form.register("email")} error={e.email?.message} />
        <div className="flex flex-col gap-1">
          <SelectField label="Role" {...form.register("role")} error={e.role?.message}>
            {ROLES.map((r) => (
              <option key={r} value={r}>
                {ROLE_LABELS[r].label}
              </option>
            ))}
          </SelectField>
          {role && ROLE_LABELS[role] && <p className="text-xs text-ink-2">{ROLE_LABELS[role].meaning}</p>}
        </div>
        {role === "client" && (
          <ClientChoices legend="Clients this account sees" value={clientIds} onChange={(ids) => form.setValue("clientIds", ids)} error={e.clientIds?.message} />
        )}
        <FormError error={save.error && !(save.error as { fields?: unknown }).fields ? save.error : null} />
        <Button type="submit" busy={save.isPending}>
          Send invitation
        </Button>
      </form>
    </section>
  );
}
