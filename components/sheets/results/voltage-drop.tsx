"use client";

import { sig } from "@/lib/engine/format";
import type { FeederAmpacityTableUse, VoltageDropResults } from "@/lib/engine/voltage-drop";
import { displayValue, type UnitSystem } from "@/lib/sheets/units";
import { areaToKcmil } from "@/lib/engine/units";
import { VoltageProfile } from "@/components/sheets/pictures/voltage-profile";
import { fmt } from "./format";
import { KeyValues } from "./results-panel";

/** A tabulated value as the table states it, in the project's units, without padding zeros ("110 A", "86 °F"). */
function plain(value: number, unit: string, system: UnitSystem): string {
  const d = displayValue(value, unit, system);
  return `${Number(d.value.toPrecision(4))} ${d.unit}`;
}

/** Which organisation table gave I_z, the row and the corrections, in one line. */
function TableUse({ t, unitSystem }: { t: FeederAmpacityTableUse; unitSystem: UnitSystem }) {
  const grouping = t.groupingArrangement ? `${t.circuits} circuit(s), ${t.groupingArrangement.replace(/-/g, " ")}` : "no grouping";
  return (
    <p className="rounded-md border border-fen-200 bg-fen-50 px-3 py-2 text-sm text-fen-800" data-testid="result-ampacity-table">
      Ampacity from <span className="font-semibold">{t.name} v{t.version}</span>, row {t.rowLabel} ({plain(t.row.ampacity_A, "A", unitSystem)} at {plain(t.row.referenceAmbient_C, "°C", unitSystem)}), k_θ {sig(t.ambientFactor, 3)}, k_g {sig(t.groupingFactor, 3)} ({grouping})
      {t.parallel > 1 ? `, × ${t.parallel} in parallel` : ""} → I_z {fmt(t.ampacity_A, "A", unitSystem)}.
      {t.source ? <span className="mt-0.5 block text-xs text-fen-500">Table source: {t.source}</span> : null}
    </p>
  );
}

/** Feeder voltage drop: the far-end voltage, the drop against the limit, and the voltage along the route. */
export function VoltageDropKeyResults({ results: r, inputs, unitSystem }: { results: VoltageDropResults; inputs: Record<string, unknown>; unitSystem: UnitSystem }) {
  const nominal = typeof inputs.nominalVoltage_V === "number" ? inputs.nominalVoltage_V : undefined;
  const upstream = typeof inputs.upstreamDrop_percent === "number" ? inputs.upstreamDrop_percent : 0;
  const lowest = nominal !== undefined && r.solvedFor.startsWith("receiving") ? nominal * (1 - Math.max(0, r.limit_percent - upstream) / 100) : undefined;
  const minSize = r.minimumSize
    ? unitSystem === "imperial"
      ? `${r.minimumSize.label} (${sig(areaToKcmil(r.minimumSize.area_m2), 4)} kcmil)`
      : r.minimumSize.label
    : "none in the series";
  return (
    <div className="space-y-4">
      <KeyValues
        items={[
          { label: "Voltage drop", value: `${sig(r.drop_percent, 3)} %`, emphasis: true, testId: "result-drop-percent" },
          { label: "Drop", value: fmt(r.drop_V, "V", unitSystem) },
          { label: "Total with upstream", value: `${sig(r.totalDrop_percent, 3)} %` },
          { label: "Sending-end voltage", value: fmt(r.sendingVoltage_V, "V", unitSystem) },
          { label: "Receiving-end voltage", value: fmt(r.receivingVoltage_V, "V", unitSystem), emphasis: true },
          { label: "Limit", value: `${sig(r.limit_percent, 3)} %` },
          { label: "Conductor temperature", value: fmt(r.conductorTemperature_C, "°C", unitSystem) },
          { label: "Phase resistance", value: `${sig(r.phaseResistance_ohm * 1000, 4)} mΩ` },
          { label: "Smallest size meeting the limit", value: minSize },
          ...(r.ampacityTable ? [{ label: "Current-carrying capacity I_z", value: fmt(r.ampacityTable.ampacity_A, "A", unitSystem), testId: "result-table-iz" }] : []),
        ]}
      />
      {r.ampacityTable ? <TableUse t={r.ampacityTable} unitSystem={unitSystem} /> : null}
      <p className="text-xs text-fen-500">
        {r.method === "exact" ? "Exact phasor method" : "Approximate method"}; {r.solvedFor}. Limit: {r.limitSource}. Conductor temperature basis: {r.temperatureBasis}.
      </p>
      {r.profile.length > 1 ? <VoltageProfile points={r.profile} limitVoltage_V={lowest} units={unitSystem} /> : null}
    </div>
  );
}
