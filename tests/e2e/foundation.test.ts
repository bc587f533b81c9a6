// The foundation in a real browser (Debian chromium through playwright-core) against the built app:
// the owner signs in with a password and files a client, a site, a job and a flight through the UI;
// a reviewer signs in through an e-mail link read from the fake mailbox; both sign out. A pilot who
// belongs to two organisations switches between them from the user menu.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import { closeDb, db } from "@/db/client";
import { memberships, organisations } from "@/db/schema";
import { DEMO_USERS } from "@/db/seed/demo-scenario";
import { demoActors } from "@/tests/support/session";
import { randomUUID } from "node:crypto";
import type { Browser, BrowserContext, Page } from "playwright-core";
import { launch, newContext, signInWithPassword } from "@/tests/support/browser";
import { readMailbox } from "@/lib/mail/read-mailbox";

let browser: Browser;
let ctx: BrowserContext;
let page: Page;
const tag = randomUUID().slice(0, 6);
const clientName = `Hollowmere Estates ${tag}`;
const siteName = `Hollowmere gatehouse ${tag}`;
const jobTitle = `Gatehouse roof survey ${tag}`;
const scriptName = `<script>window.__cairnInjected = 1</script> Tag ${tag}`;

beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
  await closeDb();
});

async function signOut(p: Page) {
  await p.getByTestId("user-menu").click();
  await p.getByRole("button", { name: "Sign out" }).click();
  await p.waitForURL(/\/sign-in/);
}

/** The cell texts of the table row that contains `text`. */
async function rowWith(p: Page, text: string) {
  const row = p.locator("tbody tr", { hasText: text });
  await row.first().waitFor();
  return row.first();
}

describe("foundation in the browser", () => {
  it("the owner signs in with a password and files a client, a site, a job and a flight", async () => {
    ctx = await newContext(browser);
    page = await ctx.newPage();
    await signInWithPassword(page, "owner@kestrelmoor.example");
    await expect.poll(() => page.getByTestId("user-menu").textContent()).toContain("Ada Thornbury");

    // signing in lands on the start page; the jobs page explains statuses in words
    await page.getByRole("heading", { name: "Today", exact: true }).waitFor();
    await page.getByRole("link", { name: "Jobs", exact: true }).click();
    await page.waitForURL(/\/jobs$/);
    await expect.poll(() => page.getByText("What the statuses mean").count()).toBe(1);
    expect(await page.getByText("Reviewers are marking findings in the recordings.").count()).toBeGreaterThan(0);

    // a client
    await page.getByRole("link", { name: "Clients", exact: true }).click();
    await page.waitForURL(/\/clients/);
    await page.getByRole("button", { name: "New client" }).first().click();
    let dialog = page.getByRole("dialog");
    await dialog.getByLabel("Name", { exact: true }).fill(clientName);
    await dialog.getByLabel("Contact e-mail", { exact: true }).fill("estates@hollowmere.example");
    await dialog.getByRole("button", { name: "Create client" }).click();
    await dialog.waitFor({ state: "detached" });
    expect(await (await rowWith(page, clientName)).textContent()).toContain("estates@hollowmere.example");

    // a client whose name is markup: shown as text, never run
    await page.getByRole("button", { name: "New client" }).first().click();
    dialog = page.getByRole("dialog");
    await dialog.getByLabel("Name", { exact: true }).fill(scriptName);
    await dialog.getByRole("button", { name: "Create client" }).click();
    await dialog.waitFor({ state: "detached" });
    const scriptRow = await rowWith(page, `Tag ${tag}`);
    expect(await scriptRow.locator("td").first().textContent()).toBe(scriptName);
    expect(await page.evaluate(() => (window as unknown as { __cairnInjected?: number }).__cairnInjected)).toBeUndefined();
    expect(await page.locator("tbody script").count()).toBe(0);

    // a site for the client
    await page.getByRole("link", { name: "Sites", exact: true }).click();
    await page.waitForURL(/\/sites/);
    await page.getByRole("button", { name: "New site" }).first().click();
    dialog = page.getByRole("dialog");
    await dialog.getByLabel("Client", { exact: true }).selectOption({ label: clientName });
    await dialog.getByLabel("Site name", { exact: true }).fill(siteName);
    await dialog.getByLabel("Address", { exact: true }).fill("3 Gatehouse Lane, Hollowmere (invented)");
    await dialog.getByLabel("Latitude", { exact: true }).fill("54.43012");
    await dialog.getByLabel("Longitude", { exact: true }).fill("-2.66104");
    await dialog.getByLabel("Time zone", { exact: true }).fill("Europe/London");
    await dialog.getByLabel("Kind of structure", { exact: true }).selectOption("roof");
    await dialog.getByRole("button", { name: "Create site" }).click();
    await dialog.waitFor({ state: "detached" });
    const siteRow = await rowWith(page, siteName);
    const siteText = await siteRow.textContent();
    expect(siteText).toContain(clientName);
    expect(siteText).toContain("54.43012°, -2.66104°");
    expect(siteText).toContain("Europe/London");

    // a job at the site
    await page.getByRole("link", { name: "Jobs", exact: true }).click();
    await page.waitForURL(/\/jobs$/);
    await page.getByRole("button", { name: "New job" }).first().click();
    dialog = page.getByRole("dialog");
    await dialog.getByLabel("Site", { exact: true }).selectOption({ label: `${siteName} · ${clientName}` });
    await dialog.getByLabel("Title", { exact: true }).fill(jobTitle);
    await dialog.getByLabel("Scope", { exact: true }).fill("Slipped slates and flashing on the north pitch.");
    await dialog.getByLabel("Due date", { exact: true }).fill("2026-06-30");
    await dialog.getByLabel("Pilot", { exact: true }).selectOption({ label: "Bram Ellery (Pilot)" });
    await dialog.getByLabel("Reviewer", { exact: true }).selectOption({ label: "Cleo Marchbank (Reviewer)" });
    await dialog.getByRole("button", { name: "Create job" }).click();
    await dialog.waitFor({ state: "detached" });
    const jobRow = await rowWith(page, jobTitle);
    const jobText = await jobRow.textContent();
    for (const expected of ["Planned", "2026-06-30", siteName, clientName, "Bram Ellery", "Cleo Marchbank"]) expect(jobText).toContain(expected);

    // the job's page, and a flight logged there above the common altitude limit
    await jobRow.getByRole("link", { name: jobTitle }).click();
    await page.waitForURL(/\/jobs\/[0-9a-f-]{36}$/);
    await page.getByRole("heading", { name: jobTitle }).waitFor();
    expect(await page.locator("#scope").textContent()).toContain("Slipped slates");
    // editing keeps the assigned crew (the pickers load after the form opens) and changes the status
    await page.getByRole("button", { name: "Edit job" }).click();
    dialog = page.getByRole("dialog");
    await expect.poll(() => dialog.getByLabel("Pilot", { exact: true }).evaluate((el: HTMLSelectElement) => el.selectedOptions[0]?.textContent)).toBe("Bram Ellery (Pilot)");
    await expect.poll(() => dialog.getByLabel("Reviewer", { exact: true }).evaluate((el: HTMLSelectElement) => el.selectedOptions[0]?.textContent)).toBe("Cleo Marchbank (Reviewer)");
    await dialog.getByLabel("Status", { exact: true }).selectOption("fieldwork");
    await dialog.getByRole("button", { name: "Save job" }).click();
    await dialog.waitFor({ state: "detached" });
    await expect.poll(() => page.locator("#crew").textContent()).toContain("Bram Ellery");
    await expect.poll(() => page.getByText("Fieldwork: Flights are being flown and recordings uploaded.").count()).toBe(1);

    await page.getByRole("button", { name: "Log flight" }).first().click();
    dialog = page.getByRole("dialog");
    await dialog.getByLabel("Aircraft", { exact: true }).fill("Quad, test airframe");
    await dialog.getByLabel("Max altitude AGL", { exact: true }).fill("390");
    expect(await dialog.getByTestId("altitude-caution").count()).toBe(0);
    await dialog.getByLabel("Max altitude AGL", { exact: true }).fill("450");
    await dialog.getByTestId("altitude-caution").waitFor();
    expect(await dialog.getByTestId("altitude-caution").textContent()).toContain("Above 120 m (about 400 ft) above ground level");
    await dialog.getByRole("button", { name: "Log flight" }).click();
    await dialog.waitFor({ state: "detached" });
    const flightRow = await rowWith(page, "Quad, test airframe");
    // 450 ft = 137.16 m (1 ft = 0.3048 m exactly, NIST SP 811): shown back in the owner's feet, metres beside
    expect(await flightRow.textContent()).toContain("450 ft AGL (137 m)");
    await flightRow.getByRole("link").first().click();
    await page.waitForURL(/\/flights\/[0-9a-f-]{36}$/);
    expect(await page.getByTestId("max-altitude").textContent()).toContain("450 ft AGL");
    await page.getByTestId("altitude-caution").waitFor();

    await signOut(page);
    await ctx.close();
  });

  it("a reviewer signs in through an e-mail link from the fake mailbox, sees who they are, and signs out", async () => {
    ctx = await newContext(browser);
    page = await ctx.newPage();
    const email = "reviewer@kestrelmoor.example";
    const asked = Date.now();
    await page.goto("/sign-in");
    await page.getByRole("tab", { name: "E-mail me a link" }).click();
    await page.getByLabel("E-mail", { exact: true }).fill(email);
    await page.getByRole("button", { name: "Send sign-in link" }).click();
    await page.waitForURL(/\/sign-in\/check-mail/);

    // newest mail to this address that arrived after the request
    let link: string | undefined;
    await expect
      .poll(
        async () => {
          const [mail] = await readMailbox({ to: email, limit: 1 });
          if (!mail || Date.parse(mail.receivedAt) < asked - 1000) return undefined;
          link = mail.text.match(/https?:\/\/\S+\/api\/auth\/callback\/email\S+/)?.[0];
          return link;
        },
        { timeout: 15_000 },
      )
      .toBeDefined();

    // the development mailbox shows the same message with its link clickable
    await page.goto(`/dev/mailbox?to=${encodeURIComponent(email)}`);
    expect(await page.locator("article").first().getByRole("heading").textContent()).toBe("Your Cairn sign-in link");
    expect(await page.locator("article").first().getByRole("link", { name: link! }).count()).toBe(1);

    await page.goto(link!);
    await page.waitForURL(/\/today/);
    const menu = await page.getByTestId("user-menu").textContent();
    expect(menu).toContain("Cleo Marchbank");
    expect(menu).toContain("Reviewer");
    // a reviewer files no jobs and does not manage members
    expect(await page.getByRole("button", { name: "New job" }).count()).toBe(0);
    expect(await page.getByRole("link", { name: "Members" }).count()).toBe(0);
    // the dim theme: on, remembered across a reload, off again
    const isDim = () => page.evaluate(() => document.documentElement.classList.contains("dark"));
    expect(await isDim()).toBe(false);
    await page.getByRole("button", { name: "Dim" }).click();
    await expect.poll(isDim).toBe(true);
    await page.reload();
    await page.getByRole("button", { name: "Daylight" }).waitFor();
    await expect.poll(isDim).toBe(true);
    await page.getByRole("button", { name: "Daylight" }).click();
    await expect.poll(isDim).toBe(false);
    // the link works once
    await signOut(page);
    await page.goto(link!);
    await page.waitForURL(/\/sign-in/);
    await ctx.close();
  });
  it("a pilot in two organisations switches between them from the user menu", async () => {
    const actors = await demoActors();
    const pilot = actors.pilot!;
    const [home] = await db().select({ name: organisations.name }).from(organisations).where(eq(organisations.id, pilot.organisationId));
    const [second] = await db().select({ id: organisations.id, name: organisations.name }).from(organisations).where(eq(organisations.id, actors.other!.organisationId));
    await db().insert(memberships).values({ organisationId: second.id, userId: pilot.userId, role: "reviewer" }).onConflictDoNothing();
    try {
      ctx = await newContext(browser);
      page = await ctx.newPage();
      await signInWithPassword(page, DEMO_USERS.find((u) => u.role === "pilot")!.email);
      const orgName = page.getByTestId("org-name");
      await expect.poll(() => orgName.textContent()).toBe(home.name);

      await page.getByTestId("user-menu").click();
      const switcher = page.getByTestId("organisation-switcher");
      expect(await switcher.locator('[aria-current="true"]').textContent()).toContain(home.name);
      await switcher.getByRole("button", { name: `Switch to ${second.name}` }).click();
      await page.waitForURL(/\/today/);
      // the workspace now belongs to the second organisation, where this person is a reviewer
      await expect.poll(() => orgName.textContent(), { timeout: 15_000 }).toBe(second.name);
      expect(await page.getByTestId("user-menu").textContent()).toContain("Reviewer");
      expect(await page.getByRole("link", { name: "Upload", exact: true }).count()).toBe(0);
      // and back
      await page.getByTestId("user-menu").click();
      await page.getByTestId("organisation-switcher").getByRole("button", { name: `Switch to ${home.name}` }).click();
      await expect.poll(() => orgName.textContent(), { timeout: 15_000 }).toBe(home.name);
      expect(await page.getByTestId("user-menu").textContent()).toContain("Pilot");
      await ctx.close();
    } finally {
      await db().delete(memberships).where(and(eq(memberships.userId, pilot.userId), eq(memberships.organisationId, second.id)));
    }
  });
});
