import { ink } from "@/components/sheets/pictures/palette";

/** Page geometry and type for every Ohmstead PDF (A4, points). */
export const PAGE = { width: 595.28, height: 841.89, margin: 36, headerHeight: 96, footerHeight: 40 } as const;

export const colour = {
  ...ink,
  rule: "#c9d3d3",
  band: "#eef2f2",
  stamp: ink.pass,
  draft: "#b4432f",
} as const;

export const font = { sans: "Plex Sans", mono: "Plex Mono" } as const;

export const s = {
  page: {
    fontFamily: font.sans,
    fontSize: 9,
    color: colour.text,
    paddingTop: PAGE.margin + PAGE.headerHeight,
    paddingBottom: PAGE.margin + PAGE.footerHeight,
    paddingHorizontal: PAGE.margin,
    lineHeight: 1.35,
  },
  h2: { fontSize: 11, fontWeight: 600, color: colour.text, marginTop: 12, marginBottom: 4, paddingBottom: 2, borderBottomWidth: 0.75, borderBottomColor: colour.accent },
  small: { fontSize: 7.5, color: colour.muted },
  mono: { fontFamily: font.mono },
  row: { flexDirection: "row" },
  cell: { paddingVertical: 2, paddingHorizontal: 4 },
  tableHead: { flexDirection: "row", backgroundColor: colour.band, borderBottomWidth: 0.5, borderBottomColor: colour.rule, fontWeight: 600 },
  tableRow: { flexDirection: "row", borderBottomWidth: 0.5, borderBottomColor: colour.grid },
} as const;

/** "2026-12-02" (UTC): dates on a calculation are days, written unambiguously. */
export function isoDate(d: Date | null | undefined): string {
  return d ? d.toISOString().slice(0, 10) : "—";
}
