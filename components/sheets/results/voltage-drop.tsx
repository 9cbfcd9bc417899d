"use client";

import { sig } from "@/lib/engine/format";
import type { VoltageDropResults } from "@/lib/engine/voltage-drop";
import type { UnitSystem } from "@/lib/sheets/units";
import { areaToKcmil } from "@/lib/engine/units";
import { VoltageProfile } from "@/components/sheets/pictures/voltage-profile";
import { fmt } from "./format";
import { KeyValues } from "./results-panel";

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
        ]}
      />
      <p className="text-xs text-fen-500">
        {r.method === "exact" ? "Exact phasor method" : "Approximate method"}; {r.solvedFor}. Limit: {r.limitSource}. Conductor temperature basis: {r.temperatureBasis}.
      </p>
      {r.profile.length > 1 ? <VoltageProfile points={r.profile} limitVoltage_V={lowest} units={unitSystem} /> : null}
    </div>
  );
}
