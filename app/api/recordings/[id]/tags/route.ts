// GET/POST/DELETE /api/recordings/:id/tags: a recording's tags; POST { name } adds one, DELETE ?name= removes one
import { requireInScope } from "@/lib/auth/client-scope";
import { withOrg, idParam, parseQuery, readJson, ok } from "@/lib/api/with-org";
import { addRecordingTag, recordingTagNames, removeRecordingTag } from "@/lib/recordings/tag-recording";
import { tagInput, tagRemovalQuery } from "@/lib/recordings/recording-input";

type P = { id: string };
const id = (params: P) => idParam(params.id, "Recording not found");

export const GET = withOrg<P>({ permission: "recordings.read" }, async ({ params, member }) => {
  await requireInScope(member, "recording", id(params), "Recording not found");
  return ok({ tags: await recordingTagNames(member.organisationId, id(params)) });
}
);

export const POST = withOrg<P>({ permission: "recordings.tag" }, async ({ req, params, member }) => {
  const { name } = await readJson(req, tagInput);
  return ok({ tags: await addRecordingTag(member.organisationId, id(params), name) });
});

export const DELETE = withOrg<P>({ permission: "recordings.tag" }, async ({ req, params, member }) => {
  const { name } = parseQuery(req, tagRemovalQuery);
  return ok({ tags: await removeRecordingTag(member.organisationId, id(params), name) });
});
