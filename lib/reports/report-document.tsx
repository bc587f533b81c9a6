// The inspection report as a PDF document (@react-pdf/renderer): cover, counts by severity, each
// finding with its still, the recordings and their original hashes, how originals were preserved,
// and the safety cautions. Every severity is written as a word; the stone beside it repeats it.
//
// The primitives come in as an argument: the worker runs under tsx as CommonJS, where a static
// require of @react-pdf/renderer fails (its @react-pdf/hyphenate dependency exports for `import`
// only), so render-report-pdf.ts loads the library with a dynamic import() and hands it over.
import type * as ReactPdf from "@react-pdf/renderer";
import type { ReportData, ReportFinding } from "./report-data";
import { SEVERITY_SCALE } from "@/lib/findings/severity-scale";
import { formatMoment } from "@/lib/findings/describe-moment";

const INK = "#1d2430";
const INK2 = "#4a5361";
const LINE = "#c9c5ba";
const LAKE = "#0f6e7a";
const PAPER2 = "#eeece5";

export type ReportDocumentProps = { data: ReportData; stills: Map<string, Buffer> };

/** Builds the document component from the library's primitives (see the note above). */
export function makeReportDocument(pdf: typeof ReactPdf): (props: ReportDocumentProps) => React.ReactElement {
  const { Document, Image, Page, StyleSheet, Text, View } = pdf;
  const st = StyleSheet.create({
    page: { fontFamily: "Plex Sans", fontSize: 9.5, color: INK, paddingTop: 40, paddingBottom: 48, paddingHorizontal: 42 },
    mono: { fontFamily: "Plex Mono", fontSize: 8.5 },
    hash: { fontFamily: "Plex Mono", fontSize: 7.5 },
    h1: { fontSize: 22, fontWeight: 600, lineHeight: 1.25, marginTop: 2, marginBottom: 6 },
    h2: { fontSize: 13, fontWeight: 600, marginTop: 14, marginBottom: 6, color: INK },
    h3: { fontSize: 10.5, fontWeight: 600 },
    muted: { color: INK2 },
    row: { flexDirection: "row" },
    label: { width: 110, color: INK2 },
    value: { flex: 1 },
    table: { borderTopWidth: 1, borderColor: LINE },
    tr: { flexDirection: "row", borderBottomWidth: 0.5, borderColor: LINE, paddingVertical: 3 },
    th: { fontWeight: 600 },
    finding: { borderWidth: 1, borderColor: LINE, borderRadius: 4, padding: 10, marginBottom: 10 },
    // no lineHeight on the page: with one, the footer's page-number Text (render prop) is dropped (@react-pdf/renderer 4.9)
    footer: { position: "absolute", bottom: 20, left: 42, right: 42, fontSize: 7.5, color: INK2, flexDirection: "row", justifyContent: "space-between" },
    caution: { borderWidth: 1, borderColor: "#8a4b00", borderRadius: 4, padding: 8, marginBottom: 6 },
  });

  function Stone({ severity }: { severity: ReportFinding["severity"] }) {
    const level = SEVERITY_SCALE[severity];
    return <View style={{ width: 14, height: 9, borderRadius: 4.5, borderWidth: level.outlinePx, borderColor: INK, backgroundColor: PAPER2, marginRight: 5 }} />;
  }

  function Field({ label, children, mono }: { label: string; children: React.ReactNode; mono?: boolean }) {
    return (
      <View style={[st.row, { marginBottom: 2 }]} wrap={false}>
        <Text style={st.label}>{label}</Text>
        <Text style={[st.value, ...(mono ? [st.mono] : [])]}>{children}</Text>
      </View>
    );
  }

  function Mark() {
    return (
      <View style={{ alignItems: "center", width: 26, marginRight: 8 }}>
        <View style={{ width: 8, height: 6, borderRadius: 3, backgroundColor: LAKE, marginBottom: 1 }} />
        <View style={{ width: 14, height: 6.5, borderRadius: 3.25, backgroundColor: INK, marginBottom: 1 }} />
        <View style={{ width: 20, height: 7, borderRadius: 3.5, backgroundColor: INK }} />
      </View>
    );
  }

  function StillImage({ f, data }: { f: ReportFinding; data: Buffer | undefined }) {
    if (!f.still || !data) return <Text style={[st.muted, { marginVertical: 4 }]}>{f.stillMissing ?? "No still."}</Text>;
    const w = f.still.width ?? 16;
    const h = f.still.height ?? 9;
    const maxW = 511;
    const maxH = 260;
    const scale = Math.min(maxW / w, maxH / h);
    const dw = w * scale;
    const dh = h * scale;
    return (
      <View style={{ width: dw, height: dh, marginVertical: 6, position: "relative" }}>
        {/* a PDF image takes no alt text; the finding's fields printed below describe it */}
        {/* eslint-disable-next-line jsx-a11y/alt-text */}
        <Image src={{ data, format: "jpg" }} style={{ width: dw, height: dh }} />
        {f.box && (
          <View
            style={{
              position: "absolute",
              left: f.box.x * dw,
              top: f.box.y * dh,
              width: f.box.w * dw,
              height: f.box.h * dh,
              borderWidth: 1,
              borderColor: "#000000",
            }}
          >
            {/* white inside black: visible on light and dark footage alike */}
            <View style={{ flex: 1, borderWidth: 1.5, borderColor: "#ffffff" }} />
          </View>
        )}
      </View>
    );
  }

  function FindingBlock({ f, still }: { f: ReportFinding; still: Buffer | undefined }) {
    return (
      <View style={st.finding} wrap={false}>
        <View style={[st.row, { alignItems: "center", marginBottom: 2 }]}>
          <Stone severity={f.severity} />
          <Text style={st.h3}>
            Finding {f.number}: {f.severityLabel}
            {f.category ? ` · ${f.category}` : ""}
          </Text>
        </View>
        <StillImage f={f} data={still} />
        <Field label={f.end ? "From" : "Moment"} mono>
          {formatMoment(f.start)}
        </Field>
        {f.end && (
          <Field label="To" mono>
            {formatMoment(f.end)}
          </Field>
        )}
        <Field label="Severity">
          {f.severityLabel} (FHWA NBI condition rating {f.nbiRating}, {f.nbiWord}): {f.severityMeaning}
        </Field>
        <Field label="Category">{f.category ?? "None given"}</Field>
        <Field label="Note">{f.note || "None"}</Field>
        <Field label="Recording">{f.recordingName}</Field>
        <View style={[st.row, { marginBottom: 2 }]} wrap={false}>
          <Text style={st.label}>Original SHA-256</Text>
          <Text style={[st.value, st.hash]}>{f.recordingSha256}</Text>
        </View>
        {f.still?.sha256 && (
          <View style={[st.row, { marginBottom: 2 }]} wrap={false}>
            <Text style={st.label}>Still SHA-256</Text>
            <Text style={[st.value, st.hash]}>{f.still.sha256}</Text>
          </View>
        )}
        {f.position && (
          <Field label="Position" mono>
            {f.position}
          </Field>
        )}
        {f.distances && <Field label="Distance">{f.distances}</Field>}
        <Field label="Marked by">
          {f.markedBy ?? "Unknown"} (finding version {f.version})
        </Field>
      </View>
    );
  }

  function ReportDocument({ data, stills }: ReportDocumentProps) {
    const total = data.findings.length;
    return (
      <Document title={`Inspection report: ${data.job.title} (version ${data.version})`} author={data.organisationName} creator="Cairn" producer="Cairn">
        <Page size="A4" style={st.page}>
          <View style={[st.row, { alignItems: "center", marginBottom: 18 }]}>
            <Mark />
            <Text style={{ fontSize: 11, fontWeight: 600 }}>{data.organisationName}</Text>
          </View>
          <Text style={[st.muted, { fontSize: 10 }]}>Inspection report · version {data.version}</Text>
          <Text style={st.h1}>{data.job.title}</Text>
          <Text style={[st.muted, { marginBottom: 12 }]}>
            Built {data.builtAt}
            {data.builtBy ? ` by ${data.builtBy}` : ""}
          </Text>

          <Field label="Client">
            {data.client.name}
            {data.client.contact ? ` (${data.client.contact})` : ""}
          </Field>
          <Field label="Site">{data.site.name}</Field>
          {data.site.address && <Field label="Address">{data.site.address}</Field>}
          {data.site.coordinates && (
            <Field label="Coordinates" mono>
              {data.site.coordinates}
            </Field>
          )}
          <Field label="Asset">{data.site.assetKind}</Field>
          {data.job.scope && <Field label="Scope">{data.job.scope}</Field>}
          <Field label="Job status">{data.job.status}</Field>
          {data.job.dueDate && <Field label="Due">{data.job.dueDate}</Field>}
          {data.crew.map((c) => (
            <Field key={c.role} label={c.role}>
              {c.name}
            </Field>
          ))}

          <Text style={st.h2}>Flights</Text>
          {data.flights.length === 0 ? (
            <Text style={st.muted}>No flights logged for this job.</Text>
          ) : (
            <View style={st.table}>
              <View style={[st.tr, st.th]}>
                <Text style={{ width: 62 }}>Date</Text>
                <Text style={{ width: 90 }}>Pilot</Text>
                <Text style={{ flex: 1 }}>Aircraft</Text>
                <Text style={{ width: 110 }}>Launch point</Text>
                <Text style={{ width: 92 }}>Max altitude</Text>
              </View>
              {data.flights.map((f, i) => (
                <View key={i} style={st.tr} wrap={false}>
                  <Text style={[st.mono, { width: 62 }]}>{f.flownOn}</Text>
                  <Text style={{ width: 90 }}>{f.pilot ?? "—"}</Text>
                  <Text style={{ flex: 1 }}>{f.aircraft ?? "—"}</Text>
                  <Text style={[st.mono, { width: 110 }]}>{f.launch ?? "—"}</Text>
                  <Text style={[st.mono, { width: 92 }]}>{f.maxAltitude ?? "—"}</Text>
                </View>
              ))}
            </View>
          )}

          <Text style={st.h2}>Findings by severity</Text>
          <View style={st.table}>
            <View style={[st.tr, st.th]}>
              <Text style={{ width: 120 }}>Severity</Text>
              <Text style={{ flex: 1 }}>Condition rating (FHWA NBI, 0 failed to 9 excellent)</Text>
              <Text style={{ width: 50, textAlign: "right" }}>Findings</Text>
            </View>
            {data.counts.map((c) => (
              <View key={c.severity} style={[st.tr, { alignItems: "center" }]}>
                <View style={[st.row, { width: 120, alignItems: "center" }]}>
                  <Stone severity={c.severity} />
                  <Text>{c.label}</Text>
                </View>
                <Text style={{ flex: 1 }}>
                  {c.nbiRating} ({c.nbiWord})
                </Text>
                <Text style={[st.mono, { width: 50, textAlign: "right" }]}>{c.count}</Text>
              </View>
            ))}
            <View style={[st.tr, st.th]}>
              <Text style={{ flex: 1 }}>Total</Text>
              <Text style={[st.mono, { width: 50, textAlign: "right" }]}>{total}</Text>
            </View>
          </View>
          <Footer data={data} />
        </Page>

        <Page size="A4" style={st.page}>
          <Text style={st.h2}>Findings</Text>
          {total === 0 && <Text style={st.muted}>No findings were marked in this job&apos;s recordings.</Text>}
          {data.findings.map((f) => (
            <FindingBlock key={f.id} f={f} still={stills.get(f.id)} />
          ))}
          <Footer data={data} />
        </Page>

        <Page size="A4" style={st.page}>
          <Text style={st.h2}>Recordings and their originals</Text>
          <View style={st.table}>
            {data.recordings.map((r, i) => (
              <View key={i} style={[st.tr, { flexDirection: "column" }]} wrap={false}>
                <Text style={{ fontWeight: 600 }}>{r.name}</Text>
                <Text style={st.muted}>
                  Flown {r.flownOn} · uploaded {r.uploadedAt} · {r.size}
                  {r.duration ? ` · ${r.duration}` : ""}
                </Text>
                {r.signal && <Text style={st.muted}>{r.signal}</Text>}
                <Text style={st.hash}>SHA-256 {r.sha256}</Text>
              </View>
            ))}
          </View>
          {data.recordings.length === 0 && <Text style={st.muted}>No recordings were filed to this job.</Text>}

          <Text style={st.h2}>How the originals were preserved</Text>
          {data.preservation.map((p, i) => (
            <Text key={i} style={{ marginBottom: 4 }}>
              {p}
            </Text>
          ))}
          {data.custodyHead && (
            <View style={{ marginBottom: 4 }} wrap={false}>
              <Text>
                When this report was built, the custody log&apos;s newest entry was number {data.custodyHead.seq} ({data.custodyHead.occurredAt}). Its chain hash is printed below: in an
                export of the log made at any later time, entry {data.custodyHead.seq} must still carry it. If any entry up to it had been altered or removed, it would not.
              </Text>
              <Text style={st.hash}>
                custody entry {data.custodyHead.seq} chain SHA-256 {data.custodyHead.hash}
              </Text>
            </View>
          )}

          <Text style={st.h2}>Safety cautions</Text>
          {data.cautions.map((c) => (
            <View key={c.id} style={st.caution} wrap={false}>
              <Text style={{ fontWeight: 600 }}>Caution: {c.summary}</Text>
              <Text>{c.detail}</Text>
              <Text style={st.muted}>Sources: {c.sources.join("; ")}</Text>
            </View>
          ))}
          <Footer data={data} />
        </Page>
      </Document>
    );
  }

  function Footer({ data }: { data: ReportData }) {
    return (
      <View style={st.footer} fixed>
        <Text>
          {data.organisationName} · {data.job.title} · report version {data.version}
        </Text>
        <Text render={({ pageNumber, totalPages }) => `Page ${pageNumber} of ${totalPages}`} />
      </View>
    );
  }

  return ReportDocument;
}
