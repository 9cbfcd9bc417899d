import { h, text, view, type PdfNode } from "./tree";
import { qrPath } from "./qr";
import { colour, font, isoDate } from "./styles";

export interface StampData {
  approver: string;
  date: Date | null;
  revision: string;
  code: string;
  url: string;
  superseded: boolean;
}

/**
 * The approval stamp: who approved which revision and when, with the verification
 * code and a QR code of the public page that confirms it is still the revision in force.
 */
export function approvalStamp(d: StampData): PdfNode {
  const qr = qrPath(d.url);
  const qrSize = 64;
  const line = (l: string, v: string, mono = false) =>
    view({ flexDirection: "row", marginTop: 1 }, text({ width: 52, fontSize: 7, color: colour.muted }, l), text({ fontSize: 8, fontWeight: 600, ...(mono ? { fontFamily: font.mono } : {}) }, v));
  return view(
    { flexDirection: "row", borderWidth: 1.5, borderColor: colour.stamp, borderRadius: 3, padding: 6, width: 250 },
    view(
      { flexGrow: 1 },
      text({ fontSize: 11, fontWeight: 700, color: colour.stamp }, "APPROVED"),
      line("Approved by", d.approver),
      line("Date", isoDate(d.date)),
      line("Revision", d.revision, true),
      line("Verify code", d.code, true),
      text({ fontSize: 6, color: colour.muted, marginTop: 2 }, d.url),
      d.superseded ? text({ fontSize: 7, fontWeight: 700, color: colour.draft, marginTop: 2 }, "Superseded by a later revision") : null,
    ),
    h(
      "Svg",
      { width: qrSize, height: qrSize, viewBox: `-2 -2 ${qr.size + 4} ${qr.size + 4}` },
      h("Rect", { x: -2, y: -2, width: qr.size + 4, height: qr.size + 4, fill: "#ffffff" }),
      h("Path", { d: qr.d, fill: colour.text }),
    ),
  );
}
