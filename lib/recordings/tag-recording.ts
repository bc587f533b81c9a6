// Free labels on recordings: adding a tag creates it in the organisation on first use (matching an
// existing tag regardless of letter case), removing one only unlinks it from the recording.
import "server-only";
import { and, asc, eq, isNull, sql } from "drizzle-orm";
import { db } from "@/db/client";
import { recordingTags, recordings, tags } from "@/db/schema";
import { notFound } from "@/lib/api/errors";
import { tagInput, tagName } from "./recording-input";

export { tagName, tagInput };

async function assertRecording(organisationId: string, recordingId: string) {
  const [r] = await db()
    .select({ id: recordings.id })
    .from(recordings)
    .where(and(eq(recordings.id, recordingId), eq(recordings.organisationId, organisationId), isNull(recordings.deletedAt)));
  if (!r) throw notFound("Recording not found");
}

export async function recordingTagNames(organisationId: string, recordingId: string): Promise<string[]> {
  await assertRecording(organisationId, recordingId);
  return tagNamesOf(organisationId, recordingId);
}

/** The names, for a recording already checked to be the organisation's. */
async function tagNamesOf(organisationId: string, recordingId: string): Promise<string[]> {
  const rows = await db()
    .select({ name: tags.name })
    .from(recordingTags)
    .innerJoin(tags, eq(tags.id, recordingTags.tagId))
    .where(and(eq(recordingTags.recordingId, recordingId), eq(recordingTags.organisationId, organisationId)))
    .orderBy(asc(sql`lower(${tags.name})`));
  return rows.map((r) => r.name);
}

export async function addRecordingTag(organisationId: string, recordingId: string, name: string): Promise<string[]> {
  await assertRecording(organisationId, recordingId);
  await db().transaction(async (tx) => {
    let [tag] = await tx.select({ id: tags.id }).from(tags).where(and(eq(tags.organisationId, organisationId), sql`lower(${tags.name}) = lower(${name})`));
    if (!tag) {
      [tag] = await tx.insert(tags).values({ organisationId, name }).onConflictDoUpdate({ target: [tags.organisationId, tags.name], set: { updatedAt: new Date() } }).returning({ id: tags.id });
    }
    await tx.insert(recordingTags).values({ organisationId, recordingId, tagId: tag.id }).onConflictDoNothing();
  });
  return tagNamesOf(organisationId, recordingId);
}

export async function removeRecordingTag(organisationId: string, recordingId: string, name: string): Promise<string[]> {
  await assertRecording(organisationId, recordingId);
  const matching = db()
    .select({ id: tags.id })
    .from(tags)
    .where(and(eq(tags.organisationId, organisationId), sql`lower(${tags.name}) = lower(${name})`));
  await db()
    .delete(recordingTags)
    .where(and(eq(recordingTags.recordingId, recordingId), eq(recordingTags.organisationId, organisationId), sql`${recordingTags.tagId} in ${matching}`));
  return tagNamesOf(organisationId, recordingId);
}
