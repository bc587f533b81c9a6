"use client";
// In the user menu, for people who belong to more than one organisation: the one they work in now,
// and a button for each of the others. Switching changes the session (the server checks the
// membership first), then reloads the workspace from the start page of the chosen organisation.
import { useSession } from "next-auth/react";
import { useRouter } from "next/navigation";
import { useRef, useState } from "react";
import { ROLE_LABELS } from "@/lib/auth/permissions";
import type { OrganisationChoice } from "@/lib/auth/organisations-of-user";

export function OrganisationSwitcher({ currentId, organisations }: { currentId: string; organisations: OrganisationChoice[] }) {
  const { update } = useSession();
  const router = useRouter();
  const [pending, setPending] = useState<string | null>(null);
  const [error, setError] = useState<string | null>(null);
  const box = useRef<HTMLDivElement>(null);
  if (organisations.length < 2) return null;

  async function switchTo(o: OrganisationChoice) {
    setPending(o.id);
    setError(null);
    try {
      const session = await update({ organisationId: o.id });
      if ((session?.user as { organisationId?: string } | undefined)?.organisationId !== o.id) {
        setError(`Could not switch to ${o.name}: you may no longer be a member. Reload to see your organisations.`);
        return;
      }
      box.current?.closest("details")?.removeAttribute("open"); // the menu closes on the new workspace
      router.push("/today");
      router.refresh();
    } catch {
      setError("Could not switch: the connection failed. Try again.");
    } finally {
      setPending(null);
    }
  }

  return (
    <div ref={box} className="mt-3 border-t border-line pt-3" data-testid="organisation-switcher">
      <p className="text-xs font-medium uppercase tracking-wide text-ink-2">Organisations</p>
      <ul className="mt-1 flex flex-col gap-1">
        {organisations.map((o) =>
          o.id === currentId ? (
            <li key={o.id} className="rounded-md bg-paper-2 px-3 py-2" aria-current="true">
              <span className="font-medium">{o.name}</span> <span className="text-xs text-ink-2">· {ROLE_LABELS[o.role].label} · working here now</span>
            </li>
          ) : (
            <li key={o.id}>
              <button
                type="button"
                className="w-full rounded-md border border-line px-3 py-2 text-left hover:bg-paper-2 disabled:opacity-60"
                disabled={pending !== null}
                aria-busy={pending === o.id}
                onClick={() => void switchTo(o)}
              >
                {pending === o.id ? `Switching to ${o.name}…` : `Switch to ${o.name}`} <span className="text-xs text-ink-2">· {ROLE_LABELS[o.role].label}</span>
              </button>
            </li>
          ),
        )}
      </ul>
      {error && (
        <p role="alert" className="mt-2 text-xs text-bad">
          {error}
        </p>
      )}
    </div>
  );
}
