"use client";

import { useWatch, useFormContext } from "react-hook-form";
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
        <NumField path="ampacity_A" label="Current-carrying capacity of the phase" hint="Optional: sets the conductor temperature at the load" />
      </Group>
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

export const voltageDropKind: KindModule = { schema: voltageDropInputSchema, run: voltageDrop as KindModule["run"], Form: VoltageDropForm };
