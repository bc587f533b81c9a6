// Every open and download through a share link leaves two records in one transaction: a row in the
// link's own event list (what the sender sees as opens and downloads) and a custody event (the
// hash-chained log of who handled which evidence).
import "server-only";
import { db } from "@/db/client";
import { shareLinkEvents } from "@/db/schema";
import { recordCustodyEvent, type RequestFacts } from "@/lib/custody/record-custody-event";
import type { ScopedFile } from "./resolve-scoped-file";

type LinkRef = { id: string; organisationId: string; jobId: string };
export type AccessFacts = RequestFacts;

export async function recordShareOpen(link: LinkRef, facts: AccessFacts): Promise<void> {
  await db().transaction(async (tx) => {
    await tx.insert(shareLinkEvents).values({ organisationId: link.organisationId, shareLinkId: link.id, kind: "open", ...facts });
    await recordCustodyEvent(
      {
        organisationId: link.organisationId,
        eventType: "share_open",
        evidenceType: "share_link",
        evidenceId: link.id,
        jobId: link.jobId,
        actor: { shareLinkId: link.id },
        ...facts,
        purpose: "Client opened a share link",
      },
      tx,
    );
  });
}

export async function recordShareDownload(link: LinkRef, file: ScopedFile, facts: AccessFacts): Promise<void> {
  await db().transaction(async (tx) => {
    await tx.insert(shareLinkEvents).values({
      organisationId: link.organisationId,
      shareLinkId: link.id,
      kind: "download",
      detail: `${file.evidence.type}:${file.evidence.id}`,
      ...facts,
    });
    await recordCustodyEvent(
      {
        organisationId: link.organisationId,
        eventType: "download",
        evidenceType: file.evidence.type,
        evidenceId: file.evidence.id,
        jobId: link.jobId,
        originalSha256: file.evidence.originalSha256,
        originalSize: file.evidence.originalSize,
        actor: { shareLinkId: link.id },
        ...facts,
        storageLocation: file.storageKey,
        purpose: file.evidence.type === "report" ? "Client downloaded the report through a share link" : "Client downloaded the original through a share link",
        outputSha256: file.sha256,
      },
      tx,
    );
  });
}

export async function recordPasscodeRefused(link: LinkRef, facts: AccessFacts, detail: "wrong" | "locked"): Promise<void> {
  await db().insert(shareLinkEvents).values({ organisationId: link.organisationId, shareLinkId: link.id, kind: "passcode_refused", detail, ...facts });
}
