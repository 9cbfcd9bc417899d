import type { BusbarRatingResults } from "@/lib/engine/busbar-thermal";
import type { NetworkResults } from "@/lib/engine/network";
import type { ParallelSharingResults } from "@/lib/engine/parallel";
import type { VoltageDropResults } from "@/lib/engine/voltage-drop";
import { CAUTION, draftWatermark, footer, titleBlock } from "./chrome";
import { arrangementOf, crossSectionDrawing, pathSharesDrawing, temperatureCurveDrawing, voltageProfileDrawing } from "./drawings";
import { networkDrawing } from "./network-drawing";
import { heading, inputsSection, intermediatesSection, methodSection, resultsSection, warningsSection } from "./sections";
import { approvalStamp } from "./stamp";
import { h, text, view, type PdfNode } from "./tree";
import { colour, font, isoDate, s } from "./styles";
import type { SheetPdfData } from "./types";

const STATUS_TEXT: Record<SheetPdfData["revision"]["status"], string> = {
  draft: "Draft",
  in_review: "In review",
  returned: "Returned",
  approved: "Approved",
  superseded: "Superseded",
};

/** Whether a revision prints the approval stamp (approved, or approved and later superseded). */
export function isStamped(status: SheetPdfData["revision"]["status"]): boolean {
  return status === "approved" || status === "superseded";
}

function drawingsFor(d: SheetPdfData): PdfNode[] {
  const { inputs, results } = d.revision;
  const units = d.project.unitSystem;
  const out: PdfNode[] = [];
  const arr = arrangementOf(inputs);
  if (arr) out.push(crossSectionDrawing(arr, units));
  const r = results?.results as Record<string, unknown> | undefined;
  if (r && Array.isArray(r.curve) && r.curve.length > 1) {
    const num = (k: string) => (typeof inputs[k] === "number" ? (inputs[k] as number) : undefined);
    out.push(temperatureCurveDrawing((r as unknown as BusbarRatingResults).curve, units, num("maxTemperature_C"), num("current_A")));
  }
  if (r && Array.isArray(r.profile) && r.profile.length > 1) {
    const v = r as unknown as VoltageDropResults;
    const nominal = typeof inputs.nominalVoltage_V === "number" ? inputs.nominalVoltage_V : undefined;
    const upstream = typeof inputs.upstreamDrop_percent === "number" ? inputs.upstreamDrop_percent : 0;
    const lowest = nominal !== undefined && v.solvedFor.startsWith("receiving") ? nominal * (1 - Math.max(0, v.limit_percent - upstream) / 100) : undefined;
    out.push(voltageProfileDrawing(v.profile, units, lowest));
  }
  if (d.sheet.kind === "parallel-sharing" && r && Array.isArray(r.paths) && Array.isArray(r.contingencies)) {
    out.push(pathSharesDrawing(r as unknown as ParallelSharingResults, inputs));
  }
  if (d.sheet.kind === "bus-network" && r && Array.isArray(r.segments) && !r.columns) {
    const drawing = networkDrawing(inputs, r as unknown as NetworkResults, units);
    if (drawing) out.push(drawing);
  }
  return out.length ? [heading(out.length > 1 ? "Drawings" : "Drawing"), ...out] : [];
}

function summary(d: SheetPdfData): PdfNode {
  const rev = d.revision;
  const kv = (k: string, v: string, mono = false) =>
    view({ flexDirection: "row", marginBottom: 1 }, text({ width: 78, color: colour.muted, fontSize: 8 }, k), text({ flexGrow: 1, flexBasis: 0, fontSize: 8.5, ...(mono ? { fontFamily: font.mono, fontSize: 7.5 } : {}) }, v));
  const stamp =
    d.verification && isStamped(rev.status)
      ? approvalStamp({ approver: rev.checkedByName ?? "—", date: rev.decidedAt, revision: rev.label, code: d.verification.code, url: d.verification.url, superseded: rev.status === "superseded" })
      : null;
  return view(
    { flexDirection: "row", marginBottom: 4 },
    view(
      { flexGrow: 1, flexBasis: 0, paddingRight: 10 },
      text({ fontSize: 15, fontWeight: 700, marginBottom: 4, lineHeight: 1.25 }, `${d.sheet.tag}  ${d.sheet.title}`),
      text({ fontSize: 9.5, color: colour.muted, marginBottom: 6 }, d.sheet.kindTitle),
      kv("Client", d.project.client || "—"),
      kv("Site", d.project.site || "—"),
      kv("Units", d.project.unitSystem === "imperial" ? "Imperial (US customary)" : "Metric (SI)"),
      kv("Engine", `version ${rev.engineVersion}`),
      kv("Content hash", rev.contentHash.slice(0, 32), true),
    ),
    stamp,
  );
}

/** The page element of one sheet (react-pdf breaks it into as many physical pages as it needs). */
export function sheetPage(d: SheetPdfData, opts: { mark?: string } = {}): PdfNode {
  const rev = d.revision;
  const result = rev.results;
  const stamped = isStamped(rev.status);
  const body: (PdfNode | null)[] = [
    opts.mark ? h("Mark", { id: opts.mark }) : null,
    summary(d),
    ...inputsSection(d.sheet.kind, rev.inputs, d.project.unitSystem),
    ...(result
      ? [...methodSection(result), ...intermediatesSection(result, d.project.unitSystem), ...resultsSection(result, d.project.unitSystem), ...warningsSection(result), ...drawingsFor(d)]
      : [heading("Results"), text({ color: colour.fail }, "This revision has no results: its inputs do not compute. Correct them on the sheet.")]),
    h(
      "View",
      { wrap: false, style: { marginTop: 14, padding: 8, borderWidth: 1, borderColor: colour.warn, backgroundColor: "#fff8ec" } },
      text({ fontWeight: 700, fontSize: 9.5 }, "Caution"),
      text({ fontSize: 8.5 }, CAUTION),
      text({ fontSize: 8, color: colour.muted }, "The values above are the stored results of this revision; they were computed by the Ohmstead engine from the inputs listed."),
    ),
  ];
  return h(
    "Page",
    { size: "A4", style: s.page },
    titleBlock({
      organisation: d.organisation,
      project: d.project,
      tag: d.sheet.tag,
      title: d.sheet.title,
      revision: rev.label,
      status: STATUS_TEXT[rev.status],
      prepared: `${rev.authorName} · ${isoDate(rev.submittedAt ?? rev.createdAt)}`,
      approved: stamped && rev.checkedByName ? `${rev.checkedByName} · ${isoDate(rev.decidedAt)}` : "—",
    }),
    stamped ? null : draftWatermark(),
    footer(`${d.project.code} ${d.sheet.tag} rev ${rev.label} · engine ${rev.engineVersion} · content ${rev.contentHash.slice(0, 16)}`),
    body,
  );
}

export function sheetDocument(d: SheetPdfData): PdfNode {
  return h("Document", { title: `${d.project.code} ${d.sheet.tag} rev ${d.revision.label}`, author: d.organisation.name, creator: "Ohmstead", producer: "Ohmstead" }, sheetPage(d));
}
