// /invite/:token: the page an invitation mail links to. A new person chooses a name and password;
// someone with an account joins. Stale links say why and what to do.
import Link from "next/link";
import { describeInvitation } from "@/lib/members/invitations";
import { ROLE_LABELS } from "@/lib/auth/permissions";
import { AcceptInvitationForm } from "@/components/work/accept-invitation-form";

export const dynamic = "force-dynamic";
export const metadata = { title: "Invitation", robots: { index: false } };

const STALE = {
  unknown: "This invitation link is not valid. Check that the whole link was copied from the mail.",
  accepted: "This invitation was already used. Sign in with the account it created.",
  revoked: "This invitation was withdrawn. Ask an owner of the organisation for a new one.",
  expired: "This invitation has expired (links work for 7 days). Ask an owner of the organisation for a new one.",
} as const;

export default async function InvitePage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const inv = await describeInvitation(token);
  if (inv.state !== "pending") {
    return (
      <div className="flex flex-col gap-3">
        <h1 className="text-xl font-semibold">Invitation</h1>
        <p role="alert" className="rounded-md border border-bad bg-bad-soft px-3 py-2 text-sm">
          {STALE[inv.state]}
        </p>
        <Link href="/sign-in" className="text-sm text-lake underline">
          Go to sign-in
        </Link>
      </div>
    );
  }
  const role = ROLE_LABELS[inv.role];
  return (
    <div className="flex flex-col gap-4">
      <h1 className="text-xl font-semibold">Join {inv.organisationName}</h1>
      <p className="text-sm">
        You were invited as <strong>{role.label.toLowerCase()}</strong>: {role.meaning}
      </p>
      <p className="text-xs text-ink-2">
        For <span className="font-medium">{inv.email}</span> · link valid until <span className="font-mono">{inv.expiresAt.toISOString().slice(0, 10)}</span>
      </p>
      <AcceptInvitationForm token={token} email={inv.email} organisationName={inv.organisationName} hasAccount={inv.hasAccount} />
    </div>
  );
}
