// What each role may do, beside the crew list.
import { ROLE_LABELS } from "@/lib/auth/permissions";
import { ROLES } from "@/lib/validation/members";

export function RoleGuide() {
  return (
    <section aria-labelledby="roles-title" className="rounded-lg border border-line p-4 text-sm">
      <h2 id="roles-title" className="mb-2 font-semibold">
        What each role may do
      </h2>
      <dl className="flex flex-col gap-2">
        {ROLES.map((r) => (
          <div key={r}>
            <dt className="font-medium">{ROLE_LABELS[r].label}</dt>
            <dd className="text-ink-2">{ROLE_LABELS[r].meaning}</dd>
          </div>
        ))}
      </dl>
      <p className="mt-3 text-xs text-ink-2">An organisation always keeps at least one owner.</p>
    </section>
  );
}
