"use client";

// The bus network's result tables without its pictures: used by the live results
// (bus-network.tsx, with the diagram and path plot) and by a large network's summary
// page, which so does not load the pictures' code.
import { useMemo } from "react";
import { sig } from "@/lib/engine/format";
import type { NetworkResults, SegmentResult } from "@/lib/engine/network";
import type { UnitSystem } from "@/lib/sheets/units";
import { fmt } from "./format";
import { DEAD_SHOWN, deadSegments } from "./network-summary";
import { KeyValues } from "./results-panel";

/** A temperature rise (K) in the project's units: K, or °F of rise for imperial projects. */
export function riseText(k: number | undefined, system: UnitSystem): string {
  if (k === undefined || !Number.isFinite(k)) return "—";
  return system === "imperial" ? `${sig(k * 1.8, 3)} °F` : `${sig(k, 3)} K`;
}

/** Current density in the project's units: A/mm², or A/in² for imperial projects. */
function densityText(jmm2: number, system: UnitSystem): string {
  return system === "imperial" ? `${sig(jmm2 * 645.16, 3)} A/in²` : `${sig(jmm2, 3)} A/mm²`;
}

/** Supply current: one supply's current, or the sum over several (each is listed beside). */
export function supplyCurrent(r: NetworkResults): number {
  return r.supplies.reduce((a, s) => a + s.current_A, 0);
}

/** Ten hottest segments with their current, density, temperature rise, loss and ampacity check. */
export function HottestSegments({
  results: r,
  unitSystem,
  selected,
  onSelect,
}: {
  results: NetworkResults;
  unitSystem: UnitSystem;
  selected?: string;
  onSelect?: (id: string) => void;
}) {
  const byId = useMemo(() => new Map(r.segments.map((s) => [s.id, s] as const)), [r.segments]);
  const rows = r.hottest.map((h) => byId.get(h.id)).filter((s): s is SegmentResult => s !== undefined);
  return (
    <section aria-labelledby="bn-hottest">
      <h3 id="bn-hottest" className="mb-1 text-xs font-semibold uppercase tracking-wider text-fen-600">
        Hottest segments <span className="font-normal normal-case tracking-normal text-fen-500">(by {r.hottestBasis === "temperature" ? "temperature" : "current density"})</span>
      </h3>
      <div className="overflow-x-auto rounded-md border border-fen-200 bg-white">
        <table className="data-table" data-testid="hottest-segments">
          <thead>
            <tr>
              <th>Segment</th>
              <th className="text-right">Current</th>
              <th className="text-right">Density</th>
              <th className="text-right">Rise</th>
              <th className="text-right">Loss</th>
              <th className="text-right">Ampacity</th>
            </tr>
          </thead>
          <tbody>
            {rows.map((s) => {
              const fail = s.utilisation !== undefined && s.utilisation > 1;
              return (
                <tr key={s.id} data-segment={s.id} aria-selected={selected === s.id || undefined} className={`${fail ? "bg-signal-50" : ""} ${selected === s.id ? "outline-2 -outline-offset-2 outline-copper-400" : ""}`}>
                  <td>
                    {onSelect ? (
                      <button type="button" className="font-mono text-copper-800 hover:underline" onClick={() => onSelect(s.id)} title={`${s.from} → ${s.to}: show on the diagram`}>
                        {s.id}
                      </button>
                    ) : (
                      <span className="font-mono">{s.id}</span>
                    )}
                    <div className="text-xs text-fen-500">
                      {s.from} → {s.to}
                    </div>
                  </td>
                  <td className="text-right tabular-nums" data-testid="hot-current">
                    {fmt(s.current_A, "A", unitSystem)}
                  </td>
                  <td className="text-right tabular-nums">{densityText(s.currentDensity_A_per_mm2, unitSystem)}</td>
                  <td className="text-right tabular-nums" data-testid="hot-rise">
                    {riseText(s.temperatureRise_K, unitSystem)}
                  </td>
                  <td className="text-right tabular-nums">{fmt(s.loss_W, "W", unitSystem, 3)}</td>
                  <td className="text-right">
                    {s.utilisation === undefined ? (
                      <span className="text-xs text-fen-500">not given</span>
                    ) : (
                      <span className={`badge ${fail ? "bg-signal-100 text-signal-700" : "bg-verdigris-50 text-verdigris-700"}`}>
                        {fail ? "Fail" : "Pass"} · {sig(s.utilisation * 100, 3)} %
                      </span>
                    )}
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
    </section>
  );
}

/**
 * The branches that carry no current, as such. `total` is the full count when `results`
 * holds only some of the segments (a large network's summary).
 */
export function DeadBranches({ results: r, total }: { results: NetworkResults; total?: number }) {
  const found = deadSegments(r);
  const count = total ?? found.length;
  if (count === 0) return null;
  const shown = found.slice(0, DEAD_SHOWN);
  return (
    <section aria-labelledby="bn-dead" className="rounded-md border border-fen-200 bg-fen-50 px-3 py-2 text-sm text-fen-700">
      <h3 id="bn-dead" className="text-xs font-semibold uppercase tracking-wider text-fen-600">
        Branches carrying no current ({count.toLocaleString("en")})
      </h3>
      <p className="mt-1 text-xs text-fen-500">Unloaded dead ends (spare ways, unused tap-offs): they carry exactly 0 A and sit at their junction&apos;s voltage.</p>
      <ul className="mt-1 flex flex-wrap gap-1.5" data-testid="dead-branches">
        {shown.map((s) => (
          <li key={s.id} className="rounded border border-dashed border-fen-400 bg-white px-1.5 py-0.5 font-mono text-xs" title={`${s.from} → ${s.to}`}>
            {s.id}
          </li>
        ))}
        {count > shown.length ? <li className="text-xs text-fen-500">… and {(count - shown.length).toLocaleString("en")} more</li> : null}
      </ul>
    </section>
  );
}

/** The headline values of a solved network. */
export function NetworkKeyValues({ results: r, unitSystem, counts }: { results: NetworkResults; unitSystem: UnitSystem; counts?: { nodes: number; segments: number } }) {
  const supply = supplyCurrent(r);
  const size = counts ?? { nodes: r.nodes.length, segments: r.segments.length };
  return (
    <KeyValues
      items={[
        { label: r.supplies.length > 1 ? `Supply current (${r.supplies.length} supplies)` : `Supply current (${r.supplies[0]?.node ?? "—"})`, value: fmt(supply, "A", unitSystem), emphasis: true, testId: "bn-supply-current" },
        { label: "Total loss", value: fmt(r.totalLoss_W, "W", unitSystem), testId: "bn-total-loss" },
        {
          label: r.maxDrop ? `Worst voltage drop (at ${r.maxDrop.node})` : "Worst voltage drop",
          value: r.maxDrop ? `${sig(r.maxDrop.drop_V, 3)} V · ${sig(r.maxDrop.drop_pct, 3)} %` : "—",
          emphasis: true,
          testId: "bn-worst-drop",
        },
        { label: "Load power", value: fmt(r.loadPower_W / 1000, "kW", unitSystem) },
        { label: "Nodes · segments", value: `${size.nodes.toLocaleString("en")} · ${size.segments.toLocaleString("en")}` },
        { label: "Dead-end nodes", value: r.deadEndNodes.toLocaleString("en") },
      ]}
    />
  );
}

/** Each supply's share when the network has more than one. */
export function SupplyTable({ results: r, unitSystem }: { results: NetworkResults; unitSystem: UnitSystem }) {
  if (r.supplies.length < 2) return null;
  return (
    <table className="data-table">
      <thead>
        <tr>
          <th>Supply</th>
          <th className="text-right">Current</th>
          <th className="text-right">Active power</th>
        </tr>
      </thead>
      <tbody>
        {r.supplies.map((s) => (
          <tr key={s.node}>
            <td className="font-mono">{s.node}</td>
            <td className="text-right tabular-nums">{fmt(s.current_A, "A", unitSystem)}</td>
            <td className="text-right tabular-nums">{fmt(s.activePower_W / 1000, "kW", unitSystem)}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

/** A large network's stored result without its pictures: key values, hottest segments and dead branches. */
export function BusNetworkSummaryResults({
  results,
  counts,
  deadTotal,
  unitSystem,
}: {
  results: NetworkResults;
  counts: { nodes: number; segments: number };
  deadTotal: number;
  unitSystem: UnitSystem;
}) {
  return (
    <div className="space-y-4">
      <NetworkKeyValues results={results} unitSystem={unitSystem} counts={counts} />
      <SupplyTable results={results} unitSystem={unitSystem} />
      <HottestSegments results={results} unitSystem={unitSystem} />
      <DeadBranches results={results} total={deadTotal} />
    </div>
  );
}
