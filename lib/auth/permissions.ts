// Roles map to permissions in one flat table. Every route handler and server action names the
// permission it needs; nothing else decides access (docs/product-rules.md, "Rules of the house").
import type { Role } from "@/db/schema/types";

export const PERMISSIONS = [
  "workspace.read",
  "clients.write",
  "sites.write",
  "jobs.write",
  "flights.write",
  "members.manage",
  "recordings.upload",
  "recordings.read",
  "recordings.tag",
  "recordings.reprocess",
  "recordings.order",
  "recordings.delete",
  "originals.download",
  "findings.read",
  "findings.write",
  "reports.build",
  "reports.approve",
  "shares.manage",
  "custody.read",
  "holds.manage",
  "rangechecks.write",
  "settings.manage",
  "views.read",
  "range.read",
  // evidence packages (lib/evidence-packages): building one, downloading a built one; retention and
  // disposal (lib/retention)
  "packages.build",
  "packages.download",
  "retention.manage",
] as const;
export type Permission = (typeof PERMISSIONS)[number];

const ALL = new Set<Permission>(PERMISSIONS);

// client accounts are optional and read-only, and see only the work of the clients they are tied to
// (lib/auth/client-scope.ts): jobs, flights, recordings, findings and approved reports; not the range
// tools nor who watched what
export const ROLE_PERMISSIONS: Record<Role, ReadonlySet<Permission>> = {
  owner: ALL,
  pilot: new Set<Permission>([
    "workspace.read",
    "flights.write",
    "recordings.upload",
    "recordings.read",
    "recordings.tag",
    "recordings.reprocess",
    "recordings.order",
    "originals.download",
    "findings.read",
    "custody.read",
    "rangechecks.write",
    "views.read",
    "range.read",
    "packages.download",
  ]),
  reviewer: new Set<Permission>([
    "workspace.read",
    "recordings.read",
    "recordings.tag",
    "originals.download",
    "findings.read",
    "findings.write",
    "reports.build",
    "custody.read",
    "views.read",
    "range.read",
    "packages.build",
    "packages.download",
  ]),
  client: new Set<Permission>(["workspace.read", "recordings.read", "findings.read"]),
};

export function can(role: Role, permission: Permission): boolean {
  return ROLE_PERMISSIONS[role].has(permission);
}

export const ROLE_LABELS: Record<Role, { label: string; meaning: string }> = {
  owner: { label: "Owner", meaning: "Sets up clients, sites and jobs, manages the crew, sharing, holds and retention." },
  pilot: { label: "Pilot", meaning: "Uploads recordings, logs flights and range checks." },
  reviewer: { label: "Reviewer", meaning: "Watches recordings, marks findings and builds reports." },
  client: { label: "Client", meaning: "Read-only access to the jobs of the clients it is tied to, with their approved reports." },
};
