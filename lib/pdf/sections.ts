import type { UnitSystem } from "@/db/schema/projects";
import type { CalcResult } from "@/lib/engine/core/result";
import { sig } from "@/lib/engine/format";
import { displayValue, toFormValues, unitLabel } from "@/lib/sheets/units";
import { mathText } from "./math-text";
import { networkInputsSection } from "./network-inputs";
import { h, text, view, type PdfNode } from "./tree";
import { colour, font, s } from "./styles";

/** The sections of a sheet's PDF: inputs, method, intermediate values, results and checks, warnings. */

export const heading = (t: string) => h("Text", { style: s.h2, minPresenceAhead: 40 }, t);

/** "arrangement.barWidth_m" → "Arrangement › bar width" (units are printed in their own column). */
export function humanisePath(path: string): string {
  return path
    .split(".")
    .map((part) => (/^\d+$/.test(part) ? `#${Number(part) + 1}` : part.replace(/_[A-Za-z0-9]+(_[A-Za-z0-9]+)*$/, "").replace(/([a-z0-9])([A-Z])/g, "$1 $2").toLowerCase()))
    .join(" › ")
    .replace(/^./, (c) => c.toUpperCase());
}

function leaves(v: unknown, path: string, out: { path: string; value: string }[]) {
  if (Array.isArray(v)) v.forEach((x, i) => leaves(x, path ? `${path}.${i}` : String(i), out));
  else if (typeof v === "object" && v !== null) for (const [k, x] of Object.entries(v)) leaves(x, path ? `${path}.${k}` : k, out);
  else if (v !== undefined && v !== null && v !== "") out.push({ path, value: String(v) });
}

function table(columns: { title: string; width?: number; grow?: boolean; align?: "right" }[], rows: (string | PdfNode)[][]): PdfNode {
  const cellStyle = (c: (typeof columns)[number]) => ({ ...s.cell, ...(c.width ? { width: c.width } : {}), ...(c.grow ? { flexGrow: 1, flexBasis: 0 } : {}), ...(c.align ? { textAlign: c.align } : {}) });
  return view(
    {},
    view(s.tableHead, columns.map((c) => text(cellStyle(c), c.title))),
    rows.map((r) => h("View", { wrap: false, style: s.tableRow }, r.map((cell, i) => (typeof cell === "string" ? text(cellStyle(columns[i]!), cell) : view(cellStyle(columns[i]!), cell))))),
  );
}

/**
 * An organisation ampacity table snapshot in a sheet's inputs, as one readable line
 * ("Ampacity table: Site code v3 (installation E, XLPE, 3 circuits bunched)") instead of its rows.
 */
export function ampacityTableLine(snapshot: unknown): string | null {
  if (typeof snapshot !== "object" || snapshot === null) return null;
  const s = snapshot as { table?: { name?: unknown; version?: unknown; source?: unknown; rows?: unknown }; installation?: unknown; insulation?: unknown; groupingArrangement?: unknown; circuits?: unknown };
  if (!s.table) return null;
  const rows = Array.isArray(s.table.rows) ? s.table.rows.length : 0;
  const circuits = Number(s.circuits ?? 1);
  const grouping = typeof s.groupingArrangement === "string" && s.groupingArrangement ? `${circuits} circuit${circuits === 1 ? "" : "s"} ${s.groupingArrangement.replace(/-/g, " ")}` : "no grouping";
  const parts = [`installation ${String(s.installation ?? "")}`, String(s.insulation ?? "").toUpperCase(), grouping];
  const source = typeof s.table.source === "string" && s.table.source ? ` Source: ${s.table.source}.` : "";
  return `Ampacity table: ${String(s.table.name ?? "")} v${String(s.table.version ?? "")} (${parts.join(", ")}); ${rows} row${rows === 1 ? "" : "s"} of it kept with this sheet.${source}`;
}

/** Inputs in the project's units (converted at the edge, as the form shows them). */
export function inputsSection(kind: string, inputs: Record<string, unknown>, system: UnitSystem): PdfNode[] {
  if (kind === "bus-network") return [heading("Inputs"), ...networkInputsSection(inputs, system)];
  const rows: { path: string; value: string }[] = [];
  const { ampacityFromTable, ...rest } = inputs;
  const tableLine = ampacityTableLine(ampacityFromTable);
  leaves(toFormValues(kind, tableLine ? rest : inputs, system), "", rows);
  return [
    heading("Inputs"),
    table(
      [{ title: "Quantity", grow: true }, { title: "Value", width: 130, align: "right" }, { title: "Unit", width: 70 }],
      rows.map((r) => [humanisePath(r.path), r.value, unitLabel(kind, r.path, system)]),
    ),
    ...(tableLine ? [h("Text", { style: { fontSize: 9, marginTop: 4 } }, tableLine)] : []),
  ];
}

export function methodSection(result: CalcResult<unknown>): PdfNode[] {
  if (result.formulas.length === 0) return [];
  return [
    heading("Method"),
    ...result.formulas.map((f, i) =>
      h(
        "View",
        { wrap: false, style: { flexDirection: "row", marginBottom: 4 } },
        text({ width: 18, color: colour.muted, fontFamily: font.mono, fontSize: 8 }, `(${i + 1})`),
        view({ flexGrow: 1, flexBasis: 0 }, mathText(f.expression, { fontSize: 9.5 }), mathText(`Source: ${f.source}`, { fontSize: 7.5, color: colour.muted }, { indices: false })),
      ),
    ),
  ];
}

function quantity(value: number, unit: string, system: UnitSystem): { value: string; unit: string } {
  if (!Number.isFinite(value)) return { value: value > 0 ? "∞" : value < 0 ? "−∞" : "—", unit };
  const d = displayValue(value, unit, system);
  return { value: Number.isInteger(d.value) && d.unit === "" ? String(d.value) : sig(d.value, 4), unit: d.unit };
}

export function intermediatesSection(result: CalcResult<unknown>, system: UnitSystem): PdfNode[] {
  const list = Object.values(result.intermediates);
  if (list.length === 0) return [];
  return [
    heading("Intermediate values"),
    table(
      [{ title: "Quantity", grow: true }, { title: "Value", width: 110, align: "right" }, { title: "Unit", width: 80 }],
      list.map((q) => {
        const v = quantity(q.value, q.unit, system);
        return [q.label, v.value, v.unit];
      }),
    ),
  ];
}

/** Unit of a result field from its name's suffix ("loss_W_m" → W/m); undefined when the name states none. */
const SUFFIX_UNITS: [RegExp, string][] = [
  [/_ohm_m$/, "Ω/m"],
  [/_ohm$/, "Ω"],
  [/_W_m$/, "W/m"],
  [/_W$/, "W"],
  [/_kA$/, "kA"],
  [/_A$/, "A"],
  [/_V$/, "V"],
  [/_C$/, "°C"],
  [/_K$/, "K"],
  [/_percent$/, "%"],
  [/_pct$/, "%"],
  [/_mm2$/, "mm²"],
  [/_m2$/, "m²"],
  [/_m$/, "m"],
  [/_s$/, "s"],
  [/_N$/, "N"],
];

export function resultsSection(result: CalcResult<unknown>, system: UnitSystem): PdfNode[] {
  const out: PdfNode[] = [heading("Results")];
  const r = result.results;
  if (typeof r === "object" && r !== null) {
    const rows: string[][] = [];
    for (const [k, v] of Object.entries(r as Record<string, unknown>)) {
      if (typeof v !== "number") continue;
      const unit = SUFFIX_UNITS.find(([re]) => re.test(k))?.[1] ?? "";
      const q = quantity(v, unit, system);
      rows.push([humanisePath(k), q.value, q.unit]);
    }
    if (rows.length) out.push(table([{ title: "Result", grow: true }, { title: "Value", width: 110, align: "right" }, { title: "Unit", width: 80 }], rows));
  }
  if (result.checks.length) {
    out.push(h("Text", { minPresenceAhead: 40, style: { fontSize: 9.5, fontWeight: 600, marginTop: 8, marginBottom: 2 } }, "Checks against limits"));
    out.push(
      table(
        [{ title: "Check", grow: true }, { title: "Value", width: 80, align: "right" }, { title: "Limit", width: 90, align: "right" }, { title: "Margin", width: 55, align: "right" }, { title: "Verdict", width: 50 }],
        result.checks.map((c) => {
          const v = quantity(c.value, c.unit, system);
          const l = quantity(c.limit, c.unit, system);
          const margin = Number.isFinite(c.margin) ? `${c.margin >= 0 ? "+" : ""}${sig(c.margin * 100, 3)} %` : "—";
          return [
            c.label,
            `${v.value} ${v.unit}`,
            `${c.kind === "max" ? "≤" : "≥"} ${l.value} ${l.unit}`,
            margin,
            text({ fontWeight: 700, color: c.pass ? colour.pass : colour.fail }, c.pass ? "PASS" : "FAIL"),
          ];
        }),
      ),
    );
  }
  return out;
}

export function warningsSection(result: CalcResult<unknown>): PdfNode[] {
  if (result.warnings.length === 0) return [];
  return [
    heading("Warnings"),
    ...result.warnings.map((w) =>
      h(
        "View",
        { wrap: false, style: { flexDirection: "row", marginBottom: 3, borderLeftWidth: 2, borderLeftColor: colour.warn, paddingLeft: 5 } },
        mathText(w.message, { flexGrow: 1, flexBasis: 0, fontSize: 9 }, { indices: false }),
      ),
    ),
  ];
}
