import { h, text, view, type PdfNode } from "./tree";
import { colour, font, PAGE } from "./styles";
import type { PdfOrganisation, PdfProject } from "./types";

/** What the title block prints; the same block heads sheet pages and package pages. */
export interface TitleBlock {
  organisation: PdfOrganisation;
  project: Pick<PdfProject, "code" | "name">;
  /** Sheet tag, or "PACKAGE". */
  tag: string;
  title: string;
  revision: string;
  status: string;
  prepared: string;
  approved: string;
}

const label = (t: string) => text({ fontSize: 6, color: colour.muted, textTransform: "uppercase" }, t);
const value = (t: string, extra: Record<string, unknown> = {}) => text({ fontSize: 8.5, fontWeight: 500, ...extra }, t);

function field(l: string, v: PdfNode | string, style: Record<string, unknown>) {
  return view({ paddingHorizontal: 5, paddingVertical: 3, borderRightWidth: 0.5, borderRightColor: colour.rule, ...style }, label(l), typeof v === "string" ? value(v) : v);
}

const PAGE_CELL_WIDTH = 62;

/**
 * The title block, fixed at the top of every page. The page number sits in its last
 * cell but is placed directly on the page: react-pdf fills page numbers in reliably only
 * for a text positioned on the page itself.
 */
export function titleBlock(b: TitleBlock): PdfNode[] {
  return [titleBox(b), h("PageNo", { fixed: true, template: "{page} of {pages}", style: { position: "absolute", top: PAGE.margin + 40 + 12, left: PAGE.width - PAGE.margin - PAGE_CELL_WIDTH + 5, fontSize: 8.5, fontWeight: 500 } })];
}

function titleBox(b: TitleBlock): PdfNode {
  const logo = b.organisation.logo
    ? h("Image", { src: b.organisation.logo, style: { height: 26, maxWidth: 90, objectFit: "contain", marginRight: 6 } })
    : null;
  return h(
    "View",
    {
      fixed: true,
      style: { position: "absolute", top: PAGE.margin, left: PAGE.margin, right: PAGE.margin, height: PAGE.headerHeight - 14, borderWidth: 0.75, borderColor: colour.text },
    },
    view(
      { flexDirection: "row", height: 40, borderBottomWidth: 0.5, borderBottomColor: colour.rule },
      view(
        { width: 170, flexDirection: "row", alignItems: "center", paddingHorizontal: 6, borderRightWidth: 0.5, borderRightColor: colour.rule },
        logo,
        text({ fontSize: 9.5, fontWeight: 700, maxWidth: logo ? 70 : 160 }, b.organisation.name),
      ),
      field("Project", view({}, value(b.project.code, { fontFamily: font.mono, fontWeight: 700 }), text({ fontSize: 7.5, maxLines: 1, textOverflow: "ellipsis" }, b.project.name)), { width: 150 }),
      field(
        b.tag === "PACKAGE" ? "Document" : "Sheet",
        view({}, value(b.tag, { fontFamily: font.mono, fontWeight: 700 }), text({ fontSize: 7.5, maxLines: 1, textOverflow: "ellipsis" }, b.title)),
        { flexGrow: 1, flexBasis: 0, borderRightWidth: 0 },
      ),
    ),
    view(
      { flexDirection: "row", flexGrow: 1 },
      field("Revision", value(b.revision, { fontFamily: font.mono, fontWeight: 700, fontSize: 11 }), { width: 52 }),
      field("Status", value(b.status, { fontWeight: 700, color: b.status === "Approved" || b.status === "Issued" ? colour.pass : colour.draft }), { width: 68 }),
      field("Prepared by", b.prepared, { width: 150 }),
      field("Checked and approved by", b.approved, { flexGrow: 1, flexBasis: 0 }),
      view({ width: PAGE_CELL_WIDTH, paddingHorizontal: 5, paddingVertical: 3 }, label("Page")),
    ),
  );
}

export const CAUTION = "Design aid. Verify under the governing standard and local codes; a qualified engineer decides.";

/** The footer, fixed at the bottom of every page: the caution and where the numbers came from. */
export function footer(note: string): PdfNode {
  return h(
    "View",
    {
      fixed: true,
      style: { position: "absolute", bottom: PAGE.margin - 8, left: PAGE.margin, right: PAGE.margin, borderTopWidth: 0.5, borderTopColor: colour.rule, paddingTop: 4 },
    },
    text({ fontSize: 7, fontWeight: 600, color: colour.text }, CAUTION),
    text({ fontSize: 6.5, color: colour.muted }, note),
  );
}

/** The diagonal DRAFT mark of a revision that is not approved: on every page, behind nothing, over everything. */
export function draftWatermark(): PdfNode {
  return h(
    "View",
    { fixed: true, style: { position: "absolute", top: 0, left: 0, width: PAGE.width, height: PAGE.height, alignItems: "center", justifyContent: "center" } },
    text({ fontSize: 150, fontWeight: 700, color: colour.draft, opacity: 0.13, transform: "rotate(-52deg)" }, "DRAFT"),
  );
}
