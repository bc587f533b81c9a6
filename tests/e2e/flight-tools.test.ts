// Flight tools in a real browser against the built app: the slant range calculator (typed distance,
// plan click, keyboard, units remembered), a range check logged in one click from a signal-trace
// interval, the comparison chart showing it, and the CSV export downloaded and read back.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { readFile } from "node:fs/promises";
import { and, eq, like } from "drizzle-orm";
import geographiclib from "geographiclib-geodesic";
import type { Browser, BrowserContext, Page } from "playwright-core";
import { launch, newContext, signInWithPassword } from "@/tests/support/browser";
import { db, closeDb } from "@/db/client";
import { flights, rangeChecks, users } from "@/db/schema";
import { feetToMetres, metresToFeet, slantRange } from "@/lib/geo";
import { RANGE_CHECK_CSV_HEADER } from "@/lib/range-checks/build-range-checks-csv";
import { demoOrganisationId } from "@/tests/support/session";
import { insertTracedRecording } from "@/tests/integration/range/range-fixtures";

// GeographicLib (C. F. F. Karney), called directly: the outside reference for the plan's distances.
const wgs84 = geographiclib.Geodesic.WGS84;

let browser: Browser;
let ctx: BrowserContext;
let page: Page;
let flightId: string;
let recordingName: string;

beforeAll(async () => {
  const orgId = await demoOrganisationId();
  // the demo valve-tower flight (first battery); its recording and trace are TEST DATA inserted here,
  // standing in for what the processing worker writes: a recording row whose storage key points at no
  // file, and a trace of intact 0-10 s, damaged 10-12 s, lost 12-15 s, intact 15-20 s
  const [flight] = await db()
    .select({ id: flights.id })
    .from(flights)
    .where(and(eq(flights.organisationId, orgId), like(flights.notes, "Wind 12 kt%")));
  flightId = flight.id;
  recordingName = (await insertTracedRecording(orgId, flightId)).originalName;
  browser = await launch();
  ctx = await newContext(browser);
  page = await ctx.newPage();
  await signInWithPassword(page, "pilot@kestrelmoor.example");
});
afterAll(async () => {
  await browser?.close();
  await closeDb();
});

const slantText = () => page.getByTestId("slant-range").textContent();
/** Each test starts in feet, whatever an earlier one left behind. */
async function useFeet() {
  const feet = page.getByRole("button", { name: "Feet (ft)" });
  if ((await feet.getAttribute("aria-pressed")) !== "true") await feet.click();
  await expect.poll(() => feet.getAttribute("aria-pressed")).toBe("true");
}
const pilotUnits = async () => (await db().select({ u: users.preferredUnits }).from(users).where(eq(users.email, "pilot@kestrelmoor.example")))[0].u;

describe("flight tools in the browser", () => {
  it("computes a slant range from a typed ground distance and height, with the cautions beside it", async () => {
    await page.goto("/range");
    await page.getByLabel("A ground distance I measured").check();
    await page.getByLabel("Height above ground level (AGL)").fill("400");
    await page.getByLabel("Ground distance", { exact: true }).fill("1926");
    // common practice, no published source: 400 ft AGL over 1926 ft of ground -> 1967.1 ft
    await expect.poll(slantText).toBe("1,967.1 ft");
    expect(await page.getByText("Range figures describe the radio link, not permission to fly that far.").count()).toBe(1);
    expect(await page.getByText("Local regulations and the pilot in command decide", { exact: false }).count()).toBe(1);
    // quiet boxes, never a modal
    expect(await page.getByRole("dialog").count()).toBe(0);

    // bad input names the field and shows no figure
    await page.getByLabel("Ground distance", { exact: true }).fill("far");
    await expect.poll(() => page.getByText("Ground distance must be a number").count()).toBe(1);
    await expect.poll(slantText).toBe("—");
    await page.getByLabel("Ground distance", { exact: true }).fill("1926");
    await expect.poll(slantText).toBe("1,967.1 ft");
  });

  it("switches to metres, converting the typed figures, and remembers the choice", async () => {
    expect(await pilotUnits()).toBe("ft");
    await page.getByRole("button", { name: "Metres (m)" }).click();
    // 1967.098 ft x 0.3048 m/ft = 599.57 m (1 ft = 0.3048 m exactly, NIST SP 811)
    await expect.poll(slantText).toBe("599.6 m");
    expect(await page.getByLabel("Height above ground level (AGL)").inputValue()).toBe("121.92");
    await expect.poll(pilotUnits).toBe("m");
    await page.reload();
    expect(await page.getByRole("button", { name: "Metres (m)" }).getAttribute("aria-pressed")).toBe("true");
    await page.getByRole("button", { name: "Feet (ft)" }).click();
    await expect.poll(pilotUnits).toBe("ft");
  });

  it("places the target by a click on the site plan and by the arrow keys, measuring on the ellipsoid", async () => {
    await page.goto("/range");
    await useFeet();
    await page.getByLabel("Height above ground level (AGL)").fill("200");
    const plan = page.getByTestId("site-plan");
    const box = (await plan.boundingBox())!;
    await plan.click({ position: { x: box.width * 0.75, y: box.height * 0.3 } });
    await expect.poll(() => page.getByLabel("Target latitude").inputValue()).not.toBe("");
    const read = async () => {
      const v = await Promise.all(["Launch latitude", "Launch longitude", "Target latitude", "Target longitude"].map((l) => page.getByLabel(l).inputValue()));
      return v.map(Number);
    };
    const [lat1, lon1, lat2, lon2] = await read();
    const ref = wgs84.Inverse(lat1, lon1, lat2, lon2);
    // the target is north-east of the launch point (clicked right of and above the centre)
    expect(ref.azi1).toBeGreaterThan(0);
    expect(ref.azi1).toBeLessThan(90);
    const shown = await page.getByTestId("ground-distance").textContent();
    expect(shown).toBe(`${metresToFeet(ref.s12).toLocaleString("en-US", { minimumFractionDigits: 1, maximumFractionDigits: 1 })} ft`);
    expect(await slantText()).toBe(`${metresToFeet(slantRange({ groundDistance: ref.s12, heightAgl: feetToMetres(200) })).toLocaleString("en-US", { minimumFractionDigits: 1, maximumFractionDigits: 1 })} ft`);

    // keyboard alternative: focus the plan, move the target east
    await page.getByRole("application").focus();
    await page.keyboard.press("ArrowRight");
    await expect.poll(async () => Number(await page.getByLabel("Target longitude").inputValue())).toBeGreaterThan(lon2);

    // a typed latitude beyond 90 is refused on its field
    await page.getByLabel("Target latitude").fill("95");
    await expect.poll(() => page.getByText("is beyond 90°", { exact: false }).count()).toBe(1);
  });

  it("logs a range check from a signal-trace interval, sees it on the chart and exports it as CSV", async () => {
    await page.goto(`/range/checks?flightId=${flightId}`);
    await useFeet();
    const events = page.getByTestId("trace-events");
    await events.waitFor();
    // first degradation at 10 s, total loss at 12 s, reacquired at 15 s
    const ours = events.locator("li", { hasText: recordingName });
    expect(await ours.count()).toBe(3);
    await page.getByRole("button", { name: `Log range check: Video lost at 00:00:12.000 of ${recordingName}` }).click();

    const dialog = page.getByRole("dialog");
    expect(await dialog.getByTestId("trace-event-summary").textContent()).toContain("Video lost");
    // prefilled with the flight's logged maximum: 61 m = 200.131 ft
    expect(await dialog.getByLabel("Height above ground level (AGL)").inputValue()).toBe("200.131");
    await dialog.getByLabel("Ground distance from launch").fill("1926");
    await dialog.getByLabel("Bearing from launch").fill("214");
    await dialog.getByLabel("Height above ground level (AGL)").fill("400");
    await dialog.getByLabel("Camera orientation").fill("Pitched up (browser test)");
    await dialog.getByRole("button", { name: "Log range check", exact: true }).click();
    await dialog.waitFor({ state: "detached" });

    // stored on the server with its inputs and the slant range lib/geo computes
    const [row] = await db().select().from(rangeChecks).where(and(eq(rangeChecks.flightId, flightId), eq(rangeChecks.cameraOrientation, "Pitched up (browser test)")));
    expect(row.event).toBe("total_loss");
    expect(row.atSec).toBe(12);
    expect(row.heightAglM).toBe(121.92);
    expect(row.slantRangeM).toBe(slantRange({ groundDistance: feetToMetres(1926), heightAgl: feetToMetres(400) }));

    // in the table and marked logged in the trace list
    const checks = page.getByRole("region", { name: "Range checks of this flight" });
    await expect.poll(() => checks.locator("tbody tr", { hasText: "Pitched up (browser test)" }).count()).toBe(1);
    expect(await checks.locator("tbody tr", { hasText: "Pitched up (browser test)" }).textContent()).toContain("1,967.1 ft");
    await expect.poll(() => ours.filter({ hasText: "Logged" }).count()).toBe(1);

    // on the chart: a labelled point and the table alternative
    const chartTable = page.getByTestId("range-chart-table");
    await expect.poll(() => chartTable.locator("tr", { hasText: "Pitched up (browser test)" }).count()).toBe(1);
    expect(await chartTable.locator("tr", { hasText: "Pitched up (browser test)" }).textContent()).toContain("median 1,967.1 ft");
    await expect.poll(() => page.getByTestId("range-chart").locator("text", { hasText: "1,967 ft" }).count()).toBeGreaterThan(0);
    expect(await page.getByTestId("range-chart").locator(".recharts-symbols").count()).toBeGreaterThan(0);

    // CSV export of this flight, downloaded and read back
    const [download] = await Promise.all([page.waitForEvent("download"), page.getByRole("link", { name: "Export this flight (CSV)" }).click()]);
    expect(download.suggestedFilename()).toMatch(/^range-checks-flight-[0-9a-f]{8}-\d{4}-\d{2}-\d{2}\.csv$/);
    const text = await readFile((await download.path())!, "utf8");
    const lines = text.split("\r\n");
    expect(lines[0]).toBe(RANGE_CHECK_CSV_HEADER.map((h) => `"${h}"`).join(","));
    const line = lines.find((l) => l.includes("Pitched up (browser test)"))!;
    expect(line).toContain('"Video lost"');
    expect(line).toContain(`"${recordingName}"`);
    expect(line).toContain(`,1926,`); // ground distance (ft)
    expect(line).toContain(`,${Number(metresToFeet(row.slantRangeM).toFixed(3))},`); // slant range (ft): 1967.098
    // the id, then the caution column (empty for a check below the common altitude limit)
    expect(line).toMatch(new RegExp(`,"${row.id}",("[^"]*")?$`));
  });
});
