// The pager under a list, in a real browser: a list paged by offset and count alone (the members list
// answers no nextCursor) still offers its next page. A list's "Next" follows nextCursor only when the
// list gives one (components/ui/resource-table.tsx, Pager); reading that change found this case.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import { closeDb, db } from "@/db/client";
import * as s from "@/db/schema";
import { hashPassword } from "@/lib/auth/password";
import { DEMO_PASSWORD } from "@/db/seed/demo-scenario";
import { launch, newContext, signInWithPassword } from "@/tests/support/browser";
import { makeMember } from "@/tests/support/factories";

let browser: Browser;
let page: Page;
const errors: string[] = [];

beforeAll(async () => {
  browser = await launch();
  const [org] = await db().insert(s.organisations).values({ name: "Pager Test Aerial Survey (invented)", slug: `pager-test-${Date.now()}` }).returning();
  const owner = await makeMember(org.id, "owner", { passwordHash: await hashPassword(DEMO_PASSWORD) });
  // 30 more: 31 members, two pages of 25
  for (let i = 0; i < 30; i++) await makeMember(org.id, "pilot", { name: `Pager pilot ${String(i).padStart(2, "0")}` });
  page = await (await newContext(browser)).newPage();
  page.on("pageerror", (e) => errors.push(e.message));
  await signInWithPassword(page, owner.email);
});
afterAll(async () => {
  await browser?.close();
  await closeDb();
});

describe("a list paged by its count alone", () => {
  it("shows 31 members on two pages, and Next leads to the second", async () => {
    await page.goto("/members");
    const pager = page.getByRole("navigation", { name: "Pages of filter members" });
    await expect.poll(() => pager.textContent(), { timeout: 15_000 }).toContain("Page 1 of 2");
    await page.getByText("31 rows").waitFor();
    const next = pager.getByRole("button", { name: "Next" });
    expect(await next.isDisabled()).toBe(false);
    await next.click();
    await expect.poll(() => pager.textContent()).toContain("Page 2 of 2");
    expect(await pager.getByRole("button", { name: "Next" }).isDisabled()).toBe(true);
    expect(errors).toEqual([]);
  });
});
