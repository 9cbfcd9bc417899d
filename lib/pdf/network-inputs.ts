import type { UnitSystem } from "@/db/schema/projects";
import { MATERIALS } from "@/lib/engine/materials";
import { toFormValues, unitLabel } from "@/lib/sheets/units";
import { h, text, view, type PdfNode } from "./tree";
import { s } from "./styles";

/**
 * A bus network's inputs as tables (settings, conductors, segments, loads, supplies) in
 * the project's units, rather than one line per value. A network of more than
 * `LISTED_ROWS` segments or loads (an imported one) prints its counts and the first rows:
 * the whole network stays with the revision, covered by its content hash, and can be
 * downloaded from the sheet.
 */
export const LISTED_ROWS = 300;

type Row = Record<string, unknown>;
const list = (v: unknown): Row[] => (Array.isArray(v) ? (v.filter((x) => typeof x === "object" && x !== null) as Row[]) : []);
const cell = (v: unknown) => (v === undefined || v === null || v === "" ? "—" : String(v));

function grid(title: string, columns: { key: string; title: string; width?: number; path?: string }[], rows: Row[], system: UnitSystem): PdfNode[] {
  if (rows.length === 0) return [];
  const shown = rows.slice(0, LISTED_ROWS);
  const head = columns.map((c) => {
    const unit = c.path ? unitLabel("bus-network", c.path, system) : "";
    return text({ ...s.cell, ...(c.width ? { width: c.width } : { flexGrow: 1, flexBasis: 0 }) }, unit ? `${c.title} (${unit})` : c.title);
  });
  return [
    h("Text", { style: { fontSize: 9, fontWeight: 600, marginTop: 6, marginBottom: 2 }, minPresenceAhead: 30 }, `${title} (${rows.length})`),
    view(s.tableHead, head),
    ...shown.map((r) =>
      h(
        "View",
        { wrap: false, style: s.tableRow },
        columns.map((c) => text({ ...s.cell, ...(c.width ? { width: c.width } : { flexGrow: 1, flexBasis: 0 }) }, cell(r[c.key]))),
      ),
    ),
    ...(rows.length > shown.length
      ? [h("Text", { style: { fontSize: 8, marginTop: 2 } }, `First ${shown.length} of ${rows.length} listed; the whole network is kept with this revision (covered by its content hash) and can be downloaded from the sheet.`)]
      : []),
  ];
}

export function networkInputsSection(inputs: Record<string, unknown>, system: UnitSystem): PdfNode[] {
  const v = toFormValues("bus-network", inputs, system);
  const settings: [string, unknown, string][] = [
    ["Current", v.mode === "dc" ? "DC" : "AC (impedances)", ""],
    ["Frequency", v.frequency_Hz, "Hz"],
    ["Ambient temperature", v.ambient_C, unitLabel("bus-network", "ambient_C", system)],
    ["Maximum conductor temperature", v.maxTemperature_C, unitLabel("bus-network", "maxTemperature_C", system)],
    ["Voltage drop limit", v.dropLimit_pct, "%"],
  ];
  return [
    view(
      {},
      settings
        .filter(([, x]) => x !== undefined && x !== null && x !== "")
        .map(([label, x, unit]) => view(s.tableRow, text({ ...s.cell, flexGrow: 1, flexBasis: 0 }, label), text({ ...s.cell, width: 130, textAlign: "right" }, String(x)), text({ ...s.cell, width: 70 }, unit))),
    ),
    ...grid("Supplies", [{ key: "node", title: "Node" }, { key: "voltage_V", title: "Voltage (V)", width: 110 }], list(v.supplies), system),
    ...grid(
      "Conductors",
      [
        { key: "id", title: "Id" },
        { key: "materialId", title: "Material", width: 110 },
        { key: "area_m2", title: "Section", width: 70, path: "conductors.*.area_m2" },
        { key: "count", title: "In parallel", width: 50 },
        { key: "conductorTemperature_C", title: "Temp.", width: 55, path: "conductors.*.conductorTemperature_C" },
        { key: "reactance_ohm_per_m", title: "Reactance", width: 70, path: "conductors.*.reactance_ohm_per_m" },
        { key: "ampacity_A", title: "Ampacity", width: 60, path: "conductors.*.ampacity_A" },
      ],
      list(v.conductors).map((c) => ({ ...c, count: c.count ?? 1, materialId: MATERIALS.find((m) => m.id === c.materialId)?.name ?? c.materialId })),
      system,
    ),
    ...grid(
      "Segments",
      [
        { key: "id", title: "Id" },
        { key: "from", title: "From" },
        { key: "to", title: "To" },
        { key: "conductor", title: "Conductor" },
        { key: "length_m", title: "Length", width: 70, path: "segments.*.length_m" },
      ],
      list(v.segments),
      system,
    ),
    ...grid(
      "Loads",
      [
        { key: "node", title: "Node" },
        { key: "current_A", title: "Current", width: 80, path: "loads.*.current_A" },
        { key: "pf", title: "Power factor", width: 80 },
      ],
      list(v.loads),
      system,
    ),
  ];
}
