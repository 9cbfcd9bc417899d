"use client";

import { useEffect, useRef, useState } from "react";
import { useWatch, useFormContext } from "react-hook-form";
import useSWR from "swr";
import { SelectField } from "@/components/forms/field";
import { GROUPING_FACTORS, type AmpacityRow } from "@/lib/engine/ampacity-table";
import { MATERIALS } from "@/lib/engine/materials";
import { voltageDrop, voltageDropInputSchema } from "@/lib/engine/voltage-drop";
import { CheckField, ChoiceField, Group, NumField, opt, useSheetFormSettings } from "./kit";
import { MATERIAL_OPTIONS } from "./options";
import type { KindModule } from "./types";

const SYSTEMS = [
  opt("ac-3ph-4w", "Three-phase, four-wire"),
  opt("ac-3ph-3w", "Three-phase, three-wire"),
  opt("ac-1ph-2w", "Single-phase, two-wire"),
  opt("dc-2w", "DC, two-wire"),
];
const LIMITS = [
  opt("iec-a-lighting", "IEC, public LV supply — lighting (3 %)"),
  opt("iec-a-other", "IEC, public LV supply — other uses (5 %)"),
  opt("iec-b-lighting", "IEC, private LV supply — lighting (6 %)"),
  opt("iec-b-other", "IEC, private LV supply — other uses (8 %)"),
  opt("nec-branch", "North-American suggestion — branch circuit (3 %)"),
  opt("nec-feeder", "North-American suggestion — feeder (3 %)"),
  opt("nec-total", "North-American suggestion — feeder and branch (5 %)"),
];
const BASES = [
  opt("auto", "Automatic (at the load if the capacity is given, else at the maximum)"),
  opt("maximum", "At the insulation's maximum temperature"),
  opt("load", "At the load current"),
  opt("annex-g", "Service resistivity 1.25 × ρ20"),
  opt("given", "Temperature given below"),
];

/** Feeder voltage drop: supply, load, route and conductor. */
function VoltageDropForm() {
  const { control } = useFormContext();
  const { unitSystem } = useSheetFormSettings();
  const basis = useWatch({ control, name: "temperatureBasis" });
  return (
    <div className="space-y-4">
      <Group title="Supply and load">
        <ChoiceField path="system" label="Supply system" options={SYSTEMS} />
        <NumField path="nominalVoltage_V" label="Nominal voltage" unit="V" hint="Line to line for three-phase" />
        <ChoiceField path="voltageAt" label="Voltage held at" options={[opt("sending", "Sending end (supply)"), opt("receiving", "Receiving end (load)")]} />
        <NumField path="current_A" label="Load current" />
        <NumField path="powerFactor" label="Power factor" unit="" />
        <CheckField path="leading" label="Leading power factor" />
        <NumField path="frequency_Hz" label="Frequency" unit="Hz" />
      </Group>
      <Group title="Route and conductor">
        <NumField path="length_m" label="Route length" />
        <ChoiceField path="materialId" label="Conductor material" options={MATERIAL_OPTIONS} />
        <NumField path="area_m2" label="Conductor cross-section" hint={unitSystem === "imperial" ? "kcmil, or an AWG size such as 4/0 or 2 AWG" : undefined} />
        <NumField path="parallel" label="Conductors in parallel per phase" unit="" />
        <ChoiceField path="insulation" label="Insulation" options={[opt("pvc", "PVC (70 °C)"), opt("xlpe", "XLPE / EPR (90 °C)")]} />
        <ChoiceField
          path="resistanceSource"
          label="Resistance at 20 °C from"
          options={[opt("iec-60228", "IEC 60228 table (standard metric sizes)"), opt("resistivity", "Resistivity and section")]}
        />
        <NumField path="reactance_ohm_per_m" label="Reactance" hint="0.08 mΩ/m when empty" />
        <NumField path="ambient_C" label="Ambient temperature" />
      </Group>
      <AmpacityGroup />
      <Group title="Method and limit">
        <ChoiceField path="temperatureBasis" label="Conductor temperature" options={BASES} />
        {basis === "given" ? <NumField path="conductorTemperature_C" label="Conductor temperature" /> : null}
        <ChoiceField path="method" label="Method" options={[opt("exact", "Exact (phasors)"), opt("approximate", "Approximate (R cos φ + X sin φ)")]} />
        <ChoiceField path="limitId" label="Voltage-drop limit" options={LIMITS} />
        <NumField path="limitPercent" label="Organisation's own limit" unit="%" hint="Overrides the limit above when given" />
        <NumField path="upstreamDrop_percent" label="Drop upstream of this feeder" unit="%" />
        <ChoiceField path="sizeSeries" label="Standard sizes for the minimum size" options={[opt("iec-60228", "IEC 60228 (mm²)"), opt("awg-kcmil", "AWG and kcmil")]} />
      </Group>
    </div>
  );
}

interface TableListItem {
  id: number;
  name: string;
  version: number;
  source: string;
  rowCount: number;
}
interface TableDetail extends TableListItem {
  rows: AmpacityRow[];
}
/** The snapshot as the form holds it (numbers may be strings after a round trip through the form). */
interface SnapshotValue {
  table?: { id?: number | string; name?: string | number; version?: number | string; rows?: { material?: string }[] };
  installation?: string | number;
  insulation?: string;
  groupingArrangement?: string;
  circuits?: string | number;
}

async function getJson<T>(url: string, key: "tables" | "table"): Promise<T> {
  const res = await fetch(url, { headers: { accept: "application/json" } });
  const body = (await res.json().catch(() => null)) as Record<string, unknown> | null;
  if (!res.ok || !body || !(key in body)) throw new Error((body?.error as { message?: string } | undefined)?.message ?? `The ampacity tables could not be loaded (HTTP ${res.status})`);
  return body[key] as T;
}

const metalOf = (materialId: unknown) => MATERIALS.find((m) => m.id === materialId)?.metal ?? "copper";
const unique = (xs: string[]) => [...new Set(xs)];
const GROUPING_OPTIONS = [opt("", "None (a single circuit)"), ...Object.entries(GROUPING_FACTORS).map(([id, g]) => opt(id, g.label))];

/**
 * The feeder's current-carrying capacity: typed in, or taken from one of the organisation's
 * active ampacity tables. Choosing a table stores a snapshot of its rows for this conductor
 * metal, insulation and installation method in the sheet's inputs, so the saved sheet
 * recomputes the same way even after the table gets a new version.
 */
function AmpacityGroup() {
  const { control, setValue } = useFormContext();
  const { readOnly } = useSheetFormSettings();
  const snap = useWatch({ control, name: "ampacityFromTable" }) as SnapshotValue | undefined;
  const materialId = useWatch({ control, name: "materialId" }) as unknown;
  const arrangement = useWatch({ control, name: "ampacityFromTable.groupingArrangement" }) as string | undefined;
  const [mode, setMode] = useState<"entered" | "table">(snap ? "table" : "entered");
  const [tableId, setTableId] = useState(snap?.table?.id !== undefined ? String(snap.table.id) : "");
  const metal = metalOf(materialId);
  const built = useRef(snap?.table ? [String(snap.table.id), String(snap.installation ?? ""), snap.insulation ?? "", snap.table.rows?.[0]?.material ?? metal].join("|") : "");

  const live = mode === "table" && !readOnly;
  const list = useSWR(live ? "/api/v1/ampacity-tables?active=1" : null, (u: string) => getJson<TableListItem[]>(u, "tables"));
  const detail = useSWR(live && tableId ? `/api/v1/ampacity-tables/${tableId}` : null, (u: string) => getJson<TableDetail>(u, "table"));

  const rowsForMetal = detail.data?.rows.filter((r) => r.material === metal) ?? [];
  const installations = unique(rowsForMetal.map((r) => r.installation));
  const wantedInstallation = String(snap?.installation ?? "");
  const installation = installations.find((i) => i.toLowerCase() === wantedInstallation.toLowerCase()) ?? installations[0] ?? "";
  const insulations = unique(rowsForMetal.filter((r) => r.installation === installation).map((r) => r.insulation));
  const insulation = insulations.includes(snap?.insulation ?? "") ? snap!.insulation! : (insulations[0] ?? "");

  // Rebuild the snapshot when the table, metal, installation or insulation chosen differs from the one stored.
  useEffect(() => {
    if (!live || !detail.data || String(detail.data.id) !== tableId) return;
    const key = [tableId, installation, insulation, metal].join("|");
    if (built.current === key) return;
    built.current = key;
    const d = detail.data;
    const rows = d.rows.filter((r) => r.material === metal && r.installation === installation && r.insulation === insulation);
    setValue(
      "ampacityFromTable",
      {
        table: { id: d.id, name: d.name, version: d.version, source: d.source, rows },
        installation,
        insulation,
        groupingArrangement: snap?.groupingArrangement ?? "",
        circuits: snap?.circuits ?? "1",
      },
      { shouldDirty: true, shouldValidate: true },
    );
  }, [live, detail.data, tableId, installation, insulation, metal, setValue, snap?.groupingArrangement, snap?.circuits]);

  function choose(next: "entered" | "table") {
    setMode(next);
    if (next === "entered") {
      setValue("ampacityFromTable", undefined, { shouldDirty: true, shouldValidate: true });
      setTableId("");
      built.current = "";
    } else setValue("ampacity_A", "", { shouldDirty: true, shouldValidate: true });
  }

  const tableOptions = [opt("", list.isLoading ? "Loading the tables…" : "Choose a table"), ...(list.data ?? []).map((t) => opt(String(t.id), `${t.name} v${t.version}`))];
  if (snap?.table?.id !== undefined && !(list.data ?? []).some((t) => String(t.id) === String(snap.table!.id)))
    tableOptions.push(opt(String(snap.table.id), `${String(snap.table.name)} v${String(snap.table.version)} (as stored; retired or not active)`));

  return (
    <Group title="Current-carrying capacity" description="Optional. I_z sets the conductor temperature at the load and the overload check.">
      <fieldset className="sm:col-span-2 lg:col-span-3">
        <legend className="field-label">Current-carrying capacity from</legend>
        <div className="flex flex-wrap gap-x-6 gap-y-2 text-sm text-fen-800">
          <label className="flex items-center gap-2">
            <input type="radio" name="ampacity-source" value="entered" checked={mode === "entered"} onChange={() => choose("entered")} className="h-4 w-4 text-copper-600" />
            A value I enter
          </label>
          <label className="flex items-center gap-2">
            <input type="radio" name="ampacity-source" value="table" checked={mode === "table"} onChange={() => choose("table")} className="h-4 w-4 text-copper-600" />
            The organisation&apos;s ampacity table
          </label>
        </div>
      </fieldset>
      {mode === "entered" ? (
        <NumField path="ampacity_A" label="Current-carrying capacity of the phase" hint="Optional: sets the conductor temperature at the load" />
      ) : readOnly ? (
        <p className="text-sm text-fen-700 sm:col-span-2 lg:col-span-3">
          {snap?.table
            ? `Ampacity table ${String(snap.table.name)} v${String(snap.table.version)}, installation ${String(snap.installation)}, ${String(snap.insulation ?? "").toUpperCase()}${snap.groupingArrangement ? `, ${snap.circuits} circuit(s) ${snap.groupingArrangement}` : ""}`
            : "No table chosen."}
        </p>
      ) : (
        <>
          <SelectField
            label="Ampacity table"
            value={tableId}
            options={tableOptions}
            onChange={(e) => setTableId(e.target.value)}
            error={list.error ? (list.error as Error).message : detail.error ? (detail.error as Error).message : undefined}
            hint={!list.isLoading && list.data?.length === 0 ? "Your organisation has no active ampacity table; an administrator uploads them under Ampacity tables." : "Active tables of your organisation"}
            data-path="ampacityFromTable.table.id"
          />
          <SelectField
            label="Installation method"
            value={installation}
            disabled={!detail.data}
            options={installations.length ? installations.map((i) => opt(i, i)) : [opt("", detail.data ? `No ${metal} rows in this table` : "Choose a table first")]}
            onChange={(e) => setValue("ampacityFromTable.installation", e.target.value, { shouldDirty: true, shouldValidate: true })}
            data-path="ampacityFromTable.installation"
          />
          <SelectField
            label="Insulation in the table"
            value={insulation}
            disabled={!detail.data}
            options={insulations.length ? insulations.map((i) => opt(i, i.toUpperCase())) : [opt("", "—")]}
            onChange={(e) => setValue("ampacityFromTable.insulation", e.target.value, { shouldDirty: true, shouldValidate: true })}
            data-path="ampacityFromTable.insulation"
          />
          {snap?.table ? (
            <>
              <ChoiceField path="ampacityFromTable.groupingArrangement" label="Grouping (IEC 60364-5-52 Table B.52.17)" options={GROUPING_OPTIONS} className="sm:col-span-2" />
              {arrangement ? <NumField path="ampacityFromTable.circuits" label="Circuits or multi-core cables in the group" unit="" /> : null}
            </>
          ) : null}
        </>
      )}
    </Group>
  );
}

export const voltageDropKind: KindModule = { schema: voltageDropInputSchema, run: voltageDrop as KindModule["run"], Form: VoltageDropForm };
