import type { ScheduleError, ScheduleRowResult } from "@/lib/schedules/types";
import { CAUTION } from "./chrome";
import { h, text, view, type PdfChild, type PdfNode } from "./tree";
import { colour, font, isoDate, s } from "./styles";

/**
 * The cable schedule as a package section: what was uploaded (file name and SHA-256,
 * table version, limit), the counts, a compact table of every computed row with its
 * pass/fail and reasons, the rows that could not be computed, and the caution. Plain data
 * in, a page tree out (react-pdf breaks it into as many pages as the rows need).
 */
export interface SchedulePdfData {
  id: number;
  filename: string;
  fileSha256: string;
  resultsHash: string;
  engineVersion: string;
  uploadedBy: string;
  uploadedAt: Date;
  table: { name: string; version: number; source: string } | null;
  limit: string;
  rowCount: number;
  validCount: number;
  failCount: number;
  results: ScheduleRowResult[];
  errors: ScheduleError[];
}

/** Errors printed in the section; the rest are counted. */
const MAX_PRINTED_ERRORS = 300;

type Col = { title: string; width: number | "grow"; align?: "right" };

const COLS: Col[] = [
  { title: "Row", width: 24, align: "right" },
  { title: "Tag", width: 52 },
  { title: "From → to", width: "grow" },
  { title: "Size", width: 62 },
  { title: "L m", width: 32, align: "right" },
  { title: "I A", width: 32, align: "right" },
  { title: "Iz A", width: 34, align: "right" },
  { title: "Use %", width: 28, align: "right" },
  { title: "θ °C", width: 28, align: "right" },
  { title: "ΔU V", width: 30, align: "right" },
  { title: "ΔU %", width: 28, align: "right" },
  { title: "Lim %", width: 26, align: "right" },
  { title: "Result", width: 30 },
];

const cellStyle = (c: Col) => ({ ...s.cell, paddingHorizontal: 2, ...(c.width === "grow" ? { flexGrow: 1, flexBasis: 0 } : { width: c.width }), ...(c.align ? { textAlign: c.align } : {}) });

const num = (x: number, d: number) => (Number.isFinite(x) ? x.toFixed(d) : "—");
const sig = (x: number) => (Number.isFinite(x) ? String(Number(x.toPrecision(4))) : "—");

function head(): PdfNode {
  return h("View", { fixed: true, style: { ...s.tableHead, fontSize: 6.5 } }, COLS.map((c) => text(cellStyle(c), c.title)));
}

function row(r: ScheduleRowResult): PdfNode {
  const cells = [
    String(r.row),
    r.tag,
    `${r.from || "—"} → ${r.to || "—"}`,
    `${r.parallel > 1 ? `${r.parallel}×` : ""}${r.sizeLabel} ${r.material === "aluminium" ? "Al" : "Cu"}`,
    sig(r.length_m),
    sig(r.current_A),
    sig(r.ampacity_A),
    num(r.utilisation * 100, 0),
    num(r.conductorTemperature_C, 0),
    num(r.drop_V, 1),
    num(r.drop_percent, 2),
    sig(r.limit_percent),
    r.pass ? "PASS" : "FAIL",
  ];
  return h(
    "View",
    { wrap: false, style: { borderBottomWidth: 0.4, borderBottomColor: colour.grid, fontSize: 6.5 } },
    view(
      { flexDirection: "row" },
      cells.map((c, i) => {
        const col = COLS[i]!;
        const extra = i === 1 ? { fontFamily: font.mono } : i === COLS.length - 1 ? { fontWeight: 700, color: r.pass ? colour.pass : colour.fail } : {};
        return text({ ...cellStyle(col), ...extra }, c);
      }),
    ),
    r.reasons.length ? text({ paddingLeft: 78, paddingBottom: 1.5, fontSize: 6, color: colour.fail }, r.reasons.join("; ")) : null,
  );
}

function facts(d: SchedulePdfData): PdfNode {
  const kv = (k: string, v: string, mono = false) =>
    view({ flexDirection: "row", marginBottom: 1 }, text({ width: 92, color: colour.muted, fontSize: 8 }, k), text({ flexGrow: 1, flexBasis: 0, fontSize: 8.5, ...(mono ? { fontFamily: font.mono, fontSize: 7.5 } : {}) }, v));
  return view(
    { marginBottom: 6 },
    kv("File", d.filename),
    kv("File SHA-256", d.fileSha256, true),
    kv("Uploaded", `${d.uploadedBy} · ${isoDate(d.uploadedAt)}`),
    kv("Ampacity table", d.table ? `${d.table.name} v${d.table.version}${d.table.source ? ` — ${d.table.source}` : ""}` : "None: ampacities as given in the file"),
    kv("Voltage-drop limit", d.limit),
    kv("Rows", `${d.rowCount} in the file · ${d.validCount} computed · ${d.validCount - d.failCount} pass · ${d.failCount} fail · ${d.rowCount - d.validCount} not computed (errors)`),
    kv("Engine · results", `${d.engineVersion} · ${d.resultsHash.slice(0, 32)}`, true),
  );
}

function errorList(d: SchedulePdfData): PdfChild[] {
  if (!d.errors.length) return [];
  const shown = d.errors.slice(0, MAX_PRINTED_ERRORS);
  return [
    text(s.h2, "Rows not computed"),
    ...shown.map((e) => h("View", { wrap: false, style: { flexDirection: "row", fontSize: 7, marginBottom: 1 } }, text({ width: 40, color: colour.muted }, e.row > 0 ? `row ${e.row}` : "file"), text({ flexGrow: 1, flexBasis: 0 }, e.message))),
    d.errors.length > shown.length ? text({ fontSize: 7, color: colour.muted }, `${d.errors.length - shown.length} more errors are not printed; they are listed on the schedule page.`) : null,
  ];
}

/** The section's body (after the title block and footer the package adds). */
export function scheduleSection(d: SchedulePdfData, mark?: string): PdfChild[] {
  return [
    mark ? h("Mark", { id: mark }) : null,
    text({ fontSize: 15, fontWeight: 700, marginBottom: 4, lineHeight: 1.25 }, "Cable schedule"),
    text({ fontSize: 9, color: colour.muted, marginBottom: 6 }, "Voltage drop (exact phasor method, at the conductor temperature at the load current), conductor temperature θ = θa + (θmax − θa)·(I/Iz)² and the ampacity check of every feeder of the uploaded schedule."),
    facts(d),
    h(
      "View",
      { wrap: false, style: { marginBottom: 8, padding: 6, borderWidth: 1, borderColor: colour.warn, backgroundColor: "#fff8ec" } },
      text({ fontWeight: 700, fontSize: 8.5 }, "Caution"),
      text({ fontSize: 8 }, CAUTION),
    ),
    text(s.h2, "Feeders"),
    head(),
    ...d.results.map(row),
    d.results.length === 0 ? text({ color: colour.fail, marginTop: 4 }, "No row of the file could be computed.") : null,
    ...errorList(d),
  ];
}

/** The schedule as one page element of a package, with the package's title block and footer. */
export function schedulePage(d: SchedulePdfData, chrome: PdfNode[], mark: string): PdfNode {
  return h("Page", { size: "A4", style: s.page }, chrome, scheduleSection(d, mark));
}
