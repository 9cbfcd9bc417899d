import { CAUTION, footer, titleBlock } from "./chrome";
import { mathText } from "./math-text";
import { schedulePage, type SchedulePdfData } from "./schedule-pages";
import { isStamped, sheetPage } from "./sheet-pages";
import { h, text, view, type PdfNode } from "./tree";
import { colour, font, isoDate, s } from "./styles";
import type { PdfOrganisation, PdfProject, SheetPdfData } from "./types";

/**
 * The calculation package: a cover, the revision and status table, an index with page
 * numbers, every included sheet in project order, and the basis and cautions page.
 * Page numbers: marks record where each part starts; the index prints them in the same
 * rendering (live page references, filled in once every page is split). Should what the
 * index printed ever differ from where the parts landed, the package is rendered again
 * with the numbers fixed (see renderPackage).
 */
export interface PackageInfo {
  organisation: PdfOrganisation;
  project: PdfProject;
  label: string;
  issuedAt: Date;
  issuedBy: string;
  includesDrafts: boolean;
  sheets: SheetPdfData[];
  /** The project's current cable schedule, printed after the sheets (absent when none was uploaded). */
  schedule?: SchedulePdfData | null;
}

export const BASIS_MARK = "basis";
export const SCHEDULE_MARK = "cable-schedule";
export const sheetMark = (d: SheetPdfData) => `sheet-${d.sheet.id}`;

const STATUS: Record<SheetPdfData["revision"]["status"], string> = { draft: "Draft", in_review: "In review", returned: "Returned", approved: "Approved", superseded: "Superseded" };

function chrome(p: PackageInfo, title: string): PdfNode[] {
  return [
    ...titleBlock({
      organisation: p.organisation,
      project: p.project,
      tag: "PACKAGE",
      title,
      revision: p.label,
      status: p.includesDrafts ? "With drafts" : "Issued",
      prepared: `${p.issuedBy} · ${isoDate(p.issuedAt)}`,
      approved: "Per sheet (see the status table)",
    }),
    footer(`${p.project.code} calculation package ${p.label} · issued ${isoDate(p.issuedAt)} · ${p.sheets.length} sheet${p.sheets.length === 1 ? "" : "s"}`),
  ];
}

function cover(p: PackageInfo): PdfNode {
  const line = (k: string, v: string) => view({ flexDirection: "row", marginBottom: 6 }, text({ width: 120, color: colour.muted, fontSize: 10 }, k), text({ flexGrow: 1, flexBasis: 0, fontSize: 12, fontWeight: 500 }, v));
  return h(
    "Page",
    { size: "A4", style: s.page },
    chrome(p, "Cover"),
    view(
      { marginTop: 90, borderLeftWidth: 4, borderLeftColor: colour.accent, paddingLeft: 16 },
      text({ fontSize: 11, color: colour.muted, textTransform: "uppercase" }, "Calculation package"),
      text({ fontSize: 28, fontWeight: 700, marginTop: 6, fontFamily: font.mono, lineHeight: 1.25 }, p.project.code),
      text({ fontSize: 20, fontWeight: 600, marginTop: 4, marginBottom: 28, lineHeight: 1.25 }, p.project.name),
      line("Client", p.project.client || "—"),
      line("Site", p.project.site || "—"),
      line("Package revision", p.label),
      line("Date of issue", isoDate(p.issuedAt)),
      line("Issued by", p.issuedBy),
      line("Prepared by", p.organisation.name),
      line("Sheets", `${p.sheets.length}${p.includesDrafts ? " (includes drafts, marked DRAFT)" : ", all approved"}`),
    ),
    view(
      { marginTop: 60, padding: 10, borderWidth: 1, borderColor: colour.warn, backgroundColor: "#fff8ec" },
      text({ fontWeight: 700, fontSize: 10 }, "Caution"),
      text({ fontSize: 9.5 }, CAUTION),
      text({ fontSize: 8.5, color: colour.muted, marginTop: 2 }, "Each approved sheet carries a stamp with a code; anyone can confirm at the printed address that the revision is still the one in force."),
    ),
  );
}

function tableHead(cols: [string, number | "grow", ("right" | undefined)?][]): PdfNode {
  return h("View", { fixed: true, style: s.tableHead }, cols.map(([t, w, a]) => text({ ...s.cell, ...(w === "grow" ? { flexGrow: 1, flexBasis: 0 } : { width: w }), ...(a ? { textAlign: a } : {}) }, t)));
}

function statusTable(p: PackageInfo): PdfNode {
  const cols: [string, number | "grow", ("right" | undefined)?][] = [["Sheet", 52], ["Title", "grow"], ["Rev", 28], ["Status", 58], ["Prepared by", 95], ["Approved by", 95], ["Approved", 58]];
  return h(
    "Page",
    { size: "A4", style: s.page },
    chrome(p, "Revision and status"),
    text(s.h2, "Revision and status of the sheets"),
    tableHead(cols),
    p.sheets.map((d) => {
      const r = d.revision;
      const stamped = isStamped(r.status);
      const cells = [d.sheet.tag, d.sheet.title, r.label, STATUS[r.status], r.authorName, stamped ? (r.checkedByName ?? "—") : "—", stamped ? isoDate(r.decidedAt) : "—"];
      return h(
        "View",
        { wrap: false, style: s.tableRow },
        cells.map((c, i) => {
          const [, w] = cols[i]!;
          return text({ ...s.cell, ...(w === "grow" ? { flexGrow: 1, flexBasis: 0 } : { width: w }), ...(i === 0 || i === 2 ? { fontFamily: font.mono } : {}), ...(i === 3 ? { color: stamped ? colour.pass : colour.draft, fontWeight: 600 } : {}) }, c);
        }),
      );
    }),
  );
}

const PAGE_COLUMN = { width: 50, textAlign: "right", fontWeight: 600 } as const;

/**
 * A live page reference, placed absolutely over a blank line of the cell: react-pdf
 * drops a render-prop text that flows in a row under an inherited line height, and the
 * blank line keeps the row exactly as tall as with a written number.
 */
function livePageRef(mark: string): PdfNode {
  return view({ width: PAGE_COLUMN.width }, text({}, " "), h("PageRef", { id: mark, style: { ...PAGE_COLUMN, position: "absolute", top: 0, left: 0 } }));
}

/** The index; `pages` maps marks to page numbers, or null for live page references. */
function index(p: PackageInfo, pages: Record<string, number> | null): PdfNode {
  const pageOf = (mark: string) => (pages ? text(PAGE_COLUMN, String(pages[mark] ?? "—")) : livePageRef(mark));
  const row = (tag: string, title: string, rev: string, mark: string) =>
    h(
      "View",
      { wrap: false, style: { flexDirection: "row", paddingVertical: 3, borderBottomWidth: 0.5, borderBottomColor: colour.grid } },
      text({ width: 60, fontFamily: font.mono }, tag),
      text({ flexGrow: 1, flexBasis: 0 }, title),
      text({ width: 40, fontFamily: font.mono }, rev),
      pageOf(mark),
    );
  return h(
    "Page",
    { size: "A4", style: s.page },
    chrome(p, "Index"),
    text(s.h2, "Index"),
    view({ flexDirection: "row", paddingVertical: 3, borderBottomWidth: 0.75, borderBottomColor: colour.text }, text({ width: 60, fontWeight: 600 }, "Sheet"), text({ flexGrow: 1, flexBasis: 0, fontWeight: 600 }, "Title"), text({ width: 40, fontWeight: 600 }, "Rev"), text({ width: 50, textAlign: "right", fontWeight: 600 }, "Page")),
    p.sheets.map((d) => row(d.sheet.tag, d.sheet.title, d.revision.label, sheetMark(d))),
    p.schedule ? row("CS", `Cable schedule — ${p.schedule.filename} (${p.schedule.rowCount} rows)`, "", SCHEDULE_MARK) : null,
    row("—", "Basis of calculation and cautions", "", BASIS_MARK),
  );
}

/** Every distinct published source of the included sheets' formulas, in first-use order. */
export function collectSources(sheets: SheetPdfData[]): string[] {
  const seen = new Set<string>();
  for (const d of sheets) for (const f of d.revision.results?.formulas ?? []) seen.add(f.source.trim());
  return [...seen].filter(Boolean);
}

function basis(p: PackageInfo): PdfNode {
  const para = (t: string) => text({ marginBottom: 5, fontSize: 9 }, t);
  const sources = collectSources(p.sheets);
  const engines = [...new Set(p.sheets.map((d) => d.revision.engineVersion))].join(", ");
  return h(
    "Page",
    { size: "A4", style: s.page },
    chrome(p, "Basis and cautions"),
    h("Mark", { id: BASIS_MARK }),
    text(s.h2, "Basis of calculation and cautions"),
    text({ fontWeight: 700, fontSize: 10, marginBottom: 4 }, CAUTION),
    para("The sheets in this package are design aids. Their results follow from the inputs and methods printed on each sheet; they do not replace verification under the governing standard, the local codes and regulations of the installation, and the judgement of a qualified engineer, who decides."),
    para("Local codes, the authority having jurisdiction and licensed engineering practice govern wherever they differ from the methods below. Where a method is marked common practice, it is the usual engineering approach and not a clause of a standard."),
    text({ fontWeight: 600, fontSize: 10, marginTop: 6, marginBottom: 3 }, "Assumptions"),
    para("Steady state unless a sheet states a duration; ambient and limits as entered on each sheet; material properties from the engine's tables at the stated temperatures; values rounded for print only (the stored results keep full precision and are identified by their content hash)."),
    para(`Results computed by the Ohmstead engine, version ${engines || "—"}. Each sheet's footer names its content hash.`),
    text({ fontWeight: 600, fontSize: 10, marginTop: 6, marginBottom: 3 }, "Standards and methods used"),
    sources.length ? sources.map((src) => view({ flexDirection: "row", marginBottom: 2 }, text({ width: 10, color: colour.muted }, "•"), mathText(src, { flexGrow: 1, flexBasis: 0, fontSize: 8.5 }, { indices: false }))) : para("No formulas were recorded on the included sheets."),
  );
}

/** The marks the index refers to: every sheet's, the cable schedule's, then the basis page's. */
export function indexMarks(p: PackageInfo): string[] {
  return [...p.sheets.map(sheetMark), ...(p.schedule ? [SCHEDULE_MARK] : []), BASIS_MARK];
}

/** The whole package as one Document tree (`pages` null: the index refers to the marks live). */
export function packageDocument(p: PackageInfo, pages: Record<string, number> | null): PdfNode {
  return h(
    "Document",
    { title: `${p.project.code} calculation package ${p.label}`, author: p.organisation.name, creator: "Ohmstead", producer: "Ohmstead" },
    cover(p),
    statusTable(p),
    index(p, pages),
    p.sheets.map((d) => sheetPage(d, { mark: sheetMark(d) })),
    p.schedule ? schedulePage(p.schedule, chrome(p, "Cable schedule"), SCHEDULE_MARK) : null,
    basis(p),
  );
}
