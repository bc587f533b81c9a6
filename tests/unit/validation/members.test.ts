import { describe, expect, it } from "vitest";
import { acceptInviteInput, inviteInput, newAccountForm, roleChangeInput } from "@/lib/validation/members";
import { organisationInput } from "@/lib/validation/organisation";
import { jobListQuery, memberListQuery } from "@/lib/validation/list-filters";

const token = Buffer.alloc(32, 1).toString("base64url");

describe("invitations and roles", () => {
  it("normalises the invited address and knows the four roles", () => {
    expect(inviteInput.parse({ email: "  New.Pilot@Example.COM ", role: "pilot" })).toEqual({ email: "new.pilot@example.com", role: "pilot" });
    expect(inviteInput.safeParse({ email: "x@example.com", role: "admin" }).success).toBe(false);
    expect(inviteInput.safeParse({ email: "not mail", role: "pilot" }).success).toBe(false);
    expect(roleChangeInput.safeParse({ role: "owner", extra: 1 }).success).toBe(false);
  });

  it("a token is 43 URL-safe characters (32 bytes, RFC 4648 base64url)", () => {
    expect(acceptInviteInput.safeParse({ token }).success).toBe(true);
    expect(acceptInviteInput.safeParse({ token: token.slice(1) }).success).toBe(false);
    expect(acceptInviteInput.safeParse({ token: `${token.slice(1)}+` }).success).toBe(false);
  });

  it("passwords: at least 12 characters, at most the 72 bytes bcrypt reads", () => {
    const pw = (password: string) => acceptInviteInput.safeParse({ token, name: "N", password }).success;
    expect(pw("elevenchars")).toBe(false);
    expect(pw("twelve chars")).toBe(true);
    expect(pw("a".repeat(72))).toBe(true);
    expect(pw("a".repeat(73))).toBe(false);
    // "é" is 2 bytes in UTF-8 (RFC 3629): 36 of them are 72 bytes, 37 are 74
    expect(pw("é".repeat(36))).toBe(true);
    expect(pw("é".repeat(37))).toBe(false);
  });

  it("the new-account form asks for the password twice", () => {
    expect(newAccountForm.safeParse({ name: "Nell", password: "correct horse battery", confirm: "correct horse battery" }).success).toBe(true);
    const r = newAccountForm.safeParse({ name: "Nell", password: "correct horse battery", confirm: "correct horse batterY" });
    expect(r.error!.issues.map((i) => i.path.join("."))).toEqual(["confirm"]);
  });
});

describe("organisations", () => {
  const ok = { name: "Fellside", slug: "fellside-survey", owner: { email: "o@example.com", name: "Orla", password: "a long enough password" } };
  it("slugs are lower-case words joined by single hyphens", () => {
    expect(organisationInput.parse({ ...ok, slug: "Fellside-Survey" }).slug).toBe("fellside-survey");
    for (const slug of ["-lead", "trail-", "two--hyphens", "under_score", "a", "spa ce"]) expect(organisationInput.safeParse({ ...ok, slug }).success, slug).toBe(false);
  });
  it("defaults the time zone to UTC", () => {
    expect(organisationInput.parse(ok).timeZone).toBe("UTC");
  });
});

describe("list filters", () => {
  it("status takes a comma list of known statuses", () => {
    expect(jobListQuery.parse({ status: "planned,review" }).status).toEqual(["planned", "review"]);
    expect(jobListQuery.parse({}).status).toBeUndefined();
    expect(jobListQuery.safeParse({ status: "planned,finished" }).success).toBe(false);
    expect(memberListQuery.parse({ role: "pilot, owner" }).role).toEqual(["pilot", "owner"]);
  });
  it("ids must be UUIDs and search text may not hold NUL", () => {
    expect(jobListQuery.safeParse({ siteId: "1" }).success).toBe(false);
    expect(jobListQuery.safeParse({ q: "a\u0000" }).success).toBe(false);
    expect(jobListQuery.parse({ page: "2", pageSize: "10" })).toMatchObject({ page: 2, pageSize: 10, dir: "asc", archived: "0" });
  });
});
