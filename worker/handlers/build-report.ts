// Job "build-report": renders one report version to PDF (@react-pdf/renderer), stores it, records its
// SHA-256, and logs the build in the custody chain (the commit: lib/reports/commit-built-report.ts). Reloads its row; an approved version is never
// rebuilt, a built one is left alone; failures mark the version failed and rethrow for a retry.
import { rm, writeFile } from "node:fs/promises";
import { createHash } from "node:crypto";
import path from "node:path";
import { and, eq, inArray } from "drizzle-orm";
import { db } from "@/db/client";
import { reports } from "@/db/schema";
import { commitBuiltReport } from "@/lib/reports/commit-built-report";
import { reportKey } from "@/lib/storage/storage-keys";
import { loadReportData } from "@/lib/reports/load-report-data";
import { renderReportPdf } from "@/lib/reports/render-report-pdf";
import { putStoredFile, statKey } from "@/lib/storage/store";
import { scratchFolder } from "@/lib/storage/scratch";
import type { JobPayloads } from "@/lib/queue/jobs";
import type { JobContext } from "./job-context";

export type BuildReportOutcome = "built" | "already-built" | "immutable" | "gone";

export async function buildReport(data: JobPayloads["build-report"], ctx: JobContext = {}): Promise<BuildReportOutcome> {
  const [report] = await db().select().from(reports).where(eq(reports.id, data.reportId));
  if (!report) return "gone";
  if (report.state === "approved") return "immutable";
  if (report.state === "ready" && report.storageKey && (await statKey(report.storageKey))) return "already-built";

  const progress = async (p: number) => {
    await db()
      .update(reports)
      .set({ progress: p, updatedAt: new Date() })
      .where(and(eq(reports.id, report.id), eq(reports.state, "building")));
    await ctx.progress?.(p);
  };
  const work = await scratchFolder("report");
  try {
    await db()
      .update(reports)
      .set({ state: "building", progress: 5, failureReason: null, updatedAt: new Date() })
      .where(and(eq(reports.id, report.id), inArray(reports.state, ["queued", "building", "failed", "ready"])));
    const content = await loadReportData(report.organisationId, report.id);
    await progress(30);
    if (ctx.signal?.aborted) throw new Error("cancelled");
    const pdf = await renderReportPdf(content);
    await progress(85);
    const sha256 = createHash("sha256").update(pdf).digest("hex");
    const file = path.join(work, "report.pdf");
    await writeFile(file, pdf);
    const key = reportKey(report.organisationId, report.jobId, report.id);
    await putStoredFile(file, key, { consume: true });

    await commitBuiltReport({ report, storageKey: key, sizeBytes: pdf.length, sha256, findings: content.findings.length, recordings: content.recordings.length });
    await ctx.progress?.(100);
    return "built";
  } catch (err) {
    await db()
      .update(reports)
      .set({ state: "failed", failureReason: (err as Error).message.split("\n")[0].slice(0, 300), updatedAt: new Date() })
      .where(and(eq(reports.id, report.id), inArray(reports.state, ["queued", "building"])))
      .catch(() => {});
    throw err;
  } finally {
    await rm(work, { recursive: true, force: true });
  }
}
