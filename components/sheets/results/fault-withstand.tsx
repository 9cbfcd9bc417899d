import { sig } from "@/lib/engine/format";
import type { FaultWithstandResults } from "@/lib/engine/short-circuit";
import type { UnitSystem } from "@/lib/sheets/units";
import { fmt } from "./format";
import { KeyValues } from "./results-panel";

/** Fault withstand: peak and thermal-equivalent currents, the adiabatic check and the mechanical summary. */
export function FaultWithstandKeyResults({ results: r, unitSystem }: { results: FaultWithstandResults; unitSystem: UnitSystem }) {
  const m = r.mechanical;
  return (
    <div className="space-y-4">
      <KeyValues
        items={[
          { label: "Peak current ip", value: `${sig(r.ip_A / 1000, 4)} kA`, emphasis: true },
          { label: "Peak factor n", value: sig(r.peakFactor, 3) },
          { label: "Thermal equivalent Ith", value: `${sig(r.Ith_A / 1000, 4)} kA` },
          { label: "Final temperature", value: fmt(r.finalTemperature_C, "°C", unitSystem), emphasis: true },
          { label: "Section", value: fmt(r.section_m2 * 1e6, "mm²", unitSystem) },
          { label: "Minimum section", value: fmt(r.minimumSection_m2 * 1e6, "mm²", unitSystem) },
          { label: "Withstand current for the duration", value: `${sig(r.withstandCurrent_A / 1000, 4)} kA` },
          { label: "Adiabatic factor k", value: `${sig(r.k_A_sqrt_s_per_mm2, 4)} A·√s/mm²` },
          { label: "Start / limit temperature", value: `${fmt(r.thetaInitial_C, "°C", unitSystem, 3)} / ${fmt(r.thetaFinalLimit_C, "°C", unitSystem, 3)}` },
        ]}
      />
      {m ? (
        <section>
          <h3 className="mb-2 text-sm font-semibold text-fen-800">Electromagnetic forces</h3>
          <KeyValues
            items={[
              { label: "Force on the main conductor", value: `${sig(m.forcePerMetre_N_m, 4)} N/m` },
              { label: "Force between bars of a phase", value: `${sig(m.subForcePerMetre_N_m, 4)} N/m` },
              { label: "Longest span allowed", value: m.maxSpan_m === null ? "not limited" : fmt(m.maxSpan_m, "m", unitSystem) },
              ...(m.atSpan
                ? [
                    { label: "Total stress at the span", value: `${sig(m.atSpan.totalStress_Pa / 1e6, 4)} MPa` },
                    { label: "Allowed stress", value: `${sig(m.allowedStress_Pa / 1e6, 4)} MPa` },
                    { label: "Support force (outer / inner)", value: `${sig(m.atSpan.supportForceA_N, 4)} / ${sig(m.atSpan.supportForceB_N, 4)} N` },
                  ]
                : []),
            ]}
          />
        </section>
      ) : null}
    </div>
  );
}
