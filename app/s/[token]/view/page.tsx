// /s/:token/view: what the client sees through a share link, no account needed. Every render is
// one recorded open. A link that stopped working (or a passcode not yet entered) sends the visitor
// back to /s/:token, which answers with the right status and page.
import type { Metadata } from "next";
import { headers } from "next/headers";
import { redirect } from "next/navigation";
import { resolveShareLink } from "@/lib/sharing/resolve-share-link";
import { buildShareView } from "@/lib/sharing/build-share-view";
import { isUnlocked } from "@/lib/sharing/share-unlock";
import { factsFromHeaders } from "@/lib/custody/record-custody-event";
import { recordShareOpen } from "@/lib/sharing/record-share-access";
import { ShareViewer } from "@/components/sharing/share-viewer";

export const dynamic = "force-dynamic";

export const metadata: Metadata = {
  title: "Shared inspection evidence",
  robots: { index: false, follow: false },
  referrer: "no-referrer",
};

export default async function SharedEvidencePage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const r = await resolveShareLink(token);
  const h = await headers();
  if (r.kind !== "open" || !isUnlocked(r.link, h.get("cookie"))) redirect(`/s/${token}`);
  await recordShareOpen(r.link, factsFromHeaders(h));
  const view = await buildShareView(r.link);
  return <ShareViewer initialView={view} gatePath={`/s/${token}`} manifestPath={`/api/s/${token}/manifest`} />;
}
