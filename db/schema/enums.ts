// Closed sets of the product's vocabulary (docs/product-rules.md). Labels and meanings shown in the UI live in lib/.
import { pgEnum } from "drizzle-orm/pg-core";

export const roleEnum = pgEnum("member_role", ["owner", "pilot", "reviewer", "client"]);
export const unitsEnum = pgEnum("length_units", ["ft", "m"]);
export const assetKindEnum = pgEnum("asset_kind", ["roof", "tower", "bridge", "solar", "facade", "other"]);
export const jobStatusEnum = pgEnum("job_status", ["planned", "fieldwork", "review", "delivered", "closed"]);
export const recordingKindEnum = pgEnum("recording_kind", ["raw_h264", "mp4", "mov", "jpeg"]);
export const processingStateEnum = pgEnum("processing_state", ["waiting", "processing", "ready", "failed"]);
export const renditionKindEnum = pgEnum("rendition_kind", ["playable", "poster", "sprite", "thumbnails_vtt"]);
export const severityEnum = pgEnum("finding_severity", ["note", "minor", "moderate", "major", "severe", "critical"]);
export const revisionActionEnum = pgEnum("revision_action", ["created", "updated", "deleted"]);
export const reportStateEnum = pgEnum("report_state", ["queued", "building", "ready", "approved", "failed"]);
export const shareScopeEnum = pgEnum("share_scope", ["recording", "findings", "report", "job"]);
export const shareEventKindEnum = pgEnum("share_event_kind", ["open", "download", "passcode_refused", "media"]);
export const linkEventEnum = pgEnum("link_event", ["first_degradation", "total_loss", "reacquired"]);
export const stillStateEnum = pgEnum("still_state", ["pending", "ready", "failed"]);
export const evidencePackageStateEnum = pgEnum("evidence_package_state", ["queued", "building", "ready", "failed", "expired"]);
