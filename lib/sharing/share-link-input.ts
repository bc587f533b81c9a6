// What an owner fills in to share: scope and its target, expiry, optional passcode, download rights,
// label and recipients. The scope decides which target field is required. The form
// (components/sharing/share-link-form.tsx) validates with this same schema: an empty choice ("") reads
// as none, and recipients typed as one line are split at commas, semicolons and spaces.
import { z } from "zod";
import { safeText, textRule } from "@/lib/validation/common";
import { keysetParams } from "@/lib/validation/page-params";

export const SHARE_SCOPES = ["recording", "findings", "report", "job"] as const;
export type ShareScope = (typeof SHARE_SCOPES)[number];

export const SHARE_SCOPE_LABELS: Record<ShareScope, { label: string; meaning: string }> = {
  recording: { label: "One recording", meaning: "The clip with all its findings; the report too if you attach one." },
  findings: { label: "Chosen findings", meaning: "Only the findings you pick and the clips they sit in; the report too if you attach one." },
  report: { label: "Report version", meaning: "One report PDF, nothing else." },
  job: { label: "Whole job", meaning: "Every recording and finding of the job and its newest approved report." },
};

export const MAX_SHARE_DAYS = 90;

const uuid = z.string().uuid();
const noneIfEmpty = (v: unknown) => (v === "" ? null : v);
const splitEmails = (v: unknown) => (typeof v === "string" ? v.split(/[\s,;]+/).map((x) => x.trim()).filter(Boolean) : v);

export const shareLinkInput = z
  .object({
    jobId: uuid,
    scope: z.enum(SHARE_SCOPES),
    recordingId: z.preprocess(noneIfEmpty, uuid.nullish()),
    findingIds: z.array(uuid).max(200).nullish(),
    reportId: z.preprocess(noneIfEmpty, uuid.nullish()),
    label: safeText().min(1, "Give the link a label you will recognise").max(120),
    recipientEmails: z.preprocess(splitEmails, z.array(z.string().trim().toLowerCase().email("Not an e-mail address").max(320)).max(20, "At most 20 recipients").default([])),
    // a number, or digits typed into the form; z.coerce would also take `true` as 1 and "" as 0
    expiresInDays: z
      .preprocess((v) => (typeof v === "string" && /^\s*\d+\s*$/.test(v) ? Number(v) : v), z.number({ message: "A whole number of days" }).int("A whole number of days").min(1).max(MAX_SHARE_DAYS))
      .default(14),
    passcode: z
      .string()
      .superRefine(textRule())
      .max(64)
      .transform((s) => s.trim())
      .refine((s) => s === "" || s.length >= 6, "A passcode needs at least 6 characters")
      .nullish(),
    allowOriginals: z.boolean().default(false),
    sendMail: z.boolean().default(true),
  })
  .strict()
  .superRefine((v, ctx) => {
    if (v.scope === "recording" && !v.recordingId) ctx.addIssue({ code: "custom", path: ["recordingId"], message: "Choose the recording to share" });
    if (v.scope === "findings" && !v.findingIds?.length) ctx.addIssue({ code: "custom", path: ["findingIds"], message: "Choose at least one finding" });
    if (v.scope === "report" && !v.reportId) ctx.addIssue({ code: "custom", path: ["reportId"], message: "Choose the report version to share" });
  });

export type ShareLinkInput = z.infer<typeof shareLinkInput>;

/** GET /api/share-links/options?jobId= (a missing or malformed id answers 404, like an unknown job) */
export const shareOptionsQuery = z.object({ jobId: z.string().optional() });
/** GET /api/share-links?jobId=, paged */
export const shareLinksQuery = keysetParams(100).extend({ jobId: z.string().optional() });
/** a job id from a query string, or null when it cannot be one */
export const jobIdOrNull = (v: string | undefined): string | null => (v && uuid.safeParse(v).success ? v : null);
