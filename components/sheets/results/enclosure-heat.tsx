import type { EnclosureHeatResults } from "@/lib/engine/enclosure-heat";
import type { UnitSystem } from "@/lib/sheets/units";
import { sig } from "@/lib/engine/format";
import { fmt } from "./format";
import { KeyValues } from "./results-panel";

/** Enclosure heat budget: the losses by source, the internal temperatures and the cooling needed. */
export function EnclosureHeatKeyResults({ results: r, unitSystem }: { results: EnclosureHeatResults; unitSystem: UnitSystem }) {
  const bySource = Object.entries(r.lossBySource_W);
  return (
    <div className="space-y-4">
      <KeyValues
        items={[
          { label: "Total power loss", value: fmt(r.totalLoss_W, "W", unitSystem), emphasis: true, testId: "result-total-loss" },
          { label: "Average internal air", value: fmt(r.internalAverage_C, "°C", unitSystem), emphasis: true },
          { label: "Air at the top", value: r.internalTop_C === null ? "not asked" : fmt(r.internalTop_C, "°C", unitSystem) },
          { label: "Rise over ambient", value: `${sig(r.deltaT_K, 3)} K` },
          { label: "Natural dissipation at the target", value: fmt(r.naturalDissipation_W, "W", unitSystem) },
          { label: "Cooling power needed", value: fmt(r.coolingPower_W, "W", unitSystem) },
          { label: "Effective cooling surface", value: `${sig(r.effectiveSurface_m2, 3)} m²` },
          { label: "Filter-fan airflow", value: r.fanAirflow_m3_s === null ? "not needed" : `${sig(r.fanAirflow_m3_s * 3600, 3)} m³/h` },
        ]}
      />
      {bySource.length > 0 ? (
        <table className="data-table" aria-label="Losses by source">
          <thead>
            <tr>
              <th>Source</th>
              <th className="text-right">Loss</th>
            </tr>
          </thead>
          <tbody>
            {bySource.map(([src, w]) => (
              <tr key={src}>
                <td>{src === "devices" ? "Devices entered on this sheet" : <span>Sheet <span className="font-mono">{src}</span></span>}</td>
                <td className="text-right tabular-nums">{fmt(w, "W", unitSystem)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      ) : null}
    </div>
  );
}
