// The role -> permission table, checked against the roles docs/product-rules.md describes (owner sets up and
// manages everything; pilot uploads and logs flights and range checks; reviewer marks findings and
// builds reports; client accounts only read).
import { describe, expect, it } from "vitest";
import { PERMISSIONS, ROLE_LABELS, ROLE_PERMISSIONS, can, type Permission } from "@/lib/auth/permissions";
import { ROLES } from "@/lib/validation/members";

const EXPECTED: Record<(typeof ROLES)[number], Permission[]> = {
  owner: [...PERMISSIONS],
  pilot: [
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
  ],
  reviewer: ["workspace.read", "recordings.read", "recordings.tag", "originals.download", "findings.read", "findings.write", "reports.build", "custody.read", "views.read", "range.read", "packages.build", "packages.download"],
  client: ["workspace.read", "recordings.read", "findings.read"],
};

const WORK_WRITES: Permission[] = ["clients.write", "sites.write", "jobs.write", "flights.write"];
const MANAGEMENT: Permission[] = ["members.manage", "shares.manage", "holds.manage", "settings.manage", "reports.approve", "recordings.delete", "retention.manage"];

describe("permission table", () => {
  it("covers exactly the four roles of the schema", () => {
    expect(Object.keys(ROLE_PERMISSIONS).sort()).toEqual([...ROLES].sort());
    expect(Object.keys(ROLE_LABELS).sort()).toEqual([...ROLES].sort());
  });

  it.each(ROLES)("%s has exactly its documented set", (role) => {
    expect([...ROLE_PERMISSIONS[role]].sort()).toEqual([...EXPECTED[role]].sort());
    for (const p of PERMISSIONS) expect(can(role, p), `${role} ${p}`).toBe(EXPECTED[role].includes(p));
  });

  it("the owner has every permission", () => {
    for (const p of PERMISSIONS) expect(can("owner", p)).toBe(true);
  });

  it("reviewers and client accounts cannot write clients, sites, jobs or flights", () => {
    for (const role of ["reviewer", "client"] as const) {
      for (const p of WORK_WRITES) expect(can(role, p), `${role} ${p}`).toBe(false);
    }
  });

  it("pilots log flights but do not set up clients, sites or jobs", () => {
    expect(can("pilot", "flights.write")).toBe(true);
    for (const p of ["clients.write", "sites.write", "jobs.write"] as const) expect(can("pilot", p)).toBe(false);
  });

  it("only owners manage members, sharing, holds, settings, approvals and deletion", () => {
    for (const role of ["pilot", "reviewer", "client"] as const) {
      for (const p of MANAGEMENT) expect(can(role, p), `${role} ${p}`).toBe(false);
    }
  });

  it("a client account only reads", () => {
    expect([...ROLE_PERMISSIONS.client].every((p) => p.endsWith(".read"))).toBe(true);
  });

  it("every role can read the workspace; the permission names are unique", () => {
    for (const role of ROLES) expect(can(role, "workspace.read")).toBe(true);
    expect(new Set(PERMISSIONS).size).toBe(PERMISSIONS.length);
  });
});
